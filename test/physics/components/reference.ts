/**
 * Shared by the component tests: the fixture made by
 * test/fixtures/components/generate_component_reference.py (python3-fluids 1.0.22, scipy 1.10.1,
 * Debian 12), air as the solver sees it, and one evaluation of a component.
 */
import { readFileSync } from "node:fs";
import { gasPreset } from "../../../src/index.js";
import type { ComponentElement } from "../../../src/physics/components/component-elements.js";
import { evaluateComponentFlow } from "../../../src/physics/components/component-flow.js";
import { pipeGas } from "../../../src/physics/pipe.js";
import { PipeFlowEvaluation } from "../../../src/physics/pipe-flow.js";

export interface ComponentReference {
  fluids: string;
  scipy: string;
  air: { molarMass: number; gamma: number; specificGasConstant: number };
  orificeExpansibility: {
    D: number;
    Do: number;
    P1: number;
    P2: number;
    k: number;
    value: number;
  }[];
  orificePressureLoss: {
    D: number;
    Do: number;
    P1: number;
    P2: number;
    C: number;
    value: number;
  }[];
  orificeDischarge: {
    D: number;
    Do: number;
    P1: number;
    P2: number;
    rho: number;
    C: number;
    k: number;
    expansibility: number;
    massFlow: number;
  }[];
  readerHarrisGallagherRange: [number, number];
  nozzleExpansibility: {
    D: number;
    Do: number;
    P1: number;
    P2: number;
    k: number;
    value: number;
  }[];
  nozzleCriticalPressureRatio: { beta: number; k: number; criticalPressureRatio: number }[];
  longRadiusNozzleRange: [number, number];
  isa1932NozzleRange: [number, number];
  restrictionBetweenReservoirs: {
    kind: "orifice" | "nozzle";
    pipeDiameter: number;
    boreDiameter: number;
    dischargeCoefficient: number;
    upstreamPressure: number;
    downstreamPressure: number;
    temperature: number;
    tapPressure: number;
    expansibility: number;
    massFlow: number;
  }[];
  plenumNozzleChoked: {
    upstreamPressure: number;
    temperature: number;
    boreDiameter: number;
    massFlow: number;
    closedForm: number;
  };
  valveExample3: {
    inputs: Record<string, number>;
    inletDensity: number;
    massFlow: number;
    kv: number;
    pipingFactor: number;
    xTP: number;
    expansionFactor: number;
    choked: boolean;
  };
  valveExample3Converged: {
    kv: number;
    pipingFactor: number;
    xTP: number;
    expansionFactor: number;
    lossInletOutlet: number;
    lossInlet: number;
    N9: number;
  };
  valveBetweenReservoirs: {
    kv: number;
    upstreamPressure: number;
    downstreamPressure: number;
    temperature: number;
    xT: number;
    massFlow: number;
  }[];
  cvToKv: number;
  kToKv: { K: number; D: number; kv: number };
  darby3K: { row: string; nps: number; K: number }[];
  darby3KByDiameter: { row: string; Di: number; K: number }[];
  entranceSharp: number;
  pipes: { nps: number; schedule: string; Di: number; Do: number }[];
  roughness: Record<
    "copper" | "galvanized" | "compressedAir",
    [number | null, number | null, number | null]
  >;
}

export const reference = JSON.parse(
  readFileSync(
    new URL("../../fixtures/components/component-reference.json", import.meta.url),
    "utf8",
  ),
) as ComponentReference;

/** Air, as the network solver sees it (the preset: M 28.96442 g/mol, gamma 1.4). */
export const air = pipeGas(gasPreset("air"));

/** Evaluate a component afresh (end states included). */
export function evaluate(
  element: ComponentElement,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  forward = true,
): PipeFlowEvaluation {
  return evaluateComponentFlow(
    element,
    air,
    upstreamPressure,
    upstreamTemperature,
    downstreamPressure,
    forward,
    new PipeFlowEvaluation(),
    true,
  );
}

/** |a / b - 1| */
export function relativeError(actual: number, expected: number): number {
  return Math.abs(actual / expected - 1);
}
