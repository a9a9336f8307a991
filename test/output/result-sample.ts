/**
 * A hand-made network result for the formatter tests: round SI numbers whose display values can
 * be worked out by hand. Not produced by the solver (the formatters are tested on their own).
 */
import type { EdgeResult, NetworkResult } from "../../src/results/result-types.js";

function endState(
  pressure: number,
  density: number,
  velocity: number,
  mach: number,
): EdgeResult["inlet"] {
  return {
    pressure,
    stagnationPressure: pressure + 0.5 * density * velocity ** 2,
    temperature: 293,
    stagnationTemperature: 293.15,
    density,
    velocity,
    mach,
  };
}

/** Two reservoirs and a junction; edge "main, north" has a comma in its id; VENT is choked. */
export function sampleResult(): NetworkResult {
  return {
    converged: true,
    status: "converged",
    iterations: 4,
    residual: 2.5e-13,
    residuals: { mass: 2.5e-13, energy: 1e-15 },
    warnings: [
      {
        code: "bare-pressure-unit-absolute",
        message: '/nodes/0/pressure: "8.01325 bar" was read as an absolute pressure',
      },
      { code: "choked", edge: "VENT", message: "edge VENT is choked" },
    ],
    nodes: [
      {
        id: "SUPPLY",
        kind: "reservoir",
        pressure: 801325,
        temperature: 293.15,
        demand: -0.25,
        elevation: 0,
      },
      {
        id: "J1",
        kind: "junction",
        pressure: 701325,
        temperature: 293.15,
        demand: 0.125,
        elevation: 0,
      },
      {
        id: "ATM",
        kind: "reservoir",
        pressure: 101325,
        temperature: 293.15,
        demand: 0.125,
        elevation: 0,
      },
    ],
    edges: [
      {
        id: "main, north",
        kind: "pipe",
        from: "SUPPLY",
        to: "J1",
        model: "adiabatic",
        massFlow: 0.125,
        choked: false,
        chokeRatio: 0.25,
        capacity: 0.5,
        reynolds: 123456.7,
        frictionFactor: 0.0213,
        inlet: endState(800000, 9.5, 10, 0.03),
        outlet: endState(700000, 8.3, 12, 0.035),
        pressureDrop: 100000,
        heatFlow: 0,
      },
      {
        id: "VENT",
        kind: "pipe",
        from: "J1",
        to: "ATM",
        model: "adiabatic",
        massFlow: 0.125,
        choked: true,
        chokeRatio: 1,
        capacity: 0.125,
        reynolds: 2.5e6,
        frictionFactor: 0.02,
        inlet: endState(690000, 8.2, 13, 0.04),
        outlet: endState(365000, 5, 313, 1),
        pressureDrop: 600000,
        heatFlow: 0,
      },
    ],
    balance: {
      throughput: 0.25,
      massIn: 0.25,
      massOut: 0.25,
      enthalpyIn: 7.4e4,
      enthalpyOut: 7.4e4,
      heatIn: 0,
      potentialEnergyGain: 0,
      energyImbalance: 0,
      largestMassImbalance: 1e-15,
      largestEnergyImbalance: 1e-16,
      largestExitPressureMismatch: 0,
    },
    name: "sample",
    gas: {
      name: "air",
      molarMass: 0.02896442,
      heatCapacityRatio: 1.4,
      specificGasConstant: 287.05,
      specificHeatCp: 1004.7,
    },
    ambient: { pressure: 101325, temperature: 293.15 },
  };
}

/** The same result marked as not converged. */
export function notConvergedResult(): NetworkResult {
  const result = sampleResult();
  result.converged = false;
  result.status = "not-converged";
  result.warnings.unshift({
    code: "not-converged",
    message: "not converged after 4 iterations (iterations); largest scaled residual 1.00e-2",
  });
  return result;
}
