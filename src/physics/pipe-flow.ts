/**
 * Flow through one pipe between two plenums, with the derivatives the network solver needs.
 *
 * The upstream plenum holds gas at rest at stagnation pressure p0 and temperature T0; the pipe
 * discharges into a plenum at static pressure pd <= p0. The result is the mass flow, its partial
 * derivatives with respect to p0, T0 and pd, whether the pipe is choked, and the stagnation
 * temperature of the gas arriving downstream.
 *
 * Three models (docs/model.md, "Pipe models"); the third, heat-transfer (friction, heat exchange
 * with the surroundings and elevation, integrated along the pipe), is in heat-transfer-pipe.ts:
 * - adiabatic: isentropic acceleration from the plenum into the pipe inlet, then Fanno flow over
 *   the friction parameter X = fD L/D + sum K; exit static pressure = pd while subsonic; choked
 *   when the exit reaches Mach 1 (then p_exit = p* >= pd).
 * - isothermal: inlet static pressure p0 (the entrance velocity head is neglected), static
 *   temperature T0 along the pipe, the isothermal friction equation; choked at the exit Mach
 *   1/sqrt(gamma).
 *
 * The friction factor follows the Reynolds number Re = G D / mu(T0), with G the mass flux and the
 * viscosity at the upstream stagnation temperature, and is converged together with the flow.
 *
 * This is the solver's hot path: one reusable output object, no allocation per call.
 */

import type { Gas } from "../gas/gas-types.js";
import { emptyThermoState, isPerfectGas, type ThermoState } from "../gas/thermo.js";
import { fannoParameter, machFromFannoParameter } from "./fanno.js";
import { darcyFrictionWithSlope, type FrictionWithSlope } from "./friction.js";
import { evaluateHeatTransferPipe, type HeatTransferScratch } from "./heat-transfer-pipe.js";
import {
  applyCaloricIsothermal,
  evaluateRealGasIsothermal,
  type RealGasScratch,
} from "./real-gas-pipe.js";

/** Geometry and friction of one pipe, in SI. */
export interface PipeGeometry {
  /** [m] */
  length: number;
  /** Inside diameter [m]. */
  diameter: number;
  /** Absolute roughness [m] for Colebrook-White; ignored when fixedFrictionFactor is set. */
  roughness: number;
  /** A fixed Darcy friction factor [-], or NaN to use Colebrook-White with the roughness. */
  fixedFrictionFactor: number;
  /** Sum of minor-loss coefficients K [-], added to fD L/D. */
  minorLoss: number;
  model: PipeModel;
  /** Heat-transfer model: overall heat-transfer coefficient per unit length U' [W/(m K)]. */
  heatTransferPerLength?: number;
  /** Heat-transfer model: temperature of the surroundings [K]. */
  surroundingTemperature?: number;
  /** Heat-transfer model: elevation of the `to` end minus the `from` end [m]. @defaultValue 0 */
  rise?: number;
}

/** The pipe models (docs/model.md, "Pipe models"). */
export type PipeModel = "adiabatic" | "isothermal" | "heat-transfer";

/** The gas constants a pipe evaluation needs. */
export interface PipeGas {
  /** R [J/(kg K)] */
  specificGasConstant: number;
  /** gamma [-] */
  heatCapacityRatio: number;
  /** mu(T) [Pa s] */
  viscosity: (temperature: number) => number;
  /** d ln mu / dT [1/K], the closed-form slope of the same law (gasViscosityLogSlope). */
  viscosityLogSlope: (temperature: number) => number;
  /** The gas itself: the heat-transfer model takes its properties through src/gas/thermo.ts. */
  gas: Gas;
}

/** Result of one evaluation. Reused between calls: copy what you keep. */
export class PipeFlowEvaluation {
  /** Mass flow from the upstream to the downstream plenum [kg/s], >= 0. */
  massFlow = 0;
  /** d(massFlow)/d(p0) [kg/(s Pa)] */
  dMassFlowdUpstreamPressure = 0;
  /** d(massFlow)/d(T0) [kg/(s K)] */
  dMassFlowdUpstreamTemperature = 0;
  /** d(massFlow)/d(pd) [kg/(s Pa)]; 0 when choked. */
  dMassFlowdDownstreamPressure = 0;
  /** True when the exit is sonic (adiabatic: Mach 1; isothermal: Mach 1/sqrt(gamma)). */
  choked = false;
  /** Largest mass flow the pipe passes for this upstream state [kg/s]. */
  capacity = 0;
  /** Mach number at the inlet (just inside the pipe) and at the exit [-]. */
  inletMach = 0;
  outletMach = 0;
  /** Static pressure at the inlet and at the exit [Pa]. */
  inletPressure = 0;
  outletPressure = 0;
  /** Darcy friction factor and Reynolds number at this flow. */
  frictionFactor = 0;
  reynolds = 0;
  /** Stagnation temperature of the gas arriving in the downstream plenum [K]. */
  arrivalTemperature = 0;
  /** Its derivatives with respect to p0, T0 and pd. */
  dArrivalTemperaturedUpstreamPressure = 0;
  dArrivalTemperaturedUpstreamTemperature = 0;
  dArrivalTemperaturedDownstreamPressure = 0;
  /** Warm start for the next call on the same pipe: the last inlet Mach numbers found. */
  lastInletMach = Number.NaN;
  lastCapacityInletMach = Number.NaN;
  /** Adiabatic model: warm start of the Fanno exit offset M2 - M1, the last one found. */
  lastExitOffset = Number.NaN;
  /** False when the capacity was not needed and not computed (then `capacity` is NaN). */
  capacityKnown = false;
  /** Heat-transfer model: heat flow into the gas over the pipe [W] (negative: the gas loses heat). */
  heatFlow = 0;
  /** Heat-transfer model: static temperature just inside the inlet and at the exit [K]. */
  inletTemperature = 0;
  outletTemperature = 0;
  /** Heat-transfer model's work space (made on first use). */
  heatTransfer: HeatTransferScratch | undefined = undefined;
  /** Work space of the relations with cp(T) or a real gas (real-gas-pipe.ts; first use). */
  realGas: RealGasScratch | undefined = undefined;
  /** A thermodynamic state record for callers (the orientation of a rising pipe). */
  readonly thermo: ThermoState = emptyThermoState();
  /** Scratch of the friction relation (kept here so the hot path allocates nothing). */
  readonly friction: FrictionScratch = {
    value: 0,
    slope: 0,
    factor: 0,
    colebrook: { factor: 0, logSlope: 0, inverseRoot: Number.NaN },
  };
}

/** Scratch of {@link frictionParameter}. */
export interface FrictionScratch {
  /** X = fD L/D + K [-] */
  value: number;
  /** dX/dRe [-] */
  slope: number;
  /** fD [-] */
  factor: number;
  colebrook: FrictionWithSlope;
}

/** Friction parameter fD L/D + K at a Reynolds number, and its derivative with respect to Re. */
export function frictionParameter(
  pipe: PipeGeometry,
  reynolds: number,
  out: FrictionScratch,
): void {
  const lengthRatio = pipe.length / pipe.diameter;
  if (!Number.isNaN(pipe.fixedFrictionFactor)) {
    // A fixed factor holds while it exceeds the laminar value; below that (vanishing flow) the
    // laminar law takes over so the relation stays smooth and finite at zero flow.
    const laminar = reynolds > 0 ? 64 / reynolds : Number.POSITIVE_INFINITY;
    if (pipe.fixedFrictionFactor >= laminar) {
      out.factor = pipe.fixedFrictionFactor;
      out.value = out.factor * lengthRatio + pipe.minorLoss;
      out.slope = 0;
    } else {
      out.factor = laminar;
      out.value = laminar * lengthRatio + pipe.minorLoss;
      out.slope = (-laminar / reynolds) * lengthRatio;
    }
    return;
  }
  const colebrook = darcyFrictionWithSlope(reynolds, pipe.roughness / pipe.diameter, out.colebrook);
  out.factor = colebrook.factor;
  out.value = colebrook.factor * lengthRatio + pipe.minorLoss;
  out.slope = ((colebrook.factor * colebrook.logSlope) / reynolds) * lengthRatio;
}

// --- Closed forms of a calorically perfect gas and their logarithmic derivatives -------------
// Phi(M) = G sqrt(R T0)/p0 (isentropic mass-flux parameter); pi(M) = p/p0; P(M) = p/p* (Fanno);
// F(M) = fD L*/D (Fanno). Sources and equations: docs/model.md and src/physics/isentropic.ts,
// src/physics/fanno.ts. Derivatives by hand, checked against differences in the tests.

/**
 * Phi = sqrt(gamma) M (1 + (gamma-1)/2 M^2)^(-(gamma+1)/(2(gamma-1))), the power taken as
 * exp of a log1p (a general power costs about twice as much and this runs in every iteration).
 */
function massFluxParameterOf(mach: number, gamma: number): number {
  const exponent = -(gamma + 1) / (2 * (gamma - 1));
  return mach * Math.sqrt(gamma) * Math.exp(exponent * Math.log1p(0.5 * (gamma - 1) * mach * mach));
}
/** d ln Phi / dM = 1/M - ((gamma+1)/2) M / (1 + (gamma-1)/2 M^2) */
function logMassFluxSlope(mach: number, gamma: number): number {
  return 1 / mach - (0.5 * (gamma + 1) * mach) / (1 + 0.5 * (gamma - 1) * mach * mach);
}
/** ln(p/p0) = -(gamma/(gamma-1)) ln(1 + (gamma-1)/2 M^2) */
function logIsentropicPressure(mach: number, gamma: number): number {
  return (-gamma / (gamma - 1)) * Math.log1p(0.5 * (gamma - 1) * mach * mach);
}
/** d ln(p/p0)/dM = -gamma M / (1 + (gamma-1)/2 M^2) */
function logIsentropicPressureSlope(mach: number, gamma: number): number {
  return (-gamma * mach) / (1 + 0.5 * (gamma - 1) * mach * mach);
}
/** ln(p/p*) = -ln M + 0.5 ln((gamma+1)/(2 + (gamma-1) M^2)) */
function logFannoPressure(mach: number, gamma: number): number {
  return -Math.log(mach) + 0.5 * Math.log((gamma + 1) / (2 + (gamma - 1) * mach * mach));
}
/** d ln(p/p*)/dM = -1/M - (gamma-1) M / (2 + (gamma-1) M^2) */
function logFannoPressureSlope(mach: number, gamma: number): number {
  return -1 / mach - ((gamma - 1) * mach) / (2 + (gamma - 1) * mach * mach);
}
/** dF/dM = -4 (1 - M^2) / (gamma M^3 (2 + (gamma-1) M^2)) */
function fannoSlope(mach: number, gamma: number): number {
  return (-4 * (1 - mach * mach)) / (gamma * mach * mach * mach * (2 + (gamma - 1) * mach * mach));
}

/**
 * Evaluate a pipe carrying gas from a plenum at (p0, T0) into a plenum at pd (pd <= p0).
 * `out` is filled in and returned; its lastInletMach fields warm-start the next call.
 *
 * @param needCapacity - compute the capacity even when the pipe is clearly not choked (results
 *   need it; Newton iterations do not, and skip that solve for speed). When false and the pipe
 *   is not near choking, `out.capacity` is NaN and `out.capacityKnown` false.
 * @param pressureDrop - p0 - pd [Pa] when the caller knows it more exactly than the difference of
 *   the two rounded pressures (the network solver holds junction pressures as small offsets from
 *   a reference, so a drop of a few units in the last place of p0 keeps its digits); used by the
 *   creeping-flow law, the only one whose flow follows from such a drop.
 * @param forward - true when the flow runs from the pipe's `from` end to its `to` end (the
 *   heat-transfer model's rise then counts upward in the flow direction)
 */
export function evaluatePipeFlow(
  pipe: PipeGeometry,
  gas: PipeGas,
  upstreamPressure: number,
  upstreamTemperature: number,
  downstreamPressure: number,
  out: PipeFlowEvaluation,
  needCapacity = true,
  pressureDrop = upstreamPressure - downstreamPressure,
  forward = true,
): PipeFlowEvaluation {
  const perfect = isPerfectGas(gas.gas);
  // With cp(T) or a real gas an adiabatic pipe is the heat-transfer integration without heat
  // exchange (Fanno's closed form is the perfect gas's): docs/model.md, real-gas-pipe.ts.
  if (pipe.model === "heat-transfer" || (pipe.model === "adiabatic" && !perfect)) {
    const rise = pipe.rise ?? 0;
    evaluateHeatTransferPipe(
      pipe,
      gas.gas,
      gas.viscosity,
      frictionParameter,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      forward ? rise : -rise,
      out,
      needCapacity,
    );
  } else if (pipe.model === "isothermal" && gas.gas.equationOfState !== undefined) {
    evaluateRealGasIsothermal(
      pipe,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      out,
      needCapacity,
      pressureDrop,
      frictionParameter,
    );
  } else if (pipe.model === "isothermal") {
    evaluateIsothermal(
      pipe,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      out,
      needCapacity,
      pressureDrop,
    );
    if (!perfect) {
      applyCaloricIsothermal(
        gas.gas,
        gas.heatCapacityRatio,
        upstreamTemperature,
        downstreamPressure,
        out,
      );
    }
  } else {
    evaluateAdiabatic(
      pipe,
      gas,
      upstreamPressure,
      upstreamTemperature,
      downstreamPressure,
      out,
      needCapacity,
      pressureDrop,
    );
  }
  return out;
}

/** An exit Mach number above this (adiabatic) counts as "near choking": the capacity is solved. */
const NEAR_CHOKE_MACH = 0.999;

// ---------------------------------------------------------------------------------------------
// Adiabatic: isentropic entrance + Fanno.
// All states are functions of the inlet Mach number M1 for a given upstream state:
//   G = Phi(M1) p0 / sqrt(R T0),  Re = G D / mu(T0) = Phi(M1) * reynoldsScale,
//   X = fD(Re) L/D + K,  F(M2) = F(M1) - X,  p_exit = p0 pi(M1) P(M2)/P(M1).
// Capacity: F(M1c) = X(M1c), exit Mach 1. Subsonic: ln(p_exit/p0) = ln(pd/p0) solved for M1.

function evaluateAdiabatic(
  pipe: PipeGeometry,
  gas: PipeGas,
  p0: number,
  t0: number,
  pd: number,
  out: PipeFlowEvaluation,
  needCapacity: boolean,
  drop: number,
): void {
  const gamma = gas.heatCapacityRatio;
  const r = gas.specificGasConstant;
  const area = 0.25 * Math.PI * pipe.diameter * pipe.diameter;
  const mu = gas.viscosity(t0);
  const muSlope = gas.viscosityLogSlope(t0); // d ln mu / dT
  const sqrtRT = Math.sqrt(r * t0);
  const fluxScale = p0 / sqrtRT; // G = Phi * fluxScale
  const reynoldsScale = (fluxScale * pipe.diameter) / mu; // Re = Phi * reynoldsScale
  const friction = out.friction;

  out.arrivalTemperature = t0;
  out.dArrivalTemperaturedUpstreamPressure = 0;
  out.dArrivalTemperaturedUpstreamTemperature = 1;
  out.dArrivalTemperaturedDownstreamPressure = 0;
  out.capacity = Number.NaN;
  out.capacityKnown = false;

  const targetLogRatio = pd > 0 ? Math.log(pd / p0) : Number.NEGATIVE_INFINITY;
  // The capacity, when solved (see solveAdiabaticCapacity): its inlet Mach number and the log
  // of its exit pressure ratio.
  let capacityMach = Number.NaN;
  let logChokedExitRatio = Number.NaN;
  // Known choked last time, or no flow: the capacity decides, solve it first.
  if (needCapacity || out.choked || pd >= p0) {
    logChokedExitRatio = solveAdiabaticCapacity(pipe, gamma, reynoldsScale, fluxScale, area, out);
    capacityMach = out.lastCapacityInletMach;
  }
  if (setCreepingFlow(pipe, gas, p0, t0, pd, drop, mu, muSlope, area, p0, 1, out)) return;

  // Subsonic exit: g(M1) = ln(p_exit/p0) - ln(pd/p0) = 0 on (0, M1c). Without the capacity the
  // bracket is (0, 1) and the pipe's capacity shows up as a root that drifts to the sonic exit.
  let mach = Number.NaN;
  let exitMach = 1;
  if (
    targetLogRatio > Number.NEGATIVE_INFINITY &&
    !(out.capacityKnown && targetLogRatio <= logChokedExitRatio)
  ) {
    mach = adiabaticInletMach(
      pipe,
      gamma,
      reynoldsScale,
      targetLogRatio,
      out.capacityKnown ? capacityMach : 1,
      out,
    );
    exitMach = out.outletMach;
  }
  if (!out.capacityKnown && !(exitMach < NEAR_CHOKE_MACH)) {
    logChokedExitRatio = solveAdiabaticCapacity(pipe, gamma, reynoldsScale, fluxScale, area, out);
    capacityMach = out.lastCapacityInletMach;
    if (targetLogRatio > logChokedExitRatio) {
      mach = adiabaticInletMach(pipe, gamma, reynoldsScale, targetLogRatio, capacityMach, out);
      exitMach = out.outletMach;
    }
  }

  if (out.capacityKnown && targetLogRatio <= logChokedExitRatio) {
    // Choked: flow set by the upstream state alone.
    const phiCapacity = massFluxParameterOf(capacityMach, gamma);
    frictionParameter(pipe, phiCapacity * reynoldsScale, friction);
    out.choked = true;
    out.massFlow = out.capacity;
    out.inletMach = capacityMach;
    out.outletMach = 1;
    out.inletPressure = p0 * Math.exp(logIsentropicPressure(capacityMach, gamma));
    out.outletPressure = p0 * Math.exp(logChokedExitRatio);
    out.frictionFactor = friction.factor;
    out.reynolds = phiCapacity * reynoldsScale;
    // dh = 0: (F'(M) - X_Re Re Phi'/Phi) dM - X_Re Re d ln(reynoldsScale) = 0
    const reynolds = out.reynolds;
    const phiLogSlope = logMassFluxSlope(capacityMach, gamma);
    const hMach = fannoSlope(capacityMach, gamma) - friction.slope * reynolds * phiLogSlope;
    const machPerLogScale = (friction.slope * reynolds) / hMach;
    // d ln(reynoldsScale) = d ln p0 - (1/(2 T0) + mu'/mu) dT0
    const dLogScaledP0 = 1 / p0;
    const dLogScaledT0 = -0.5 / t0 - muSlope;
    out.dMassFlowdUpstreamPressure =
      out.massFlow * (1 / p0 + phiLogSlope * machPerLogScale * dLogScaledP0);
    out.dMassFlowdUpstreamTemperature =
      out.massFlow * (-0.5 / t0 + phiLogSlope * machPerLogScale * dLogScaledT0);
    out.dMassFlowdDownstreamPressure = 0;
    return;
  }

  // Subsonic: final state at the converged M1 (adiabaticInletMach left M2 in out and the
  // friction parameter at M1 in out.friction).
  const phi = massFluxParameterOf(mach, gamma);
  const reynolds = phi * reynoldsScale;
  out.lastInletMach = mach;
  out.choked = false;
  out.massFlow = phi * fluxScale * area;
  out.inletMach = mach;
  out.outletMach = exitMach;
  out.inletPressure = p0 * Math.exp(logIsentropicPressure(mach, gamma));
  out.outletPressure = pd;
  out.frictionFactor = friction.factor;
  out.reynolds = reynolds;

  // Implicit derivatives. g(M1; p0, T0, pd) = ln r(M1, X(Re)) - ln(pd/p0), Re = Phi(M1) scale.
  const phiLogSlope = logMassFluxSlope(mach, gamma);
  const exitFannoSlope = fannoSlope(exitMach, gamma);
  const dLogRatiodX = -logFannoPressureSlope(exitMach, gamma) / exitFannoSlope; // at fixed M1
  const dXdLogScale = friction.slope * reynolds; // dX / d ln(reynoldsScale) at fixed M1
  const gMach =
    logIsentropicPressureSlope(mach, gamma) -
    logFannoPressureSlope(mach, gamma) +
    (logFannoPressureSlope(exitMach, gamma) *
      (fannoSlope(mach, gamma) - dXdLogScale * phiLogSlope)) /
      exitFannoSlope;
  const gP0 = dLogRatiodX * dXdLogScale * (1 / p0) + 1 / p0;
  const gT0 = dLogRatiodX * dXdLogScale * (-0.5 / t0 - muSlope);
  const gPd = -1 / pd;
  const massFlow = out.massFlow;
  out.dMassFlowdUpstreamPressure = massFlow * (1 / p0 - (phiLogSlope * gP0) / gMach);
  out.dMassFlowdUpstreamTemperature = massFlow * (-0.5 / t0 - (phiLogSlope * gT0) / gMach);
  out.dMassFlowdDownstreamPressure = massFlow * (-(phiLogSlope * gPd) / gMach);
}

/**
 * Solve an adiabatic pipe's capacity into `out` (its inlet Mach number into
 * lastCapacityInletMach, which also warm-starts the next solve; the mass flow into capacity) and
 * return ln(p_exit/p0) at it. `fluxScale` is p0 / sqrt(R T0) [kg/(s m2)] (G = Phi fluxScale),
 * `area` the pipe's cross-section [m2].
 * A function rather than a closure of evaluateAdiabatic, so that no context is allocated per
 * call.
 */
function solveAdiabaticCapacity(
  pipe: PipeGeometry,
  gamma: number,
  reynoldsScale: number,
  fluxScale: number,
  area: number,
  out: PipeFlowEvaluation,
): number {
  const capacityMach = adiabaticCapacityMach(
    pipe,
    gamma,
    reynoldsScale,
    out.lastCapacityInletMach,
    out.friction,
  );
  out.lastCapacityInletMach = capacityMach;
  out.capacity = massFluxParameterOf(capacityMach, gamma) * fluxScale * area;
  out.capacityKnown = true;
  return logIsentropicPressure(capacityMach, gamma) - logFannoPressure(capacityMach, gamma);
}

/**
 * Inlet Mach number M1 in (0, upper) at which the exit static pressure is pd, by safeguarded
 * Newton on g(M1) = ln(p_exit/p0) - ln(pd/p0). Leaves the exit Mach number in out.outletMach
 * (1 when the root is not inside the bracket: the pipe is at or beyond its capacity) and the
 * friction parameter at the returned M1 in out.friction.
 */
function adiabaticInletMach(
  pipe: PipeGeometry,
  gamma: number,
  reynoldsScale: number,
  targetLogRatio: number,
  upper: number,
  out: PipeFlowEvaluation,
): number {
  const friction = out.friction;
  let lo = 0;
  let hi = upper;
  let mach = out.lastInletMach;
  if (!(mach > 0 && mach < hi)) {
    // Low-Mach estimate: 1 - pd/p0 ~ (gamma/2) M^2 (1 + X) with X at a turbulent guess.
    frictionParameter(pipe, Math.max(0.5 * hi * reynoldsScale, 1), friction);
    mach = Math.min(0.9 * hi, Math.sqrt((-2 * targetLogRatio) / (gamma * (1 + friction.value))));
  }
  let exitMach = 1;
  // Start of the exit offset's Newton iteration: the last one found on this pipe, then the
  // first-order prediction of each Newton step of M1 (NaN: from the Fanno inversion).
  let offsetGuess = out.lastExitOffset;
  let frictionAtMach = false;
  for (let iteration = 0; iteration < 100; iteration++) {
    const reynolds = massFluxParameterOf(mach, gamma) * reynoldsScale;
    frictionParameter(pipe, reynolds, friction);
    frictionAtMach = true;
    const remaining = fannoParameter(mach, gamma) - friction.value;
    if (!(remaining > 0)) {
      // Beyond this pipe's capacity at this M1: the root lies below.
      hi = mach;
      mach = lo > 0 ? Math.sqrt(lo * hi) : 0.5 * hi;
      frictionAtMach = false;
      offsetGuess = Number.NaN;
      exitMach = 1;
      if (hi - lo <= 1e-15 * hi) break;
      continue;
    }
    const offset = fannoExitOffset(mach, friction.value, gamma, remaining, offsetGuess);
    out.lastExitOffset = offset;
    exitMach = mach + offset;
    const logRatio = logPressureRatioOfOffset(mach, offset, gamma);
    // Newton in ln M1 on phi = ln(-ln r) - ln(-ln(pd/p0)): 1 - r grows as a power of M1 (M1^2 in
    // fully rough flow, M1^1.75 in smooth, M1 in laminar), so phi is nearly linear in ln M1 and
    // Newton needs one or two steps from a warm start.
    const phi = Math.log(logRatio / targetLogRatio);
    // Residual 1e-13 in ln(-ln r) and M1 to 1e-13: below anything a result shows and reachable
    // in floating point (a tighter test can stall on rounding and waste iterations).
    if (Math.abs(phi) <= 1e-13) break;
    if (phi < 0) lo = mach;
    else hi = mach;
    // d logRatio / dM1 with the friction parameter following Re(M1).
    const dRemaining =
      fannoSlope(mach, gamma) - friction.slope * reynolds * logMassFluxSlope(mach, gamma);
    const dExitMach = dRemaining / fannoSlope(exitMach, gamma);
    const slope =
      logIsentropicPressureSlope(mach, gamma) -
      logFannoPressureSlope(mach, gamma) +
      logFannoPressureSlope(exitMach, gamma) * dExitMach;
    const phiSlope = (mach * slope) / logRatio; // d phi / d ln M1 > 0
    let next = mach * Math.exp(-phi / phiSlope);
    // The offset M2 - M1 moves by (dM2/dM1 - 1) dM1 to first order.
    offsetGuess = offset + (dExitMach - 1) * (next - mach);
    if (!(next > lo && next < hi)) {
      next = lo > 0 ? Math.sqrt(lo * hi) : 0.5 * hi;
      offsetGuess = Number.NaN;
    }
    const change = Math.abs(next - mach);
    mach = next;
    frictionAtMach = false;
    if (change <= 1e-13 * mach) break;
  }
  if (!frictionAtMach) {
    frictionParameter(pipe, massFluxParameterOf(mach, gamma) * reynoldsScale, friction);
  }
  out.outletMach = exitMach;
  return mach;
}

/**
 * delta = M2 - M1 of Fanno flow over a friction parameter X, to full relative precision even
 * when delta is tiny (a small pressure drop), where M2 from F(M2) = F(M1) - X would lose it to
 * the subtraction. Solves DF(delta) = F(M1) - F(M1 + delta) = X by Newton, with DF written in a
 * form free of cancellation:
 *   DF = d (2a + d) / (gamma a^2 b^2) - ((gamma+1)/gamma) log1p(d/a)
 *        + ((gamma+1)/(2 gamma)) log1p((gamma-1) d (2a + d) / (2 + (gamma-1) a^2)),  b = a + d.
 * DF is increasing and concave in d (F is convex on the subsonic branch) with DF(0) = 0, so
 * DF(d) <= -F'(a) d and the root is at least X / -F'(a): a lower bound, from which Newton rises
 * monotonically to the root, and where a step from above the root is caught. It starts from
 * `guess` when that lies in (0, 1 - a) (a warm start: the last offset of this pipe, or its
 * prediction), otherwise from M2 by the Fanno inversion; either way it stops on the same tests,
 * so the start changes the result by no more than they allow.
 */
function fannoExitOffset(
  inletMach: number,
  frictionValue: number,
  gamma: number,
  remaining: number,
  guess: number,
): number {
  const a = inletMach;
  const c = (gamma + 1) / (2 * gamma);
  const lower = -frictionValue / fannoSlope(a, gamma);
  let delta: number;
  if (guess > 0 && guess < 1 - a) {
    delta = Math.max(guess, lower);
  } else {
    delta = Math.max(machFromFannoParameter(remaining, gamma, "subsonic") - a, 0);
    if (delta === 0) delta = lower;
  }
  let lo = lower < 1 - a ? lower : 0;
  let hi = 1 - a;
  for (let iteration = 0; iteration < 30; iteration++) {
    const b = a + delta;
    const sum = delta * (2 * a + delta);
    const difference =
      sum / (gamma * a * a * b * b) -
      2 * c * Math.log1p(delta / a) +
      c * Math.log1p(((gamma - 1) * sum) / (2 + (gamma - 1) * a * a));
    const residual = difference - frictionValue;
    if (Math.abs(residual) <= 1e-15 * frictionValue) break;
    if (residual > 0) hi = delta;
    else lo = delta;
    let next = delta - residual / -fannoSlope(b, gamma);
    if (!(next > lo && next < hi)) next = next <= lo ? lo : 0.5 * (lo + hi);
    const change = Math.abs(next - delta);
    delta = next;
    if (change <= 1e-15 * delta) break;
  }
  return delta;
}

/**
 * ln(p_exit / p0) of an adiabatic pipe from its inlet Mach number a and the Fanno offset
 * d = M2 - M1, without cancellation:
 *   ln pi(a) - log1p(d/a) - 0.5 log1p((gamma-1) d (2a + d) / (2 + (gamma-1) a^2)).
 */
function logPressureRatioOfOffset(a: number, delta: number, gamma: number): number {
  return (
    logIsentropicPressure(a, gamma) -
    Math.log1p(delta / a) -
    0.5 * Math.log1p(((gamma - 1) * delta * (2 * a + delta)) / (2 + (gamma - 1) * a * a))
  );
}

/** Inlet Mach number at which the pipe chokes: F(M) = X(Re(M)). */
function adiabaticCapacityMach(
  pipe: PipeGeometry,
  gamma: number,
  reynoldsScale: number,
  guess: number,
  friction: FrictionScratch,
): number {
  let lo = 0;
  let hi = 1;
  let mach = guess;
  if (!(mach > 0 && mach < 1)) {
    frictionParameter(pipe, Math.max(0.3 * reynoldsScale, 1), friction);
    mach = friction.value > 0 ? machFromFannoParameter(friction.value, gamma, "subsonic") : 1;
  }
  for (let iteration = 0; iteration < 100; iteration++) {
    const reynolds = massFluxParameterOf(mach, gamma) * reynoldsScale;
    frictionParameter(pipe, reynolds, friction);
    if (friction.value <= 0) return 1;
    // Newton in ln M on ln F(M) - ln X(M), nearly linear (F ~ 1/(gamma M^2) at low Mach).
    const fanno = fannoParameter(mach, gamma);
    const h = Math.log(fanno / friction.value);
    if (Math.abs(h) <= 1e-14) break;
    if (h > 0) lo = mach;
    else hi = mach;
    const frictionMachSlope = friction.slope * reynolds * logMassFluxSlope(mach, gamma); // dX/dM
    const slope = mach * (fannoSlope(mach, gamma) / fanno - frictionMachSlope / friction.value);
    let next = slope < 0 ? mach * Math.exp(-h / slope) : Number.NaN;
    if (!(next > lo && next < hi)) next = lo > 0 ? Math.sqrt(lo * hi) : 0.5 * hi;
    const change = Math.abs(next - mach);
    mach = next;
    if (change <= 1e-13 * mach) break;
  }
  return mach;
}

/** Relative pressure drop below which a pipe's flow is taken from the small-drop law. */
const CREEPING_PRESSURE_RATIO = 1e-10;

/**
 * Whether {@link evaluatePipeFlow} took a pipe's flow from the small-drop law, given its pressure
 * drop [Pa] and upstream pressure [Pa]: the one law that uses the drop as given rather than the
 * two pressures.
 */
export function isCreepingFlow(drop: number, upstreamPressure: number): boolean {
  return drop <= CREEPING_PRESSURE_RATIO * upstreamPressure;
}

/**
 * Small-drop law: for a pressure drop below 1e-10 of the pressure the gas is incompressible to
 * that accuracy, and the plenum-to-plenum relation of each model tends to
 *
 *   p0 - pd = (e + fD(Re) L/D + K) G^2 / (2 rho),   rho = p0 / (R T0),   Re = G D / mu,
 *
 * friction and minor losses plus, for the adiabatic model, the dynamic head of the entry
 * (`entryHead` e = 1: its pipe starts from the plenum's stagnation state); the isothermal model
 * starts at the plenum pressure and has no entry head (e = 0). Laminar, fD = 64/Re, it
 * is the Hagen-Poiseuille law m = rho D^2 A (p0 - pd) / (32 mu L) plus the second-order terms.
 * Solved for G by a safeguarded Newton iteration from the laminar root (the lowest friction, so
 * an upper bound). Used where the compressible relations would have to resolve ln(pd/p0) within
 * a few units of rounding and their derivatives lose all accuracy. `drop` is p0 - pd, given
 * apart from pd so that it can be more exact than their rounded difference (the network solver
 * takes it from its pressure offsets). `inletPressure` is the pipe's inlet static pressure.
 * Fills `out` and returns true when it applies.
 */
function setCreepingFlow(
  pipe: PipeGeometry,
  gas: PipeGas,
  p0: number,
  t0: number,
  pd: number,
  drop: number,
  mu: number,
  muSlope: number,
  area: number,
  inletPressure: number,
  entryHead: 0 | 1,
  out: PipeFlowEvaluation,
): boolean {
  if (!(drop <= CREEPING_PRESSURE_RATIO * p0)) return false;
  const density = p0 / (gas.specificGasConstant * t0);
  const reynoldsPerFlux = pipe.diameter / mu;
  // Laminar: drop = a G + b G^2.
  const a = (32 * mu * pipe.length) / (density * pipe.diameter * pipe.diameter);
  const b = (entryHead + pipe.minorLoss) / (2 * density);
  const positive = Math.max(drop, 0);
  let flux = (2 * positive) / (a + Math.sqrt(a * a + 4 * b * positive));
  const friction = out.friction;
  // Slope dF/dG of F(G) = (e + X(Re)) G^2 / (2 rho), and dF/dRe at fixed G.
  let slope = a;
  let reynoldsSlope = 0;
  if (flux > 0) {
    let high = flux;
    for (let iteration = 0; iteration < 60; iteration++) {
      const reynolds = flux * reynoldsPerFlux;
      frictionParameter(pipe, reynolds, friction);
      const value = ((entryHead + friction.value) * flux * flux) / (2 * density) - positive;
      reynoldsSlope = (friction.slope * flux * flux) / (2 * density);
      slope = ((entryHead + friction.value) * flux) / density + reynoldsSlope * reynoldsPerFlux;
      if (value > 0) high = flux;
      let next = flux - value / slope;
      if (!(next > 0 && next <= high)) next = 0.5 * (flux + (value > 0 ? 0 : high));
      const change = Math.abs(next - flux);
      flux = next;
      if (change <= 1e-15 * flux) break;
    }
    const reynolds = flux * reynoldsPerFlux;
    frictionParameter(pipe, reynolds, friction);
    reynoldsSlope = (friction.slope * flux * flux) / (2 * density);
    slope = ((entryHead + friction.value) * flux) / density + reynoldsSlope * reynoldsPerFlux;
  }
  const massFlow = flux * area;
  const reynolds = flux * reynoldsPerFlux;
  const velocity = flux / density;
  const mach = velocity / Math.sqrt(gas.heatCapacityRatio * gas.specificGasConstant * t0);
  // Implicit derivatives of F(G; p0, T0) = p0 - pd: F grows as 1/rho (with p0 and T0) and
  // through Re = G D / mu(T0).
  out.choked = false;
  out.massFlow = massFlow;
  out.dMassFlowdUpstreamPressure = (area * (1 + positive / p0)) / slope;
  out.dMassFlowdUpstreamTemperature =
    flux > 0 ? (-area * (positive / t0 - reynoldsSlope * reynolds * muSlope)) / slope : 0;
  out.dMassFlowdDownstreamPressure = -area / slope;
  out.inletMach = mach;
  out.outletMach = mach;
  out.inletPressure = inletPressure;
  out.outletPressure = pd;
  out.reynolds = reynolds;
  out.frictionFactor = reynolds > 0 ? (flux > 0 ? friction.factor : 64 / reynolds) : 0;
  out.arrivalTemperature = t0;
  out.dArrivalTemperaturedUpstreamPressure = 0;
  out.dArrivalTemperaturedUpstreamTemperature = 1;
  out.dArrivalTemperaturedDownstreamPressure = 0;
  return true;
}

// ---------------------------------------------------------------------------------------------
// Isothermal: Q(G) = G^2 R T (X(Re) + 2 ln(p1/pd)) - (p1^2 - pd^2) = 0, p1 = p0, T = T0.
// Capacity: r = p2*/p1 with r^2 (X + 1 - 2 ln r) = 1, G* = p2* / sqrt(R T).

function evaluateIsothermal(
  pipe: PipeGeometry,
  gas: PipeGas,
  p1: number,
  t: number,
  pd: number,
  out: PipeFlowEvaluation,
  needCapacity: boolean,
  drop: number,
): void {
  const gamma = gas.heatCapacityRatio;
  const r = gas.specificGasConstant;
  const area = 0.25 * Math.PI * pipe.diameter * pipe.diameter;
  const mu = gas.viscosity(t);
  const muSlope = gas.viscosityLogSlope(t);
  const rt = r * t;
  const sqrtRT = Math.sqrt(rt);
  const reynoldsPerFlux = pipe.diameter / mu;
  const friction = out.friction;
  const half = 0.5 * (gamma - 1);
  const limitingMach = 1 / Math.sqrt(gamma);
  out.capacity = Number.NaN;
  out.capacityKnown = false;

  // Capacity: Newton on r = p2* / p1 with X following Re(G*(r)).
  let ratio = Number.NaN;
  let chokedFlux = Number.NaN;
  let chokedExitPressure = Number.NaN;
  const solveCapacity = () => {
    ratio = isothermalCapacityRatio(
      pipe,
      p1,
      sqrtRT,
      reynoldsPerFlux,
      out.lastCapacityInletMach,
      friction,
    );
    out.lastCapacityInletMach = ratio; // stores r* for this model
    chokedFlux = (p1 * ratio) / sqrtRT;
    out.capacity = chokedFlux * area;
    out.capacityKnown = true;
    chokedExitPressure = p1 * ratio;
  };
  // Known choked last time, or no flow or no back-pressure: the capacity decides, solve it first.
  if (needCapacity || out.choked || pd >= p1 || !(pd > 0)) solveCapacity();

  if (setCreepingFlow(pipe, gas, p1, t, pd, drop, mu, muSlope, area, p1, 0, out)) return;

  // Subsonic: Newton on G in (0, G*); without the capacity, in (0, infinity) and the pipe's
  // capacity shows as an exit Mach number at or above 1/sqrt(gamma).
  const logPressureRatio = Math.log(p1 / pd);
  const pressureSquares = (p1 - pd) * (p1 + pd);
  let flux = Number.NaN;
  if (!(out.capacityKnown && pd <= chokedExitPressure)) {
    flux = isothermalFlux(
      pipe,
      rt,
      reynoldsPerFlux,
      logPressureRatio,
      pressureSquares,
      out.capacityKnown ? chokedFlux : Number.POSITIVE_INFINITY,
      out,
    );
  }
  if (!out.capacityKnown && !((flux * sqrtRT) / pd < NEAR_CHOKE_MACH)) {
    solveCapacity();
    if (pd > chokedExitPressure) {
      flux = isothermalFlux(
        pipe,
        rt,
        reynoldsPerFlux,
        logPressureRatio,
        pressureSquares,
        chokedFlux,
        out,
      );
    }
  }

  if (out.capacityKnown && pd <= chokedExitPressure) {
    frictionParameter(pipe, chokedFlux * reynoldsPerFlux, friction);
    out.choked = true;
    out.massFlow = out.capacity;
    out.inletMach = (chokedFlux * sqrtRT) / (p1 * Math.sqrt(gamma));
    out.outletMach = limitingMach;
    out.inletPressure = p1;
    out.outletPressure = chokedExitPressure;
    out.frictionFactor = friction.factor;
    out.reynolds = chokedFlux * reynoldsPerFlux;
    // d ln r = a (d ln G* - mu'/mu dT), a = (dr/dX / r) X_Re Re; d ln G* = d ln p1 - dT/(2T) + d ln r
    const logRatio = Math.log(ratio);
    const drdXOverR = -1 / (2 * (friction.value - 2 * logRatio));
    const a = drdXOverR * friction.slope * out.reynolds;
    const dLogRdP1 = (a * (1 / p1)) / (1 - a);
    const dLogRdT = (a * (-0.5 / t - muSlope)) / (1 - a);
    out.dMassFlowdUpstreamPressure = out.massFlow * (1 / p1 + dLogRdP1);
    out.dMassFlowdUpstreamTemperature = out.massFlow * (-0.5 / t + dLogRdT);
    out.dMassFlowdDownstreamPressure = 0;
    out.arrivalTemperature = t * (1 + half * limitingMach * limitingMach);
    out.dArrivalTemperaturedUpstreamPressure = 0;
    out.dArrivalTemperaturedUpstreamTemperature = 1 + half * limitingMach * limitingMach;
    out.dArrivalTemperaturedDownstreamPressure = 0;
    return;
  }

  const reynolds = flux * reynoldsPerFlux;
  frictionParameter(pipe, reynolds, friction);
  out.lastInletMach = flux;
  out.choked = false;
  out.massFlow = flux * area;
  out.inletMach = (flux * sqrtRT) / (p1 * Math.sqrt(gamma));
  out.outletMach = (flux * sqrtRT) / (pd * Math.sqrt(gamma));
  out.inletPressure = p1;
  out.outletPressure = pd;
  out.frictionFactor = friction.factor;
  out.reynolds = reynolds;
  // Implicit derivatives of Q(G; p1, T, pd) = 0.
  const xTotal = friction.value + 2 * logPressureRatio;
  const qG = 2 * flux * rt * xTotal + flux * rt * friction.slope * reynolds;
  const qP1 = flux * flux * rt * (2 / p1) - 2 * p1;
  const qPd = flux * flux * rt * (-2 / pd) + 2 * pd;
  const qT = flux * flux * r * xTotal + flux * flux * rt * friction.slope * reynolds * -muSlope;
  const dFluxdP1 = -qP1 / qG;
  const dFluxdPd = -qPd / qG;
  const dFluxdT = -qT / qG;
  out.dMassFlowdUpstreamPressure = dFluxdP1 * area;
  out.dMassFlowdUpstreamTemperature = dFluxdT * area;
  out.dMassFlowdDownstreamPressure = dFluxdPd * area;
  // Arrival stagnation temperature T (1 + (gamma-1)/2 M2^2), M2 = G sqrt(RT) / (pd sqrt(gamma)).
  const m2 = out.outletMach;
  const factor = 1 + half * m2 * m2;
  const dTa_dLogM = 2 * t * half * m2 * m2;
  out.arrivalTemperature = t * factor;
  out.dArrivalTemperaturedUpstreamPressure = dTa_dLogM * (dFluxdP1 / flux);
  out.dArrivalTemperaturedUpstreamTemperature = factor + dTa_dLogM * (dFluxdT / flux + 0.5 / t);
  out.dArrivalTemperaturedDownstreamPressure = dTa_dLogM * (dFluxdPd / flux - 1 / pd);
}

/** r = p2* / p1 of an isothermal pipe at its capacity: r^2 (X(Re) + 1 - 2 ln r) = 1. */
function isothermalCapacityRatio(
  pipe: PipeGeometry,
  p1: number,
  sqrtRT: number,
  reynoldsPerFlux: number,
  guess: number,
  friction: FrictionScratch,
): number {
  let ratio = guess > 0 && guess < 1 ? guess : 0.5;
  let lo = 0;
  let hi = 1;
  for (let iteration = 0; iteration < 100; iteration++) {
    const flux = (p1 * ratio) / sqrtRT;
    const reynolds = flux * reynoldsPerFlux;
    frictionParameter(pipe, reynolds, friction);
    const value = ratio * ratio * (friction.value + 1 - 2 * Math.log(ratio)) - 1;
    if (Math.abs(value) <= 1e-14) break;
    if (value > 0) hi = ratio;
    else lo = ratio;
    // d/dr with X(Re(r)): 2r(X - 2 ln r) + r^2 X_Re Re / r
    const slope =
      2 * ratio * (friction.value - 2 * Math.log(ratio)) + ratio * friction.slope * reynolds;
    let next = ratio - value / slope;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    const change = Math.abs(next - ratio);
    ratio = next;
    if (change <= 1e-14) break;
  }
  return ratio;
}

/**
 * Mass flux G of an isothermal pipe for a pressure pair, by safeguarded Newton on
 * Q(G) = G^2 R T (X(Re) + 2 ln(p1/pd)) - (p1^2 - pd^2), which rises with G, in (0, upper).
 */
function isothermalFlux(
  pipe: PipeGeometry,
  rt: number,
  reynoldsPerFlux: number,
  logPressureRatio: number,
  pressureSquares: number,
  upper: number,
  out: PipeFlowEvaluation,
): number {
  const friction = out.friction;
  let flux = out.lastInletMach; // stores G for this model
  let fluxLo = 0;
  let fluxHi = upper;
  if (!(flux > 0 && flux < fluxHi)) {
    const guessReynolds = Number.isFinite(upper) ? 0.5 * upper * reynoldsPerFlux : 1e5;
    frictionParameter(pipe, Math.max(guessReynolds, 1), friction);
    flux = Math.sqrt(pressureSquares / (rt * (friction.value + 2 * logPressureRatio)));
    if (Number.isFinite(upper)) flux = Math.min(0.9 * upper, flux);
  }
  for (let iteration = 0; iteration < 100; iteration++) {
    const reynolds = flux * reynoldsPerFlux;
    frictionParameter(pipe, reynolds, friction);
    // Newton in ln G on ln(G^2 R T (X + 2 ln(p1/pd))) - ln(p1^2 - pd^2), nearly linear.
    const total = friction.value + 2 * logPressureRatio;
    const q = Math.log((flux * flux * rt * total) / pressureSquares);
    if (Math.abs(q) <= 1e-14) break;
    if (q > 0) fluxHi = flux;
    else fluxLo = flux;
    const slope = 2 + (friction.slope * reynolds) / total; // dq / d ln G
    let next = flux * Math.exp(-q / slope);
    if (!(next > fluxLo && next < fluxHi)) {
      next = Number.isFinite(fluxHi) ? 0.5 * (fluxLo + fluxHi) : 2 * Math.max(flux, fluxLo);
    }
    const change = Math.abs(next - flux);
    flux = next;
    if (change <= 1e-13 * flux) break;
  }
  return flux;
}
