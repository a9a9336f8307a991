/**
 * Gas properties for the solver: presets, custom ideal gases, ideal mixtures, viscosity
 * (Sutherland, constant, Wilke), density, speed of sound and stagnation state.
 *
 * Every gas is ideal (p = rho R T) and calorically perfect (cp, cv and gamma constant), with
 * gamma taken at 298.15 K. See docs/model.md (gas section) for the range in which that holds.
 * All values SI: Pa absolute, K, m/s, kg/mol, J/(kg K), Pa s.
 */

import { AIR_COMPOSITION, CRITICAL, NASA7 } from "./gas-model-data.js";
import { NATURAL_GAS_COMPOSITION, SPECIES, type SpeciesName } from "./gas-presets.js";
import type {
  ConstantViscosity,
  Gas,
  Nasa7HeatCapacity,
  PengRobinsonEquationOfState,
  SutherlandViscosity,
  ViscosityLaw,
  WilkeViscosity,
} from "./gas-types.js";

/**
 * Molar gas constant Ru [J/(mol K)], CODATA 2018; exact since the 2019 SI redefinition
 * (Ru = N_A k_B).
 *
 * @remarks Source: E. Tiesinga et al., CODATA Recommended Values of the Fundamental Physical
 *   Constants: 2018, Rev. Mod. Phys. 93, 025010 (2021). ISO 2533:1975 and the U.S. Standard
 *   Atmosphere 1976 use the older 8.31432, 1.7e-5 smaller in relative terms.
 * @example MOLAR_GAS_CONSTANT / gasPreset("air").molarMass // 287.058 J/(kg K)
 */
export const MOLAR_GAS_CONSTANT = 8.314462618;

/** The names accepted by {@link gasPreset}. */
export type GasPresetName =
  | "air"
  | "nitrogen"
  | "oxygen"
  | "argon"
  | "helium"
  | "hydrogen"
  | "carbon-dioxide"
  | "methane"
  | "natural-gas";

/**
 * Every preset name, in a fixed order (for listings and error messages).
 *
 * @example GAS_PRESET_NAMES.length // 9
 */
export const GAS_PRESET_NAMES: readonly GasPresetName[] = Object.freeze([
  "air",
  "nitrogen",
  "oxygen",
  "argon",
  "helium",
  "hydrogen",
  "carbon-dioxide",
  "methane",
  "natural-gas",
]);

/**
 * Whether a string names a gas preset.
 *
 * @param name - any text, e.g. a value read from an input document
 * @returns true if `gasPreset(name)` accepts it
 * @example isGasPresetName("nitrogen") // true; isGasPresetName("Nitrogen") // false
 */
export function isGasPresetName(name: string): name is GasPresetName {
  return (GAS_PRESET_NAMES as readonly string[]).includes(name);
}

/**
 * A preset gas, calorically perfect with gamma at 298.15 K, ideal-gas density and a Sutherland
 * viscosity law (natural gas: a ten-component mixture with Wilke's rule).
 *
 * Each call builds a fresh object, so a caller may change it without affecting anyone else.
 *
 * @param name - one of {@link GAS_PRESET_NAMES}
 * @returns the gas, all fields SI
 * @throws RangeError if `name` is not a preset name (possible from untyped callers)
 * @remarks Values and their sources (ISO 2533, CIAAW 2021, NIST-JANAF, Burcat, Poling et al.,
 *   U.S. Standard Atmosphere 1976, Crane TP-410, White's Viscous Fluid Flow, fits to Perry's
 *   Table 2-312) are listed per species in src/gas/gas-presets.ts and docs/model.md. Air:
 *   M = 28.96442 g/mol (ISO 2533:1975) and gamma = 1.4 (project convention). Natural gas: the
 *   AGA Report No. 8 "Gulf Coast" composition. Valid as an ideal gas well above the
 *   saturation temperature and at pressures where Z stays near 1 (docs/model.md).
 * With `models`, the preset also carries the data of a temperature-dependent heat capacity
 * (NASA 7-coefficient polynomials, `heatCapacity: "nasa7"`) or of the Peng-Robinson equation of
 * state (`equationOfState: "peng-robinson"`), used by {@link gasState}; its `specificHeatCp`
 * and `heatCapacityRatio` stay the reference values above. {@link gasPresetModels} tells which
 * preset has which data. Air uses the N2/O2/Ar/CO2 mixture of ISO 2533 for both.
 *
 * @param name - one of {@link GAS_PRESET_NAMES}
 * @param models - the property models wanted; default constant cp and ideal gas
 * @returns the gas, all fields SI
 * @throws RangeError if `name` is not a preset name (possible from untyped callers) or the
 *   preset has no data for a model asked for
 * @remarks Values and their sources (ISO 2533, CIAAW 2021, NIST-JANAF, Burcat, Poling et al.,
 *   U.S. Standard Atmosphere 1976, Crane TP-410, White's Viscous Fluid Flow, fits to Perry's
 *   Table 2-312) are listed per species in src/gas/gas-presets.ts, src/gas/gas-model-data.ts
 *   and docs/model.md. Air: M = 28.96442 g/mol (ISO 2533:1975) and gamma = 1.4 (project
 *   convention). Natural gas: the AGA Report No. 8 "Gulf Coast" composition. Valid as an ideal
 *   gas well above the saturation temperature and at pressures where Z stays near 1
 *   (docs/model.md).
 * @example gasPreset("air").specificGasConstant // 287.058 J/(kg K)
 * @example gasPreset("methane").heatCapacityRatio // 1.3037
 * @example gasPreset("nitrogen", { equationOfState: "peng-robinson" }).equationOfState?.components[0]?.criticalTemperature // 126.2 K
 */
export function gasPreset(name: GasPresetName, models: GasModelOptions = {}): Gas {
  if (!isGasPresetName(name)) {
    throw new RangeError(
      `gasPreset: unknown gas ${JSON.stringify(name)}; known gases are ${GAS_PRESET_NAMES.join(", ")}`,
    );
  }
  const available = gasPresetModels(name);
  const heatCapacity = models.heatCapacity ?? "constant";
  const equationOfState = models.equationOfState ?? "ideal-gas";
  if (!available.heatCapacity.includes(heatCapacity)) {
    throw new RangeError(
      `gasPreset: "${name}" has no data for heatCapacity "${heatCapacity}"; it has ${available.heatCapacity.join(", ")}`,
    );
  }
  if (!available.equationOfState.includes(equationOfState)) {
    throw new RangeError(
      `gasPreset: "${name}" has no data for equationOfState "${equationOfState}"; it has ${available.equationOfState.join(", ")}`,
    );
  }
  if (name === "natural-gas") {
    return gasMixture(
      NATURAL_GAS_COMPOSITION.map((part) => ({
        gas: speciesGas(part.species, models),
        moleFraction: part.molePercent / 100,
      })),
      "natural-gas",
    );
  }
  return speciesGas(name, models);
}

/** Heat-capacity models: constant cp, or NASA 7-coefficient polynomials cp(T). */
export type HeatCapacityModelName = "constant" | "nasa7";

/** Equations of state: the ideal gas, or Peng-Robinson (1976). */
export type EquationOfStateName = "ideal-gas" | "peng-robinson";

/** Which property models a gas should carry data for; absent fields mean the defaults. */
export interface GasModelOptions {
  /** @defaultValue "constant" */
  heatCapacity?: HeatCapacityModelName;
  /** @defaultValue "ideal-gas" */
  equationOfState?: EquationOfStateName;
}

/** The components of the air preset for the NASA and Peng-Robinson data (ISO 2533). */
function airParts(): { species: SpeciesName; moleFraction: number }[] {
  const total = AIR_COMPOSITION.reduce((sum, part) => sum + part.molePercent, 0);
  return AIR_COMPOSITION.map((part) => ({
    species: part.species,
    moleFraction: part.molePercent / total,
  }));
}

/** The species a preset's model data are made of. */
function presetParts(name: SpeciesName): { species: SpeciesName; moleFraction: number }[] {
  return name === "air" ? airParts() : [{ species: name, moleFraction: 1 }];
}

/**
 * The property models a preset has data for.
 *
 * @param name - one of {@link GAS_PRESET_NAMES}
 * @returns the heat-capacity models and equations of state that {@link gasPreset} accepts for it
 * @example gasPresetModels("natural-gas").heatCapacity // ["constant", "nasa7"] (its C2-C6 alkanes: polynomials fitted by machnet, src/gas/gas-model-data.ts)
 */
export function gasPresetModels(name: GasPresetName): {
  heatCapacity: HeatCapacityModelName[];
  equationOfState: EquationOfStateName[];
} {
  const species =
    name === "natural-gas"
      ? NATURAL_GAS_COMPOSITION.map((part) => part.species)
      : presetParts(name).map((part) => part.species);
  const hasCritical = species.every((part) => CRITICAL[part] !== undefined);
  return {
    heatCapacity: species.every((part) => NASA7[part] !== undefined)
      ? ["constant", "nasa7"]
      : ["constant"],
    equationOfState: hasCritical ? ["ideal-gas", "peng-robinson"] : ["ideal-gas"],
  };
}

/** A species of gas-presets.ts (or air) as a Gas (fresh objects throughout). */
function speciesGas(name: SpeciesName, models: GasModelOptions): Gas {
  const data = SPECIES[name];
  const heatCapacityRatio =
    "heatCapacityRatio" in data.heat
      ? data.heat.heatCapacityRatio
      : data.heat.molarHeatCapacity / (data.heat.molarHeatCapacity - MOLAR_GAS_CONSTANT);
  const parts = presetParts(name);
  const spec: Parameters<typeof idealGas>[0] = {
    name,
    molarMass: data.molarMass,
    heatCapacityRatio,
    viscosityLaw: { ...data.viscosity },
  };
  if (models.heatCapacity === "nasa7") {
    spec.heatCapacity = {
      kind: "nasa7",
      species: parts.map((part) => {
        const nasa = NASA7[part.species];
        if (nasa === undefined) {
          throw new RangeError(`gasPreset: "${part.species}" has no NASA 7-coefficient data`);
        }
        return {
          name: nasa.formula,
          moleFraction: part.moleFraction,
          molarMass: SPECIES[part.species].molarMass,
          lowTemperature: nasa.lowTemperature,
          commonTemperature: nasa.commonTemperature,
          highTemperature: nasa.highTemperature,
          lowCoefficients: [...nasa.low],
          highCoefficients: [...nasa.high],
        };
      }),
    };
  }
  if (models.equationOfState === "peng-robinson") {
    spec.equationOfState = {
      kind: "peng-robinson",
      components: parts.map((part) => {
        const critical = CRITICAL[part.species];
        if (critical === undefined) {
          throw new RangeError(`gasPreset: "${part.species}" has no critical constants`);
        }
        return {
          name: part.species,
          moleFraction: part.moleFraction,
          ...critical,
          molarMass: SPECIES[part.species].molarMass,
        };
      }),
    };
  }
  return idealGas(spec);
}

/**
 * A calorically perfect ideal gas from its molar mass, heat capacity ratio and viscosity law.
 *
 * R = Ru / M;  cp = gamma R / (gamma - 1)
 *
 * @param spec.name - display name [-]; default "custom"
 * @param spec.molarMass - M [kg/mol]; 0 < M <= 1 (air 0.02897; a value above 1 is most likely
 *   given in g/mol and is refused)
 * @param spec.heatCapacityRatio - gamma = cp / cv [-]; gamma > 1 (5/3 at most for an ideal gas,
 *   but larger values are accepted)
 * @param spec.viscosityLaw - Sutherland (mu0 > 0, T0 > 0, S >= 0), constant (mu > 0) or
 *   Wilke (components with mole fractions >= 0 summing to 1 within 1e-6)
 * @param spec.heatCapacity - optional NASA 7-coefficient data (see {@link gasState}): species
 *   with mole fractions summing to 1 within 1e-6, 7 finite coefficients per range and
 *   0 < low < common < high temperatures [K]
 * @param spec.equationOfState - optional Peng-Robinson data: components with mole fractions
 *   summing to 1 within 1e-6, Tc > 0 [K], pc > 0 [Pa], finite omega [-], M > 0 [kg/mol], and
 *   an optional square k_ij matrix of finite numbers
 * @returns the gas; the law and the data are copied, so later changes to `spec` do not reach it
 * @throws RangeError naming the offending field and its value
 * @remarks Ideal gas, constant cp. Source of the relations: J. D. Anderson, Modern Compressible
 *   Flow, 3rd ed., McGraw-Hill 2003, ch. 1 (review of thermodynamics: cp - cv = R, gamma = cp / cv).
 * @example idealGas({ molarMass: 0.028014, heatCapacityRatio: 1.4, viscosityLaw: { kind: "constant", viscosity: 1.78e-5 } }).specificHeatCp // 1038.79 J/(kg K)
 */
export function idealGas(spec: {
  name?: string;
  molarMass: number;
  heatCapacityRatio: number;
  viscosityLaw: ViscosityLaw;
  heatCapacity?: Nasa7HeatCapacity;
  equationOfState?: PengRobinsonEquationOfState;
}): Gas {
  const where = "idealGas";
  const molarMass = spec.molarMass;
  if (!(Number.isFinite(molarMass) && molarMass > 0)) {
    throw new RangeError(
      `${where}: molarMass must be a finite number greater than 0 kg/mol (got ${String(molarMass)})`,
    );
  }
  if (molarMass > 1) {
    throw new RangeError(
      `${where}: molarMass is in kg/mol and must be at most 1 (got ${String(molarMass)}; air is 0.02896442: was it given in g/mol?)`,
    );
  }
  const gamma = spec.heatCapacityRatio;
  if (!(Number.isFinite(gamma) && gamma > 1)) {
    throw new RangeError(
      `${where}: heatCapacityRatio must be a finite number greater than 1 (got ${String(gamma)})`,
    );
  }
  const viscosityLaw = checkedViscosityLaw(spec.viscosityLaw, `${where}: viscosityLaw`);
  const specificGasConstant = MOLAR_GAS_CONSTANT / molarMass;
  const gas: Gas = {
    name: spec.name ?? "custom",
    molarMass,
    specificGasConstant,
    heatCapacityRatio: gamma,
    specificHeatCp: (gamma * specificGasConstant) / (gamma - 1),
    viscosityLaw,
  };
  if (spec.heatCapacity !== undefined) {
    gas.heatCapacity = checkedHeatCapacity(spec.heatCapacity, `${where}: heatCapacity`);
  }
  if (spec.equationOfState !== undefined) {
    gas.equationOfState = checkedEquationOfState(spec.equationOfState, `${where}: equationOfState`);
  }
  return gas;
}

/** Throws RangeError unless the mole fractions are finite, >= 0 and sum to 1 within 1e-6. */
function checkFractions(fractions: readonly number[], where: string): void {
  fractions.forEach((x, index) => {
    if (!(Number.isFinite(x) && x >= 0)) {
      throw new RangeError(
        `${where}[${index}].moleFraction must be a finite number >= 0 (got ${String(x)})`,
      );
    }
  });
  const sum = fractions.reduce((total, x) => total + x, 0);
  if (!(Math.abs(sum - 1) <= MOLE_FRACTION_SUM_TOLERANCE)) {
    throw new RangeError(
      `${where}: mole fractions must sum to 1 within ${MOLE_FRACTION_SUM_TOLERANCE} (got ${sum})`,
    );
  }
}

/** A checked copy of NASA 7-coefficient data. */
function checkedHeatCapacity(data: Nasa7HeatCapacity, where: string): Nasa7HeatCapacity {
  if (data?.kind !== "nasa7" || !Array.isArray(data.species) || data.species.length === 0) {
    throw new RangeError(`${where} must be { kind: "nasa7", species: [...] } with species`);
  }
  checkFractions(
    data.species.map((species) => species.moleFraction),
    `${where}.species`,
  );
  return {
    kind: "nasa7",
    species: data.species.map((species, index) => {
      const at = `${where}.species[${index}]`;
      const { lowTemperature, commonTemperature, highTemperature } = species;
      if (
        !(
          Number.isFinite(highTemperature) &&
          lowTemperature > 0 &&
          lowTemperature < commonTemperature &&
          commonTemperature < highTemperature
        )
      ) {
        throw new RangeError(
          `${at}: temperatures must satisfy 0 < low < common < high K (got ${lowTemperature}, ${commonTemperature}, ${highTemperature})`,
        );
      }
      for (const range of ["lowCoefficients", "highCoefficients"] as const) {
        const coefficients = species[range];
        if (
          !(
            Array.isArray(coefficients) &&
            coefficients.length === 7 &&
            coefficients.every(Number.isFinite)
          )
        ) {
          throw new RangeError(`${at}.${range} must be 7 finite numbers a1..a7`);
        }
      }
      requirePositive(at, "molarMass", species.molarMass, "kg/mol");
      return {
        name: String(species.name),
        moleFraction: species.moleFraction,
        molarMass: species.molarMass,
        lowTemperature,
        commonTemperature,
        highTemperature,
        lowCoefficients: [...species.lowCoefficients],
        highCoefficients: [...species.highCoefficients],
      };
    }),
  };
}

/** A checked copy of Peng-Robinson data. */
function checkedEquationOfState(
  data: PengRobinsonEquationOfState,
  where: string,
): PengRobinsonEquationOfState {
  if (
    data?.kind !== "peng-robinson" ||
    !Array.isArray(data.components) ||
    data.components.length === 0
  ) {
    throw new RangeError(
      `${where} must be { kind: "peng-robinson", components: [...] } with components`,
    );
  }
  checkFractions(
    data.components.map((component) => component.moleFraction),
    `${where}.components`,
  );
  const components = data.components.map((component, index) => {
    const at = `${where}.components[${index}]`;
    requirePositive(at, "criticalTemperature", component.criticalTemperature, "K");
    requirePositive(at, "criticalPressure", component.criticalPressure, "Pa");
    requireFinite(at, "acentricFactor", component.acentricFactor, "");
    requirePositive(at, "molarMass", component.molarMass, "kg/mol");
    return {
      name: String(component.name),
      moleFraction: component.moleFraction,
      criticalTemperature: component.criticalTemperature,
      criticalPressure: component.criticalPressure,
      acentricFactor: component.acentricFactor,
      molarMass: component.molarMass,
    };
  });
  const checked: PengRobinsonEquationOfState = { kind: "peng-robinson", components };
  const matrix = data.binaryInteraction;
  if (matrix !== undefined) {
    const n = components.length;
    if (
      !(
        Array.isArray(matrix) &&
        matrix.length === n &&
        matrix.every((row) => Array.isArray(row) && row.length === n && row.every(Number.isFinite))
      )
    ) {
      throw new RangeError(
        `${where}.binaryInteraction must be a ${n} x ${n} matrix of finite numbers`,
      );
    }
    checked.binaryInteraction = matrix.map((row) => [...row]);
  }
  return checked;
}

/** A checked copy of a viscosity law; throws RangeError naming `where` and the bad value. */
function checkedViscosityLaw(law: ViscosityLaw, where: string): ViscosityLaw {
  if (law === null || typeof law !== "object") {
    throw new RangeError(`${where} must be an object (got ${String(law)})`);
  }
  switch (law.kind) {
    case "sutherland":
    case "constant":
      return checkedPureLaw(law, where);
    case "wilke": {
      if (!Array.isArray(law.components) || law.components.length === 0) {
        throw new RangeError(`${where}.components must be a non-empty array`);
      }
      const components = law.components.map((component, index) => {
        const at = `${where}.components[${index}]`;
        const { moleFraction, molarMass } = component;
        if (!(Number.isFinite(moleFraction) && moleFraction >= 0)) {
          throw new RangeError(
            `${at}.moleFraction must be a finite number >= 0 (got ${String(moleFraction)})`,
          );
        }
        if (!(Number.isFinite(molarMass) && molarMass > 0)) {
          throw new RangeError(
            `${at}.molarMass must be a finite number greater than 0 kg/mol (got ${String(molarMass)})`,
          );
        }
        return { moleFraction, molarMass, law: checkedPureLaw(component.law, `${at}.law`) };
      });
      const sum = components.reduce((total, component) => total + component.moleFraction, 0);
      if (!(Math.abs(sum - 1) <= MOLE_FRACTION_SUM_TOLERANCE)) {
        throw new RangeError(
          `${where}.components: mole fractions must sum to 1 within ${MOLE_FRACTION_SUM_TOLERANCE} (got ${sum})`,
        );
      }
      return { kind: "wilke", components };
    }
    default:
      throw new RangeError(
        `${where}.kind must be "sutherland", "constant" or "wilke" (got ${JSON.stringify((law as { kind?: unknown }).kind)})`,
      );
  }
}

/** A checked copy of a Sutherland or constant law. */
function checkedPureLaw(
  law: SutherlandViscosity | ConstantViscosity,
  where: string,
): SutherlandViscosity | ConstantViscosity {
  if (law === null || typeof law !== "object") {
    throw new RangeError(`${where} must be an object (got ${String(law)})`);
  }
  if (law.kind === "constant") {
    if (!(Number.isFinite(law.viscosity) && law.viscosity > 0)) {
      throw new RangeError(
        `${where}.viscosity must be a finite number greater than 0 Pa s (got ${String(law.viscosity)})`,
      );
    }
    return { kind: "constant", viscosity: law.viscosity };
  }
  if (law.kind === "sutherland") {
    const { referenceViscosity, referenceTemperature, sutherlandConstant } = law;
    if (!(Number.isFinite(referenceViscosity) && referenceViscosity > 0)) {
      throw new RangeError(
        `${where}.referenceViscosity must be a finite number greater than 0 Pa s (got ${String(referenceViscosity)})`,
      );
    }
    if (!(Number.isFinite(referenceTemperature) && referenceTemperature > 0)) {
      throw new RangeError(
        `${where}.referenceTemperature must be a finite number greater than 0 K (got ${String(referenceTemperature)})`,
      );
    }
    if (!(Number.isFinite(sutherlandConstant) && sutherlandConstant >= 0)) {
      throw new RangeError(
        `${where}.sutherlandConstant must be a finite number >= 0 K (got ${String(sutherlandConstant)})`,
      );
    }
    return { kind: "sutherland", referenceViscosity, referenceTemperature, sutherlandConstant };
  }
  throw new RangeError(
    `${where}.kind must be "sutherland" or "constant" (got ${JSON.stringify((law as { kind?: unknown }).kind)})`,
  );
}

/** How far the given mole fractions may sum from 1 before {@link gasMixture} refuses them. */
const MOLE_FRACTION_SUM_TOLERANCE = 1e-6;

/**
 * An ideal mixture of ideal gases (no heat or volume of mixing), itself calorically perfect.
 *
 * M = sum x_i M_i;  Cp = sum x_i M_i cp_i;  Cv = sum x_i M_i cp_i / gamma_i;
 * gamma = Cp / Cv;  R = Ru / M;  cp = Cp / M.
 * Viscosity: Wilke's rule on the components' own laws (see {@link gasViscosity}).
 *
 * @param components - gases with mole fractions x_i >= 0 [-]; the fractions must sum to 1
 *   within 1e-6 and are then divided by their sum. A component that is itself a mixture is
 *   expanded into its own components (Wilke's rule gives the same result either way for
 *   identical species).
 * @param name - display name [-]; default "mixture"
 * @returns the mixture; its viscosity law has kind "wilke"
 * @throws RangeError for an empty list, a bad fraction (the index and value are named) or a
 *   sum of fractions away from 1
 * @remarks Ideal-gas mixing (Gibbs-Dalton): molar cp and cv of the mixture are the
 *   mole-fraction averages of the components'. Source: Y. A. Cengel & M. A. Boles,
 *   Thermodynamics: An Engineering Approach, McGraw-Hill, chapter "Gas mixtures".
 * @example gasMixture([{ gas: gasPreset("helium"), moleFraction: 0.5 }, { gas: gasPreset("argon"), moleFraction: 0.5 }]).molarMass // 0.021976301 kg/mol
 */
export function gasMixture(
  components: readonly { gas: Gas; moleFraction: number }[],
  name?: string,
): Gas {
  const where = "gasMixture";
  if (!Array.isArray(components) || components.length === 0) {
    throw new RangeError(`${where}: components must be a non-empty array`);
  }
  let sum = 0;
  components.forEach((component, index) => {
    const x = component.moleFraction;
    if (!(Number.isFinite(x) && x >= 0)) {
      throw new RangeError(
        `${where}: components[${index}].moleFraction must be a finite number >= 0 (got ${String(x)})`,
      );
    }
    sum += x;
  });
  if (!(Math.abs(sum - 1) <= MOLE_FRACTION_SUM_TOLERANCE)) {
    throw new RangeError(
      `${where}: mole fractions must sum to 1 within ${MOLE_FRACTION_SUM_TOLERANCE} (got ${sum})`,
    );
  }
  let molarMass = 0;
  let molarCp = 0;
  let molarCv = 0;
  const wilkeComponents: WilkeViscosity["components"] = [];
  for (const component of components) {
    const x = component.moleFraction / sum;
    const gas = component.gas;
    const molarCpOfGas = gas.molarMass * gas.specificHeatCp;
    molarMass += x * gas.molarMass;
    molarCp += x * molarCpOfGas;
    molarCv += (x * molarCpOfGas) / gas.heatCapacityRatio;
    const law = gas.viscosityLaw;
    if (law.kind === "wilke") {
      for (const inner of law.components) {
        wilkeComponents.push({
          moleFraction: x * inner.moleFraction,
          molarMass: inner.molarMass,
          law: { ...inner.law },
        });
      }
    } else {
      wilkeComponents.push({ moleFraction: x, molarMass: gas.molarMass, law: { ...law } });
    }
  }
  return idealGas({
    name: name ?? "mixture",
    molarMass,
    heatCapacityRatio: molarCp / molarCv,
    viscosityLaw: { kind: "wilke", components: wilkeComponents },
    ...mixtureModelData(components, sum),
  });
}

/**
 * The NASA and Peng-Robinson data of a mixture: each component's species (or equation-of-state
 * components) with their fractions multiplied by the component's; k_ij kept within a component
 * and 0 between components. Either every component carries a model's data or none does.
 */
function mixtureModelData(
  components: readonly { gas: Gas; moleFraction: number }[],
  sum: number,
): { heatCapacity?: Nasa7HeatCapacity; equationOfState?: PengRobinsonEquationOfState } {
  const data: { heatCapacity?: Nasa7HeatCapacity; equationOfState?: PengRobinsonEquationOfState } =
    {};
  for (const field of ["heatCapacity", "equationOfState"] as const) {
    const having = components.filter((component) => component.gas[field] !== undefined).length;
    if (having !== 0 && having !== components.length) {
      const missing = components.findIndex((component) => component.gas[field] === undefined);
      throw new RangeError(
        `gasMixture: components[${missing}] has no ${field} data while others have; give every component the same property models`,
      );
    }
  }
  if (components[0]?.gas.heatCapacity !== undefined) {
    data.heatCapacity = {
      kind: "nasa7",
      species: components.flatMap((component) =>
        (component.gas.heatCapacity as Nasa7HeatCapacity).species.map((species) => ({
          ...species,
          moleFraction: (species.moleFraction * component.moleFraction) / sum,
        })),
      ),
    };
  }
  if (components[0]?.gas.equationOfState !== undefined) {
    const parts = components.map(
      (component) => component.gas.equationOfState as PengRobinsonEquationOfState,
    );
    const merged = parts.flatMap((eos, index) =>
      eos.components.map((part) => ({
        ...part,
        moleFraction:
          (part.moleFraction * (components[index] as { moleFraction: number }).moleFraction) / sum,
      })),
    );
    const equationOfState: PengRobinsonEquationOfState = {
      kind: "peng-robinson",
      components: merged,
    };
    if (parts.some((eos) => eos.binaryInteraction !== undefined)) {
      const n = merged.length;
      const matrix = Array.from({ length: n }, () => new Array<number>(n).fill(0));
      let offset = 0;
      for (const eos of parts) {
        const size = eos.components.length;
        for (let i = 0; i < size; i++) {
          for (let j = 0; j < size; j++) {
            (matrix[offset + i] as number[])[offset + j] = eos.binaryInteraction?.[i]?.[j] ?? 0;
          }
        }
        offset += size;
      }
      equationOfState.binaryInteraction = matrix;
    }
    data.equationOfState = equationOfState;
  }
  return data;
}

/** Throws RangeError unless `value` is finite and > 0. */
function requirePositive(where: string, what: string, value: number, unit: string): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new RangeError(
      `${where}: ${what} must be a finite number greater than 0 ${unit} (got ${String(value)})`,
    );
  }
}

/** Throws RangeError unless `value` is finite. */
function requireFinite(where: string, what: string, value: number, unit: string): void {
  if (!Number.isFinite(value)) {
    throw new RangeError(
      `${where}: ${what} must be a finite number ${unit} (got ${String(value)})`,
    );
  }
}

/** Viscosity of one Sutherland or constant law at T [Pa s]. */
function pureViscosity(law: SutherlandViscosity | ConstantViscosity, temperature: number): number {
  if (law.kind === "constant") return law.viscosity;
  const t0 = law.referenceTemperature;
  const s = law.sutherlandConstant;
  return law.referenceViscosity * (temperature / t0) ** 1.5 * ((t0 + s) / (temperature + s));
}

/**
 * Dynamic viscosity of the gas at a temperature, by its viscosity law.
 *
 * Sutherland: mu = mu0 (T / T0)^1.5 (T0 + S) / (T + S).
 * Constant: mu = mu0.
 * Wilke: mu = sum_i x_i mu_i / (sum_j x_j phi_ij), with
 * phi_ij = [1 + (mu_i / mu_j)^0.5 (M_j / M_i)^0.25]^2 / [8 (1 + M_i / M_j)]^0.5.
 *
 * @param gas - the gas
 * @param temperature - static temperature T [K]; T > 0
 * @returns mu [Pa s]
 * @throws RangeError if T is not a finite number > 0
 * @remarks Low-pressure (dilute-gas) viscosity: no pressure dependence, good to about 1 % up to
 *   some tens of bar for the permanent gases. Sutherland with the preset constants agrees with
 *   the CRC Handbook table within 2 % over 300-500 K (test/gas/gas.test.ts). Wilke's rule is
 *   good to a few percent for non-polar mixtures; it overstates H2-rich mixtures the most.
 *   Sources: W. Sutherland, Phil. Mag. 36, 507 (1893); C. R. Wilke, J. Chem. Phys. 18, 517
 *   (1950); U.S. Standard Atmosphere 1976 eq. 51 for the air constants.
 * @example gasViscosity(gasPreset("air"), 288.15) // 1.7894e-5 Pa s (U.S. Standard Atmosphere 1976, sea level)
 */
export function gasViscosity(gas: Gas, temperature: number): number {
  requirePositive("gasViscosity", "temperature", temperature, "K");
  const law = gas.viscosityLaw;
  if (law.kind !== "wilke") return pureViscosity(law, temperature);
  const parts = law.components;
  const viscosities = parts.map((part) => pureViscosity(part.law, temperature));
  let mixture = 0;
  for (let i = 0; i < parts.length; i++) {
    const pi = parts[i] as (typeof parts)[number];
    const mui = viscosities[i] as number;
    if (pi.moleFraction === 0) continue;
    let denominator = 0;
    for (let j = 0; j < parts.length; j++) {
      const pj = parts[j] as (typeof parts)[number];
      const muj = viscosities[j] as number;
      const numerator = (1 + Math.sqrt(mui / muj) * (pj.molarMass / pi.molarMass) ** 0.25) ** 2;
      const phi = numerator / Math.sqrt(8 * (1 + pi.molarMass / pj.molarMass));
      denominator += pj.moleFraction * phi;
    }
    mixture += (pi.moleFraction * mui) / denominator;
  }
  return mixture;
}

/** d ln mu / dT of one Sutherland or constant law at T [1/K]. */
function pureViscosityLogSlope(
  law: SutherlandViscosity | ConstantViscosity,
  temperature: number,
): number {
  if (law.kind === "constant") return 0;
  return 1.5 / temperature - 1 / (temperature + law.sutherlandConstant);
}

/**
 * Logarithmic temperature slope of the gas's viscosity law, d ln mu / dT, in closed form: the
 * derivative of the laws of {@link gasViscosity} (the network solver's Jacobian needs it for
 * every edge in every iteration, where a central difference would cost two more viscosities).
 *
 * Sutherland: d ln mu / dT = 1.5 / T - 1 / (T + S).
 * Constant: 0.
 * Wilke: with l_i = d ln mu_i / dT, r_ij = (mu_i / mu_j)^0.5, q_ij = (M_j / M_i)^0.25 and
 * phi_ij = (1 + r_ij q_ij)^2 / s_ij, s_ij = [8 (1 + M_i / M_j)]^0.5,
 * d phi_ij / dT = (1 + r_ij q_ij) r_ij q_ij (l_i - l_j) / s_ij, D_i = sum_j x_j phi_ij and
 * d mu / dT = sum_i x_i (mu_i / D_i) (l_i - (sum_j x_j d phi_ij / dT) / D_i).
 *
 * @param gas - the gas
 * @param temperature - static temperature T [K]; T > 0
 * @returns d ln mu / dT [1/K]
 * @throws RangeError if T is not a finite number > 0
 * @remarks Exact derivative of {@link gasViscosity} (same laws, same range). Sources: as there
 *   (Sutherland, Phil. Mag. 36, 507 (1893); Wilke, J. Chem. Phys. 18, 517 (1950)).
 * @example gasViscosityLogSlope(gasPreset("air"), 288.15) // 0.0026965 1/K (= 1.5/288.15 - 1/(288.15 + 110.4); checked
 *   in test/gas/gas.test.ts)
 */
export function gasViscosityLogSlope(gas: Gas, temperature: number): number {
  requirePositive("gasViscosityLogSlope", "temperature", temperature, "K");
  const law = gas.viscosityLaw;
  if (law.kind !== "wilke") return pureViscosityLogSlope(law, temperature);
  const parts = law.components;
  let mixture = 0;
  let mixtureSlope = 0;
  for (let i = 0; i < parts.length; i++) {
    const pi = parts[i] as (typeof parts)[number];
    if (pi.moleFraction === 0) continue;
    const mui = pureViscosity(pi.law, temperature);
    const li = pureViscosityLogSlope(pi.law, temperature);
    let denominator = 0;
    let denominatorSlope = 0;
    for (let j = 0; j < parts.length; j++) {
      const pj = parts[j] as (typeof parts)[number];
      const muj = pureViscosity(pj.law, temperature);
      const lj = pureViscosityLogSlope(pj.law, temperature);
      const rq = Math.sqrt(mui / muj) * (pj.molarMass / pi.molarMass) ** 0.25;
      const s = Math.sqrt(8 * (1 + pi.molarMass / pj.molarMass));
      denominator += (pj.moleFraction * (1 + rq) * (1 + rq)) / s;
      denominatorSlope += (pj.moleFraction * (1 + rq) * rq * (li - lj)) / s;
    }
    const term = (pi.moleFraction * mui) / denominator;
    mixture += term;
    mixtureSlope += term * (li - denominatorSlope / denominator);
  }
  return mixtureSlope / mixture;
}

/**
 * Density of the gas as an ideal gas.
 *
 * rho = p / (R T)
 *
 * @param gas - the gas (R = Ru / M)
 * @param pressure - absolute static pressure p [Pa]; p > 0
 * @param temperature - static temperature T [K]; T > 0
 * @returns rho [kg/m3]
 * @throws RangeError if p or T is not a finite number > 0
 * @remarks Compressibility factor Z = 1. The error grows about in proportion to pressure,
 *   slowly for air and nitrogen near ambient temperature, faster for methane-rich natural gas
 *   and fastest for CO2 (docs/model.md gives figures). Source: ISO 2533:1975 computes its
 *   tabulated air density by this equation of state.
 * @example gasDensity(gasPreset("air"), 101325, 288.15) // 1.2250 kg/m3 (ISO 2533 sea level)
 */
export function gasDensity(gas: Gas, pressure: number, temperature: number): number {
  requirePositive("gasDensity", "pressure", pressure, "Pa");
  requirePositive("gasDensity", "temperature", temperature, "K");
  return pressure / (gas.specificGasConstant * temperature);
}

/**
 * Speed of sound in the gas as a calorically perfect ideal gas.
 *
 * a = (gamma R T)^0.5
 *
 * @param gas - the gas
 * @param temperature - static temperature T [K]; T > 0
 * @returns a [m/s]
 * @throws RangeError if T is not a finite number > 0
 * @remarks Ideal gas, frequency-independent (no relaxation). Source: J. D. Anderson, Modern
 *   Compressible Flow, 3rd ed., McGraw-Hill 2003, ch. 3 (speed of sound); ISO 2533:1975 tabulates 340.294 m/s at sea
 *   level (with the older Ru = 8.31432, 9e-6 lower in relative terms than this value).
 * @example speedOfSound(gasPreset("air"), 288.15) // 340.297 m/s
 */
export function speedOfSound(gas: Gas, temperature: number): number {
  requirePositive("speedOfSound", "temperature", temperature, "K");
  return Math.sqrt(gas.heatCapacityRatio * gas.specificGasConstant * temperature);
}

/**
 * Stagnation (total) temperature from static temperature and velocity, adiabatic deceleration
 * of a calorically perfect gas.
 *
 * T0 = T + v^2 / (2 cp)
 *
 * @param gas - the gas (cp)
 * @param staticTemperature - T [K]; T > 0
 * @param velocity - flow speed v [m/s]; any finite value (its sign does not matter)
 * @returns T0 [K]
 * @throws RangeError if T is not > 0 or v is not finite
 * @remarks Constant cp. Source: Anderson, Modern Compressible Flow, 3rd ed., ch. 3 (energy
 *   equation, total conditions); the same relation as fluids.compressible.T_stagnation_ideal.
 * @example stagnationTemperature(gasPreset("air"), 288.15, 100) // 293.1266 K
 */
export function stagnationTemperature(
  gas: Gas,
  staticTemperature: number,
  velocity: number,
): number {
  requirePositive("stagnationTemperature", "staticTemperature", staticTemperature, "K");
  requireFinite("stagnationTemperature", "velocity", velocity, "m/s");
  return staticTemperature + (velocity * velocity) / (2 * gas.specificHeatCp);
}

/**
 * Static temperature from stagnation temperature and velocity: the inverse of
 * {@link stagnationTemperature}.
 *
 * T = T0 - v^2 / (2 cp)
 *
 * @param gas - the gas (cp)
 * @param stagnationTemperature - T0 [K]; T0 > 0
 * @param velocity - flow speed v [m/s]; |v| < (2 cp T0)^0.5, the speed at which all enthalpy is
 *   kinetic energy
 * @returns T [K], > 0
 * @throws RangeError if T0 is not > 0, v is not finite, or |v| reaches (2 cp T0)^0.5
 * @remarks Constant cp. Source: Anderson, Modern Compressible Flow, 3rd ed., ch. 3.
 * @example staticTemperatureFromStagnation(gasPreset("air"), 293.1266, 100) // 288.15 K
 */
export function staticTemperatureFromStagnation(
  gas: Gas,
  stagnationTemperature: number,
  velocity: number,
): number {
  const where = "staticTemperatureFromStagnation";
  requirePositive(where, "stagnationTemperature", stagnationTemperature, "K");
  requireFinite(where, "velocity", velocity, "m/s");
  const staticTemperature =
    stagnationTemperature - (velocity * velocity) / (2 * gas.specificHeatCp);
  if (!(staticTemperature > 0)) {
    const limit = Math.sqrt(2 * gas.specificHeatCp * stagnationTemperature);
    throw new RangeError(
      `${where}: velocity ${velocity} m/s reaches the limit (2 cp T0)^0.5 = ${limit.toPrecision(6)} m/s for T0 = ${stagnationTemperature} K; the static temperature would be ${staticTemperature.toPrecision(6)} K`,
    );
  }
  return staticTemperature;
}

/**
 * Stagnation (total) pressure from the static state and velocity, isentropic deceleration of a
 * calorically perfect gas.
 *
 * T0 = T + v^2 / (2 cp);  p0 = p (T0 / T)^(gamma / (gamma - 1))
 * (equivalently p0 / p = (1 + (gamma - 1) / 2 M^2)^(gamma / (gamma - 1)), M = v / a)
 *
 * @param gas - the gas (cp, gamma)
 * @param staticPressure - absolute p [Pa]; p > 0
 * @param staticTemperature - T [K]; T > 0
 * @param velocity - flow speed v [m/s]; any finite value
 * @returns p0 [Pa]
 * @throws RangeError if p or T is not > 0, or v is not finite
 * @remarks Isentropic, constant cp. Source: Anderson, Modern Compressible Flow, 3rd ed.,
 *   ch. 3 (total conditions); the same relation as fluids.compressible.P_stagnation.
 * @example stagnationPressure(gasPreset("air"), 101325, 288.15, 100) // 107583.3 Pa
 */
export function stagnationPressure(
  gas: Gas,
  staticPressure: number,
  staticTemperature: number,
  velocity: number,
): number {
  requirePositive("stagnationPressure", "staticPressure", staticPressure, "Pa");
  requirePositive("stagnationPressure", "staticTemperature", staticTemperature, "K");
  requireFinite("stagnationPressure", "velocity", velocity, "m/s");
  const gamma = gas.heatCapacityRatio;
  const temperatureRatio = 1 + (velocity * velocity) / (2 * gas.specificHeatCp * staticTemperature);
  return staticPressure * temperatureRatio ** (gamma / (gamma - 1));
}
