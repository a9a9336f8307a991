/**
 * Unit text ("kg/(m^2 s)", "W/(m^2 K)", "degC") read, checked for its dimension and converted.
 *
 * unitmath does the unit work: the definitions (exact where a standard defines them: 1 lbf =
 * 0.45359237 kg x 9.80665 m/s2, 1 BTU = 1055.05585262 J), the SI prefixes, the dimensions and the
 * conversions, with the offset of degC and degF for a lone temperature unit. Its own reader has no
 * parentheses and puts everything after a "/" in the denominator, so machnet reads the structure
 * of the text here (written by hand: no well-kept unit library reads this grammar without also
 * loading a whole computer-algebra system, which cost 90 MB and half a second to import) and
 * gives unitmath a flat list of units with signed powers.
 *
 * The grammar, the one documented in docs/units.md:
 * - a product of factors separated by spaces or "*": "Pa s", "kg*m";
 * - a "/" divides by the next factor only: "kg/m^2 s" is kg s / m^2, "m/s/s" is m / s^2;
 * - a factor is a unit name ("m", "kPa", "BTU") or a parenthesized product, either with an
 *   optional "^" and a decimal power: "m^2", "s^-1", "(m s)^2".
 */

import unit, { type UnitMathUnit } from "unitmath";

/** Unit text read: a flat list of unit names with powers, or why it could not be read. */
export type UnitTextReading =
  | { ok: true; terms: readonly UnitTerm[] }
  /** `number`: a number where a unit name was expected ("2 m" after "7"); `syntax`: otherwise. */
  | { ok: false; problem: "number" | "syntax" };

/** One unit name and its power: "m^-2" is { name: "m", power: -2 }. */
export interface UnitTerm {
  name: string;
  power: number;
}

/** A unit that unitmath knows, ready for dimension checks and conversions. */
export interface KnownUnit {
  /** The unit as unitmath reads it: names with signed powers, "kg m^-2 s^-1". */
  readonly flat: string;
  /**
   * The SI value of one of this unit (1 for "Pa", 100000 for "bar"); null for a lone unit of an
   * offset scale (degC, degF), which only unitmath converts.
   */
  readonly scale: number | null;
}

/** unitmath's reading of each flat unit text looked up so far, for dimension checks. */
interface LookedUp {
  known: KnownUnit;
  parsed: UnitMathUnit;
}

/**
 * A memo of lookups, so that a document with a unit on every pipe parses each unit text once
 * (unitmath takes a few microseconds per text; 100,000 pipes hold several times as many
 * quantities). It holds pure results of fixed definitions, so no caller can see it; it is
 * emptied when it reaches {@link MEMO_SIZE} texts.
 */
const memo = new Map<string, LookedUp | "number" | "unknown">();
const MEMO_SIZE = 1000;

/** "^" followed by a decimal power with an optional sign. */
const POWER = /^\^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+))/;
/** A unit name: letters and underscores (the caller has turned "µ" into "u" and "°C" into "degC"). */
const NAME = /^[A-Za-z_]+/;

/**
 * Read the structure of unit text into unit names with powers, without looking the names up.
 *
 * @example readUnitText("kg/(m^2 s)") // { ok: true, terms: [kg^1, m^-2, s^-1] }
 *   (checked in test/input/unit-text.test.ts)
 */
export function readUnitText(text: string): UnitTextReading {
  const terms: UnitTerm[] = [];
  let position = 0;
  let problem: "number" | "syntax" = "syntax";

  const skipSpaces = (): boolean => {
    const start = position;
    while (position < text.length && /\s/.test(text[position] ?? "")) position++;
    return position > start;
  };

  /** Read factors until the end or a ")", each scaled by `sign`; false on a syntax error. */
  const readProduct = (sign: number): boolean => {
    let factors = 0;
    for (;;) {
      const spaced = skipSpaces();
      const next = text[position];
      if (next === undefined || next === ")") return factors > 0;
      let power = sign;
      if (factors > 0) {
        if (next === "*" || next === "/") {
          if (next === "/") power = -sign;
          position++;
          skipSpaces();
        } else if (!spaced && next !== "(") {
          return false;
        }
      }
      if (!readFactor(power)) return false;
      factors++;
    }
  };

  /** A unit name or a parenthesized product, then an optional power; all scaled by `sign`. */
  const readFactor = (sign: number): boolean => {
    const first = terms.length;
    const rest = text.slice(position);
    const name = NAME.exec(rest);
    if (name !== null) {
      terms.push({ name: name[0], power: 1 });
      position += name[0].length;
    } else if (rest.startsWith("(")) {
      position++;
      if (!readProduct(1)) return false;
      if (text[position] !== ")") return false;
      position++;
    } else {
      if (/^[\d.+-]/.test(rest)) problem = "number";
      return false;
    }
    let factorPower = 1;
    const power = POWER.exec(text.slice(position));
    if (power !== null) {
      factorPower = Number(power[1]);
      position += power[0].length;
    }
    for (let k = first; k < terms.length; k++) {
      const term = terms[k] as UnitTerm;
      term.power *= factorPower * sign;
    }
    return true;
  };

  if (!readProduct(1) || position !== text.length) return { ok: false, problem };
  return { ok: true, terms };
}

/**
 * Look up unit text: the unit, or why not: `number` for a number inside the unit text ("2 m"),
 * `unknown` for text that cannot be read or names a unit unitmath does not know.
 */
export function knownUnit(
  text: string,
): { ok: true; unit: KnownUnit } | { ok: false; problem: "number" | "unknown" } {
  const found = lookUp(text);
  return typeof found === "string"
    ? { ok: false, problem: found }
    : { ok: true, unit: found.known };
}

/** True when both units measure the same thing (the same powers of the SI base quantities). */
export function sameDimension(a: KnownUnit, b: KnownUnit): boolean {
  return parsedUnit(a).equalQuantity(parsedUnit(b));
}

/** The SI base units of a unit, for messages: "kg / m^2 s"; "" for a plain number. */
export function siBaseUnits(known: KnownUnit): string {
  return parsedUnit(known).toSI().getUnits().toString().trim();
}

/**
 * Convert `value` from one unit to another of the same dimension. A lone temperature unit
 * (degC, degF) counts from its own zero: 20 degC is 293.15 K.
 *
 * @throws Error if a unit is unknown or the dimensions differ (a caller's error: check with
 *   {@link knownUnit} and {@link sameDimension} first)
 * @example convertUnit(20, "degC", "K") // 293.15 (checked in test/input/unit-text.test.ts)
 */
export function convertUnit(
  value: number,
  from: string | KnownUnit,
  to: string | KnownUnit,
): number {
  const source = unitOf(from);
  const target = unitOf(to);
  if (!sameDimension(source, target)) {
    throw new Error(`cannot convert "${source.flat}" to "${target.flat}": different dimensions`);
  }
  if (source.scale !== null && target.scale !== null) {
    return target.scale === 1 ? value * source.scale : (value * source.scale) / target.scale;
  }
  const converted = unit(value, source.flat).to(target.flat).getValue();
  if (converted === null) throw new Error(`no value converting ${value} ${source.flat}`);
  return converted;
}

/**
 * A unit given as text (looked up) or already looked up, for units a caller knows to exist
 * (its own tables).
 *
 * @throws Error if the text names no unit unitmath knows
 */
export function unitOf(text: string | KnownUnit): KnownUnit {
  if (typeof text !== "string") return text;
  const known = knownUnit(text);
  if (!known.ok) throw new Error(`unknown unit "${text}"`);
  return known.unit;
}

function parsedUnit(known: KnownUnit): UnitMathUnit {
  const found = lookUp(known.flat);
  if (typeof found === "string") throw new Error(`unknown unit "${known.flat}"`);
  return found.parsed;
}

/** Read, flatten and look up unit text, through the memo. */
function lookUp(text: string): LookedUp | "number" | "unknown" {
  const remembered = memo.get(text);
  if (remembered !== undefined) return remembered;
  const found = lookUpAnew(text);
  if (memo.size >= MEMO_SIZE) memo.clear();
  memo.set(text, found);
  return found;
}

function lookUpAnew(text: string): LookedUp | "number" | "unknown" {
  const reading = readUnitText(text);
  if (!reading.ok) return reading.problem === "number" ? "number" : "unknown";
  const terms = reading.terms.filter((term) => term.power !== 0);
  // Nothing left ("m^0") is no unit; a power that prints in exponent notation ("m^1e-7") is none
  // that a unit is raised to, and unitmath could not read it back.
  if (terms.length === 0 || terms.some((term) => /e/i.test(String(term.power)))) return "unknown";
  const flat = terms
    .map((term) => (term.power === 1 ? term.name : `${term.name}^${term.power}`))
    .join(" ");
  let parsed: UnitMathUnit;
  let zero: number | null;
  let one: number | null;
  try {
    parsed = unit(flat);
    zero = unit(0, flat).toSI().getValue();
    one = unit(1, flat).toSI().getValue();
  } catch {
    return "unknown";
  }
  if (zero === null || one === null) return "unknown";
  // An offset scale (a lone degC or degF) has a nonzero SI value at zero.
  return { known: { flat, scale: zero === 0 ? one : null }, parsed };
}
