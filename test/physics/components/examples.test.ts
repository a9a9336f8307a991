/** The @example of every component relation, with the number its comment gives. */
import { describe, expect, it } from "vitest";
import {
  nozzleCriticalPressureRatio,
  nozzleExpansibility,
  nozzleMassFlow,
} from "../../../src/physics/components/nozzle.js";
import { orificeExpansibility, orificeMassFlow } from "../../../src/physics/components/orifice.js";
import { regulatorOpening } from "../../../src/physics/components/regulator.js";
import { pressureLossRatio } from "../../../src/physics/components/restriction.js";
import { regularisedRoot } from "../../../src/physics/components/small-difference.js";
import {
  pipingGeometryFactor,
  pressureDifferentialRatioFactorWithFittings,
  valveCharacteristicRatio,
  valveExpansionFactor,
  valveGasMassFlow,
} from "../../../src/physics/components/valve.js";

describe("the @example of each component relation", () => {
  // Each comment prints its number to 4 to 10 digits: the tolerance is half a unit of the last.
  const cases: [string, number, number, number][] = [
    ["orificeExpansibility", orificeExpansibility(0.0222 / 0.0739, 0.99, 1.4), 0.997474, 5e-7],
    [
      "orificeMassFlow",
      orificeMassFlow(0.61512, 0.05, 0.05 / 0.07366, 2e5, 2.27, 1.83e5, 1.4),
      0.36767,
      5e-6,
    ],
    ["pressureLossRatio", pressureLossRatio(0.05 / 0.07366, 0.61512), 0.5335, 5e-5],
    ["nozzleExpansibility", nozzleExpansibility(0.0222 / 0.0739, 0.99, 1.4), 0.994570234, 5e-10],
    ["nozzleCriticalPressureRatio", nozzleCriticalPressureRatio(0.5, 1.4), 0.536266, 5e-7],
    [
      "nozzleMassFlow",
      nozzleMassFlow(1, 0.01, 0, 7e5, 7e5 / (287.05 * 293.15), 1e5, 1.4),
      0.12977,
      5e-6,
    ],
    [
      "valveCharacteristicRatio",
      valveCharacteristicRatio(0.5, "equal-percentage", 50),
      0.1414213562,
      5e-11,
    ],
    ["pipingGeometryFactor", pipingGeometryFactor(70.889, 0.05, 0.08, 0.1), 0.86688, 5e-6],
    [
      "pressureDifferentialRatioFactorWithFittings",
      pressureDifferentialRatioFactorWithFittings(0.6, 70.889, 0.86688, 0.05, 0.08),
      0.62529,
      5e-6,
    ],
    ["valveExpansionFactor", valveExpansionFactor(0.5, 1.4, 0.7), 0.7619047619, 5e-11],
    ["valveGasMassFlow", valveGasMassFlow(100, 1, 0.7, 1.4, 7e5, 8.3, 5e5), 3.092, 5e-4],
    ["regulatorOpening", regulatorOpening(4.95e5, 5e5, 1e4), 0.75, 1e-15],
    ["regularisedRoot", regularisedRoot(0.25), 0.5, 0],
  ];
  for (const [name, value, printed, tolerance] of cases) {
    it(`${name} gives ${printed}`, () => {
      expect(Math.abs(value - printed)).toBeLessThanOrEqual(tolerance);
    });
  }
});
