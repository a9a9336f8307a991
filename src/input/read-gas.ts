/**
 * Reading the `gas` member of a network document: presets, mixtures of presets and custom ideal
 * gases, the property models (`heatCapacity`, `equationOfState`) with the data they need, and
 * the refusal of a model that the network's edges cannot use yet.
 */

import {
  GAS_PRESET_NAMES,
  type GasModelOptions,
  type GasPresetName,
  gasMixture,
  gasPreset,
  gasPresetModels,
  idealGas,
  isGasPresetName,
} from "../gas/gas.js";
import type { Gas, PengRobinsonEquationOfState, ViscosityLaw } from "../gas/gas-types.js";
import type { GasInput } from "./document-types.js";
import { INPUT_RANGES, inRange, quantityInRange } from "./input-ranges.js";
import type { ValueReader } from "./read-components.js";

/**
 * The `gas` member as a checked Gas: a preset, a mixture of presets or a custom ideal gas, with
 * the heat-capacity and equation-of-state models asked for. Undefined after an issue.
 */
export function readGas(input: GasInput | undefined, reader: ValueReader): Gas | undefined {
  if (input === undefined) return gasPreset("air");
  const forms = [
    input.preset !== undefined ? "preset" : undefined,
    input.molarMass !== undefined || input.gamma !== undefined || input.viscosity !== undefined
      ? "custom"
      : undefined,
    input.components !== undefined ? "components" : undefined,
  ].filter((form) => form !== undefined);
  if (forms.length !== 1) {
    reader.fail({
      code: "schema",
      path: "/gas",
      message:
        forms.length === 0
          ? 'give one of "preset", a custom gas ("molarMass", "gamma", "viscosity") or "components"'
          : `give only one of "preset", a custom gas or "components" (got ${forms.join(" and ")})`,
    });
    return undefined;
  }
  const presetList = GAS_PRESET_NAMES.join(", ");
  const models: GasModelOptions = {
    heatCapacity: input.heatCapacity ?? "constant",
    equationOfState: input.equationOfState ?? "ideal-gas",
  };
  if (input.molarMass === undefined && input.gamma === undefined && input.viscosity === undefined) {
    // A preset or a mixture of presets: critical constants come with the preset data.
    let bad = false;
    for (const field of CRITICAL_FIELDS) {
      if (input[field] !== undefined) {
        reader.fail({
          code: "schema",
          path: `/gas/${field}`,
          message: `"${field}" is for a custom gas; a preset carries its own critical constants`,
        });
        bad = true;
      }
    }
    if (bad) return undefined;
  }
  if (input.preset !== undefined) {
    if (!isGasPresetName(input.preset)) {
      reader.fail({
        code: "schema",
        path: "/gas/preset",
        message: `unknown gas "${input.preset}"; presets: ${presetList}`,
      });
      return undefined;
    }
    if (!presetHasModels(input.preset, models, "/gas", reader)) return undefined;
    return gasPreset(input.preset, models);
  }
  if (input.components !== undefined) {
    let bad = false;
    input.components.forEach((component, index) => {
      if (!isGasPresetName(component.preset)) {
        reader.fail({
          code: "schema",
          path: `/gas/components/${index}/preset`,
          message: `unknown gas "${component.preset}"; presets: ${presetList}`,
        });
        bad = true;
      }
    });
    const sum = input.components.reduce((total, component) => total + component.moleFraction, 0);
    if (Math.abs(sum - 1) > 1e-6) {
      reader.fail({
        code: "value",
        path: "/gas/components",
        value: sum,
        message: `mole fractions must add up to 1 (they add up to ${sum})`,
      });
      bad = true;
    }
    if (bad) return undefined;
    input.components.forEach((component, index) => {
      if (
        !presetHasModels(
          component.preset as GasPresetName,
          models,
          `/gas/components/${index}`,
          reader,
        )
      ) {
        bad = true;
      }
    });
    if (bad) return undefined;
    return gasMixture(
      input.components.map((component) => ({
        gas: gasPreset(component.preset as GasPresetName, models),
        moleFraction: component.moleFraction,
      })),
      input.name ?? "mixture",
    );
  }
  // Custom ideal gas: all three parts are needed.
  let bad = false;
  for (const field of ["molarMass", "gamma", "viscosity"] as const) {
    if (input[field] === undefined) {
      reader.fail({
        code: "schema",
        path: "/gas",
        message: `a custom gas needs "${field}" (give "molarMass", "gamma" and "viscosity")`,
      });
      bad = true;
    }
  }
  if (bad) return undefined;
  const molarMass = inRange(
    reader,
    reader.positive(input.molarMass, "molarMass", "/gas/molarMass"),
    input.molarMass,
    "/gas/molarMass",
    INPUT_RANGES.molarMass,
  );
  const gamma = input.gamma as number;
  if (!(gamma > 1 && gamma < 2)) {
    reader.fail({
      code: "value",
      path: "/gas/gamma",
      value: gamma,
      message: `the heat capacity ratio must lie between 1 and 2 (got ${gamma})`,
    });
    bad = true;
  }
  const viscosityLaw = readViscosity(input.viscosity as NonNullable<GasInput["viscosity"]>, reader);
  if (models.heatCapacity === "nasa7") {
    reader.fail({
      code: "value",
      path: "/gas/heatCapacity",
      value: "nasa7",
      message:
        'a custom gas has no NASA 7-coefficient data; use "constant" (its "gamma"), or a preset or mixture of presets',
    });
    bad = true;
  }
  const equationOfState = readCustomCriticalConstants(input, models, molarMass, reader);
  if (bad || molarMass === undefined || viscosityLaw === undefined || equationOfState === null) {
    return undefined;
  }
  return idealGas({
    name: input.name ?? "custom",
    molarMass,
    heatCapacityRatio: gamma,
    viscosityLaw,
    ...(equationOfState === undefined ? {} : { equationOfState }),
  });
}

/** The fields of a custom gas's critical constants. */
const CRITICAL_FIELDS = ["criticalTemperature", "criticalPressure", "acentricFactor"] as const;

/** Plausible acentric factors: helium -0.39 to heavy vapours near 1 (Poling et al., App. A). */
const ACENTRIC_FACTOR_RANGE = { low: -1, high: 2 };

/**
 * The Peng-Robinson data of a custom gas: undefined when it is not asked for, null after an
 * issue. All three critical fields are needed with "peng-robinson" and refused without it.
 */
function readCustomCriticalConstants(
  input: GasInput,
  models: GasModelOptions,
  molarMass: number | undefined,
  reader: ValueReader,
): PengRobinsonEquationOfState | undefined | null {
  const given = CRITICAL_FIELDS.filter((field) => input[field] !== undefined);
  if (models.equationOfState !== "peng-robinson") {
    for (const field of given) {
      reader.fail({
        code: "schema",
        path: `/gas/${field}`,
        message: `"${field}" is used only with "equationOfState": "peng-robinson"; add that or remove it`,
      });
    }
    return given.length > 0 ? null : undefined;
  }
  const missing = CRITICAL_FIELDS.filter((field) => input[field] === undefined);
  for (const field of missing) {
    reader.fail({
      code: "schema",
      path: "/gas",
      message: `a custom gas with "equationOfState": "peng-robinson" needs "${field}" (give "criticalTemperature", "criticalPressure" and "acentricFactor")`,
    });
  }
  if (missing.length > 0) return null;
  const criticalTemperature = reader.positive(
    input.criticalTemperature,
    "temperature",
    "/gas/criticalTemperature",
  );
  const pressureInput = input.criticalPressure;
  if (typeof pressureInput === "string" && /\(g\)|g$|gauge/i.test(pressureInput.trim())) {
    reader.fail({
      code: "value",
      path: "/gas/criticalPressure",
      value: pressureInput,
      message: `a critical pressure is absolute (got ${JSON.stringify(pressureInput)}); write e.g. "45.99 bar"`,
    });
    return null;
  }
  const criticalPressure = reader.positive(pressureInput, "pressure", "/gas/criticalPressure");
  const acentricFactor = input.acentricFactor as number;
  if (
    !(acentricFactor > ACENTRIC_FACTOR_RANGE.low && acentricFactor < ACENTRIC_FACTOR_RANGE.high)
  ) {
    reader.fail({
      code: "value",
      path: "/gas/acentricFactor",
      value: acentricFactor,
      message: `the acentric factor must lie between ${ACENTRIC_FACTOR_RANGE.low} and ${ACENTRIC_FACTOR_RANGE.high} (got ${acentricFactor}; helium is -0.39, methane 0.011, n-hexane 0.30)`,
    });
    return null;
  }
  if (
    criticalTemperature === undefined ||
    criticalPressure === undefined ||
    molarMass === undefined
  ) {
    return null;
  }
  return {
    kind: "peng-robinson",
    components: [
      {
        name: input.name ?? "custom",
        moleFraction: 1,
        criticalTemperature,
        criticalPressure,
        acentricFactor,
        molarMass,
      },
    ],
  };
}

/**
 * Whether a preset has the data of the models asked for; an issue at `path` if not. Today every
 * preset has both (natural gas's nasa7 since its alkanes' fitted polynomials, issue #5): this
 * guards a preset added later without them.
 */
function presetHasModels(
  name: GasPresetName,
  models: GasModelOptions,
  path: string,
  reader: ValueReader,
): boolean {
  const available = gasPresetModels(name);
  let ok = true;
  if (!available.heatCapacity.includes(models.heatCapacity ?? "constant")) {
    const withData = GAS_PRESET_NAMES.filter((preset) =>
      gasPresetModels(preset).heatCapacity.includes("nasa7"),
    );
    reader.fail({
      code: "value",
      path: path === "/gas" ? "/gas/heatCapacity" : `${path}/preset`,
      value: name,
      message: `gas "${name}" has no NASA 7-coefficient data for "heatCapacity": "nasa7" (presets that have it: ${withData.join(", ")}); use "constant"`,
    });
    ok = false;
  }
  if (!available.equationOfState.includes(models.equationOfState ?? "ideal-gas")) {
    reader.fail({
      code: "value",
      path: path === "/gas" ? "/gas/equationOfState" : `${path}/preset`,
      value: name,
      message: `gas "${name}" has no critical constants for "equationOfState": "peng-robinson"; use "ideal-gas"`,
    });
    ok = false;
  }
  return ok;
}

function readViscosity(
  input: NonNullable<GasInput["viscosity"]>,
  reader: ValueReader,
): ViscosityLaw | undefined {
  if (typeof input === "number" || typeof input === "string") {
    const viscosity = inRange(
      reader,
      reader.positive(input, "viscosity", "/gas/viscosity"),
      input,
      "/gas/viscosity",
      INPUT_RANGES.viscosity,
    );
    return viscosity === undefined ? undefined : { kind: "constant", viscosity };
  }
  const referenceViscosity = inRange(
    reader,
    reader.positive(input.referenceViscosity, "viscosity", "/gas/viscosity/referenceViscosity"),
    input.referenceViscosity,
    "/gas/viscosity/referenceViscosity",
    INPUT_RANGES.viscosity,
  );
  const referenceTemperature = quantityInRange(
    reader,
    input.referenceTemperature,
    "temperature",
    "/gas/viscosity/referenceTemperature",
    INPUT_RANGES.temperature,
  );
  const sutherlandConstant = inRange(
    reader,
    reader.positive(
      input.sutherlandConstant,
      "temperatureDifference",
      "/gas/viscosity/sutherlandConstant",
    ),
    input.sutherlandConstant,
    "/gas/viscosity/sutherlandConstant",
    INPUT_RANGES.sutherlandConstant,
  );
  if (
    referenceViscosity === undefined ||
    referenceTemperature === undefined ||
    sutherlandConstant === undefined
  ) {
    return undefined;
  }
  return { kind: "sutherland", referenceViscosity, referenceTemperature, sutherlandConstant };
}
