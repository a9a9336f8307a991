/**
 * Points of a pressure and Mach profile along a path: the node pressures, the states at both
 * ends of each pipe, and states inside each pipe from the Fanno or the isothermal relations.
 */

import type { CheckedDocument } from "../../input/document-types.js";
import {
  fannoParameter,
  fannoPressureRatio,
  fannoStagnationPressureRatio,
  machFromFannoParameter,
} from "../../physics/fanno.js";
import { isentropicPressureRatio } from "../../physics/isentropic.js";
import {
  isothermalFrictionParameter,
  machFromIsothermalFrictionParameter,
} from "../../physics/isothermal.js";
import type { EdgeResult, NetworkResult } from "../../results/result-types.js";
import type { ProfilePath } from "./profile-path.js";

/** One point of a profile, SI. */
export interface ProfilePoint {
  /** Distance along the path from its first node [m]. */
  distance: number;
  /** Static pressure [Pa absolute]. */
  pressure: number;
  /** Stagnation pressure [Pa absolute]. */
  stagnationPressure: number;
  /** Mach number [-]; NaN at a node (gas at rest in the plenum: not drawn on the Mach chart). */
  mach: number;
  /** A node, a pipe end (where the path enters or leaves it) or a point inside a pipe. */
  place: "node" | "entry" | "interior" | "exit";
  /** The node (place "node") or the pipe (other places). */
  id: string;
  /** Mach number at which this pipe chokes (1 adiabatic, 1/sqrt(gamma) isothermal); NaN at a node. */
  chokeLimit: number;
}

/** Points inside each pipe of a profile. */
export const INTERIOR_POINTS = 11;

/**
 * Positions inside a pipe, as fractions s of its length from the inlet: s_i = 1 - (1 - i/n)^2,
 * i = 1 .. n - 1, denser towards the outlet where the Mach number rises fastest.
 */
export function interiorFractions(count: number = INTERIOR_POINTS): number[] {
  const fractions: number[] = [];
  for (let index = 1; index < count; index++) fractions.push(1 - (1 - index / count) ** 2);
  return fractions;
}

/** The state at a fraction s of a pipe's length from its inlet, or undefined if out of range. */
export interface InteriorState {
  mach: number;
  pressure: number;
  stagnationPressure: number;
}

/**
 * State inside a pipe at a fraction of its length from the inlet (in the direction of flow),
 * from its inlet state and its friction parameter X = fD L / D + K, the minor losses taken as
 * spread evenly along the pipe (the solver lumps them into X; where they sit is not modelled).
 *
 * Adiabatic (Fanno): fD L*(M)/D = fD L*(M1)/D - s X, p = p1 (p/p*)(M) / (p/p*)(M1),
 * p0 = p01 (p0/p0*)(M) / (p0/p0*)(M1). Isothermal: fD L*t(M)/D = fD L*t(M1)/D - s X,
 * p = p1 M1 / M, p0 = p / (p/p0)(M) (isentropic at the local state).
 *
 * @param edge - the pipe's result (inlet state, friction factor, model)
 * @param length - pipe length [m]
 * @param diameter - inside diameter [m]
 * @param minorLoss - sum of minor-loss coefficients [-]
 * @param gamma - heat capacity ratio [-]
 * @param fraction - s in [0, 1]
 * @returns the state, or undefined when the pipe carries no flow or the relations do not apply
 *   (a heat-transfer pipe; a solve that did not converge can leave states that fit no Fanno
 *   line)
 * @remarks Sources of the relations: A. H. Shapiro, The Dynamics and Thermodynamics of
 *   Compressible Fluid Flow, Vol. I, Ronald Press, 1953, ch. 6 (Fanno and isothermal flow).
 */
export function interiorState(
  edge: EdgeResult,
  length: number,
  diameter: number,
  minorLoss: number,
  gamma: number,
  fraction: number,
): InteriorState | undefined {
  // Heat exchange and elevation change the state along the pipe in ways neither closed form
  // follows: its profile shows only its two ends (the solver's own integration).
  if (edge.model === "heat-transfer") return undefined;
  const inletMach = edge.inlet.mach;
  const parameter = (edge.frictionFactor * length) / diameter + minorLoss;
  if (!(inletMach > 0 && Number.isFinite(parameter) && parameter >= 0)) return undefined;
  try {
    if (edge.model === "isothermal") {
      if (!(inletMach <= 1 / Math.sqrt(gamma))) return undefined;
      const left = Math.max(
        0,
        isothermalFrictionParameter(inletMach, gamma) - fraction * parameter,
      );
      const mach = machFromIsothermalFrictionParameter(left, gamma);
      const pressure = (edge.inlet.pressure * inletMach) / mach;
      return {
        mach,
        pressure,
        stagnationPressure: pressure / isentropicPressureRatio(mach, gamma),
      };
    }
    if (!(inletMach <= 1)) return undefined;
    const left = Math.max(0, fannoParameter(inletMach, gamma) - fraction * parameter);
    const mach = machFromFannoParameter(left, gamma, "subsonic");
    return {
      mach,
      pressure:
        (edge.inlet.pressure * fannoPressureRatio(mach, gamma)) /
        fannoPressureRatio(inletMach, gamma),
      stagnationPressure:
        (edge.inlet.stagnationPressure * fannoStagnationPressureRatio(mach, gamma)) /
        fannoStagnationPressureRatio(inletMach, gamma),
    };
  } catch {
    return undefined;
  }
}

/**
 * The points of a profile along a path.
 *
 * @param document - the checked document (pipe lengths, diameters, losses)
 * @param result - the result
 * @param path - from {@link findProfilePath}
 * @param interiorCount - n of {@link interiorFractions} (0: pipe ends only)
 * @returns points in path order: the first node, then per pipe its entry, interior points, exit
 *   and the next node. Pipe ends are the result's inlet and outlet states (swapped where the path
 *   runs against the flow); a node's pressure is its plenum pressure.
 */
export function profilePoints(
  document: CheckedDocument,
  result: NetworkResult,
  path: ProfilePath,
  interiorCount: number = INTERIOR_POINTS,
): ProfilePoint[] {
  const gamma = result.gas.heatCapacityRatio;
  const pressureOf = new Map(result.nodes.map((node) => [node.id, node.pressure]));
  const nodePoint = (id: string, distance: number): ProfilePoint => {
    const pressure = pressureOf.get(id) ?? Number.NaN;
    return {
      distance,
      pressure,
      stagnationPressure: pressure,
      mach: Number.NaN,
      place: "node",
      id,
      chokeLimit: Number.NaN,
    };
  };
  const first = path.nodes[0];
  const points: ProfilePoint[] = first === undefined ? [] : [nodePoint(first, 0)];
  let start = 0;
  for (const step of path.steps) {
    const edge = result.edges[step.edgeIndex];
    const input = document.edges[step.edgeIndex];
    if (!edge || !input) continue;
    const chokeLimit = edge.model === "isothermal" ? 1 / Math.sqrt(gamma) : 1;
    const length = input.length;
    const along: ProfilePoint[] = [];
    const end = (
      state: EdgeResult["inlet"],
      place: "entry" | "exit",
      distance: number,
    ): ProfilePoint => ({
      distance,
      pressure: state.pressure,
      stagnationPressure: state.stagnationPressure,
      mach: state.mach,
      place,
      id: edge.id,
      chokeLimit,
    });
    // Inside the pipe, in the direction of flow.
    const inside: ProfilePoint[] = [];
    for (const fraction of interiorCount > 1 ? interiorFractions(interiorCount) : []) {
      const state = interiorState(edge, length, input.diameter, input.minorLoss, gamma, fraction);
      if (!state) break;
      const distance = step.alongFlow ? start + fraction * length : start + (1 - fraction) * length;
      inside.push({ distance, ...state, place: "interior", id: edge.id, chokeLimit });
    }
    if (step.alongFlow) {
      along.push(
        end(edge.inlet, "entry", start),
        ...inside,
        end(edge.outlet, "exit", start + length),
      );
    } else {
      along.push(
        end(edge.outlet, "entry", start),
        ...inside.reverse(),
        end(edge.inlet, "exit", start + length),
      );
    }
    points.push(...along);
    start += length;
    points.push(nodePoint(step.end, start));
  }
  return points;
}
