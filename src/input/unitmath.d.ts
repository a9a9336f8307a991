/**
 * The part of unitmath 0.8 that machnet uses. The package ships no usable type declarations (its
 * bundled UnitMath.d.ts declares internal modules only), so they are written here, from the
 * library's README and checked by the tests of unit-text.ts.
 */
declare module "unitmath" {
  /** An immutable quantity: a value (null for a bare unit) and a unit. */
  export interface UnitMathUnit {
    /** The same quantity in `target` units; throws if the dimensions differ. */
    to(target: string | UnitMathUnit): UnitMathUnit;
    /** The same quantity in SI base units. */
    toSI(): UnitMathUnit;
    /** The value, or null for a bare unit such as `unit("m/s")`. */
    getValue(): number | null;
    /** The unit without its value. */
    getUnits(): UnitMathUnit;
    /** True when both have the same dimension (base quantities and powers). */
    equalQuantity(other: string | UnitMathUnit): boolean;
    toString(): string;
  }

  /** Read "5 m/s", a bare unit "m/s", or a value and a unit. Throws on an unknown unit. */
  export interface UnitMathFactory {
    (text: string): UnitMathUnit;
    (value: number, unit: string): UnitMathUnit;
  }

  const unit: UnitMathFactory;
  export default unit;
}
