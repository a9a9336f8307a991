/**
 * One pipe between two plenums: the building block of the network solver, usable on its own.
 *
 * - {@link pipeFlow}: upstream stagnation state and downstream static pressure -> mass flow,
 *   choke, and the full inlet and outlet states.
 * - {@link pipeOutlet}: upstream stagnation state and mass flow -> outlet state, or, when that
 *   flow cannot pass, a result that says so and gives the capacity (the choked mass flow).
 *
 * Both for the adiabatic (Fanno) and the isothermal model; equations in docs/model.md.
 */
import { gasViscosity, gasViscosityLogSlope } from "../gas/gas.js";
import type { Gas } from "../gas/gas-types.js";
import { gasState, isPerfectGas, temperatureFromEnthalpy } from "../gas/thermo.js";
import { fannoParameter, fannoPressureRatio, machFromFannoParameter } from "./fanno.js";
import { darcyFrictionFactor } from "./friction.js";
import { heatTransferOutlet } from "./heat-transfer-pipe.js";
import {
  isentropicPressureRatio,
  isentropicTemperatureRatio,
  machFromMassFluxParameter,
  maxMassFluxParameter,
} from "./isentropic.js";
import {
  evaluatePipeFlow,
  frictionParameter as frictionParameterOf,
  PipeFlowEvaluation,
  type PipeGas,
  type PipeGeometry,
  type PipeModel,
} from "./pipe-flow.js";
import { realGasIsothermalOutlet } from "./real-gas-pipe.js";

/** A pipe in SI units. */
export interface Pipe {
  /** [m], > 0 */
  length: number;
  /** Inside diameter [m], > 0. */
  diameter: number;
  /** Absolute roughness [m] for Colebrook-White. @defaultValue 5e-5 (carbon steel) */
  roughness?: number;
  /** A fixed Darcy friction factor [-] instead of the roughness. */
  frictionFactor?: number;
  /** Sum of minor-loss coefficients K [-]. @defaultValue 0 */
  minorLoss?: number;
  /** @defaultValue "adiabatic" */
  model?: PipeModel;
  /**
   * Heat-transfer model: overall heat-transfer coefficient per unit length U' [W/(m K)]; or give
   * `heatTransferPerArea`. @defaultValue 0 (no heat exchange)
   */
  heatTransferPerLength?: number;
  /** Heat-transfer model: overall heat-transfer coefficient per inside wall area U [W/(m2 K)];
   * U' = U pi D. */
  heatTransferPerArea?: number;
  /** Heat-transfer model: temperature of the surroundings [K]. @defaultValue 293.15 */
  surroundingTemperature?: number;
  /** Heat-transfer model: elevation of the outlet minus the inlet [m]. @defaultValue 0 */
  rise?: number;
}

/** The state of the gas at one end of a pipe (just inside it), all SI. */
export interface PipeEndState {
  /** Static pressure [Pa]. */
  pressure: number;
  /** Stagnation pressure [Pa]. */
  stagnationPressure: number;
  /** Static temperature [K]. */
  temperature: number;
  /** Stagnation temperature [K]. */
  stagnationTemperature: number;
  /** [kg/m3] */
  density: number;
  /** Magnitude [m/s]. */
  velocity: number;
  /** [-] */
  mach: number;
}

/** Flow through one pipe. */
export interface PipeFlowResult {
  /** [kg/s], >= 0, from the upstream to the downstream plenum. */
  massFlow: number;
  /** Exit sonic (Mach 1 adiabatic, 1/sqrt(gamma) isothermal). */
  choked: boolean;
  /** Largest flow for this upstream state [kg/s]. */
  capacity: number;
  /** massFlow / capacity [-]. */
  chokeRatio: number;
  reynolds: number;
  /** Darcy friction factor [-]. */
  frictionFactor: number;
  inlet: PipeEndState;
  outlet: PipeEndState;
  /**
   * Heat flow into the gas over the pipe [W], negative when the gas loses heat: the integral of
   * U'(Ts - T) for the heat-transfer model; m cp (T0 out - T0 in) implied by the isothermal model;
   * 0 for the adiabatic one.
   */
  heatFlow: number;
}

/** The upstream plenum: gas at rest. */
export interface PlenumState {
  /** Stagnation pressure [Pa absolute]. */
  pressure: number;
  /** Stagnation temperature [K]. */
  temperature: number;
}

/** Default absolute roughness of a bare pipe [m]: carbon steel, NORSOK P-001 section 5.2.2. */
const DEFAULT_PIPE_ROUGHNESS = 5e-5;

/** Geometry record of the kernel for a public pipe. */
export function pipeGeometry(pipe: Pipe): PipeGeometry {
  return {
    length: pipe.length,
    diameter: pipe.diameter,
    roughness: pipe.roughness ?? DEFAULT_PIPE_ROUGHNESS,
    fixedFrictionFactor: pipe.frictionFactor ?? Number.NaN,
    minorLoss: pipe.minorLoss ?? 0,
    model: pipe.model ?? "adiabatic",
    heatTransferPerLength:
      pipe.heatTransferPerLength ?? (pipe.heatTransferPerArea ?? 0) * Math.PI * pipe.diameter,
    surroundingTemperature: pipe.surroundingTemperature ?? DEFAULT_SURROUNDING_TEMPERATURE,
    rise: pipe.rise ?? 0,
  };
}

/** Default surrounding temperature of a single pipe [K]: 20 degC, as the network's ambient. */
const DEFAULT_SURROUNDING_TEMPERATURE = 293.15;

/** The kernel's view of a gas. */
export function pipeGas(gas: Gas): PipeGas {
  return {
    specificGasConstant: gas.specificGasConstant,
    heatCapacityRatio: gas.heatCapacityRatio,
    viscosity: (temperature: number) => gasViscosity(gas, temperature),
    viscosityLogSlope: (temperature: number) => gasViscosityLogSlope(gas, temperature),
    gas,
  };
}

function checkPipe(pipe: Pipe, upstream: PlenumState): void {
  const problems: string[] = [];
  if (!(pipe.length > 0 && Number.isFinite(pipe.length)))
    problems.push(`length must be > 0 m (got ${pipe.length})`);
  if (!(pipe.diameter > 0 && Number.isFinite(pipe.diameter)))
    problems.push(`diameter must be > 0 m (got ${pipe.diameter})`);
  if (pipe.roughness !== undefined && !(pipe.roughness >= 0))
    problems.push(`roughness must be >= 0 m (got ${pipe.roughness})`);
  if (pipe.frictionFactor !== undefined && !(pipe.frictionFactor > 0))
    problems.push(`frictionFactor must be > 0 (got ${pipe.frictionFactor})`);
  if (pipe.minorLoss !== undefined && !(pipe.minorLoss >= 0))
    problems.push(`minorLoss must be >= 0 (got ${pipe.minorLoss})`);
  if (pipe.heatTransferPerLength !== undefined && !(pipe.heatTransferPerLength >= 0))
    problems.push(`heatTransferPerLength must be >= 0 W/(m K) (got ${pipe.heatTransferPerLength})`);
  if (pipe.heatTransferPerArea !== undefined && !(pipe.heatTransferPerArea >= 0))
    problems.push(`heatTransferPerArea must be >= 0 W/(m2 K) (got ${pipe.heatTransferPerArea})`);
  if (pipe.heatTransferPerLength !== undefined && pipe.heatTransferPerArea !== undefined)
    problems.push("give heatTransferPerLength or heatTransferPerArea, not both");
  if (pipe.surroundingTemperature !== undefined && !(pipe.surroundingTemperature > 0))
    problems.push(`surroundingTemperature must be > 0 K (got ${pipe.surroundingTemperature})`);
  if (pipe.rise !== undefined && !(Math.abs(pipe.rise) <= pipe.length))
    problems.push(`rise must be a number no larger than the length (got ${pipe.rise})`);
  if ((pipe.model ?? "adiabatic") !== "heat-transfer" && (pipe.rise ?? 0) !== 0)
    problems.push('a rise needs model "heat-transfer" (the closed-form models have no gravity)');
  if (!(upstream.pressure > 0 && Number.isFinite(upstream.pressure)))
    problems.push(`upstream pressure must be > 0 Pa (got ${upstream.pressure})`);
  if (!(upstream.temperature > 0 && Number.isFinite(upstream.temperature)))
    problems.push(`upstream temperature must be > 0 K (got ${upstream.temperature})`);
  if (problems.length > 0) throw new RangeError(problems.join("; "));
}

/**
 * End states from the kernel's Mach numbers and pressures.
 * Adiabatic: T0 constant; T = T0 / (1 + (gamma-1)/2 M^2); p0 = p (T0/T)^(gamma/(gamma-1)).
 * Isothermal: static T constant at the upstream plenum temperature.
 * Heat-transfer: static T from the integration (inlet and outlet), T0 = T (1 + (gamma-1)/2 M^2).
 * Heat-transfer with cp(T) or a real gas (the gas carries `heatCapacity` or `equationOfState`):
 * rho and the speed of sound a from src/gas/thermo.ts at (p, T), v = M a, the stagnation
 * pressure p0 = p (1 + (kappa-1)/2 M^2)^(kappa/(kappa-1)) with the local isentropic exponent
 * kappa = rho a^2 / p (exact for a perfect gas, within O(M^4) otherwise; p + rho v^2/2 if
 * kappa <= 1), and T0 from h(T0, p0) = h(T, p) + v^2/2. The same for every model and component
 * with such a gas: the static temperature is then the integrated one (heat-transfer, and
 * adiabatic, which is integrated with such a gas), T0 for the isothermal model, and for a
 * component the one its evaluation gives (src/physics/components/real-gas-component.ts).
 */
export function endStatesOf(
  gas: PipeGas,
  model: PipeModel,
  upstreamTemperature: number,
  evaluation: PipeFlowEvaluation,
): { inlet: PipeEndState; outlet: PipeEndState } {
  const gamma = gas.heatCapacityRatio;
  const r = gas.specificGasConstant;
  const perfect = isPerfectGas(gas.gas);
  const state = (pressure: number, mach: number, integrated: number): PipeEndState => {
    if (model === "adiabatic" && perfect) {
      const temperature = upstreamTemperature * isentropicTemperatureRatio(mach, gamma);
      return {
        pressure,
        stagnationPressure: pressure / isentropicPressureRatio(mach, gamma),
        temperature,
        stagnationTemperature: upstreamTemperature,
        density: pressure / (r * temperature),
        velocity: mach * Math.sqrt(gamma * r * temperature),
        mach,
      };
    }
    const temperature = model === "isothermal" ? upstreamTemperature : integrated;
    const thermoGas = gas.gas;
    if (!perfect) {
      const local = gasState(thermoGas, pressure, temperature);
      const velocity = mach * local.soundSpeed;
      const kinetic = 0.5 * velocity * velocity;
      const kappa = (local.density * local.soundSpeed * local.soundSpeed) / pressure;
      const stagnationPressure =
        kappa > 1
          ? pressure * (1 + 0.5 * (kappa - 1) * mach * mach) ** (kappa / (kappa - 1))
          : pressure + local.density * kinetic;
      return {
        pressure,
        stagnationPressure,
        temperature,
        stagnationTemperature: temperatureFromEnthalpy(
          thermoGas,
          local.enthalpy + kinetic,
          stagnationPressure,
        ),
        density: local.density,
        velocity,
        mach,
      };
    }
    return {
      pressure,
      stagnationPressure: pressure / isentropicPressureRatio(mach, gamma),
      temperature,
      stagnationTemperature: temperature / isentropicTemperatureRatio(mach, gamma),
      density: pressure / (r * temperature),
      velocity: mach * Math.sqrt(gamma * r * temperature),
      mach,
    };
  };
  return {
    inlet: state(evaluation.inletPressure, evaluation.inletMach, evaluation.inletTemperature),
    outlet: state(evaluation.outletPressure, evaluation.outletMach, evaluation.outletTemperature),
  };
}

/**
 * Mass flow through a pipe from a plenum at (p0, T0) into a plenum at static pressure pd.
 *
 * Adiabatic: isentropic entrance, Fanno flow over fD L/D + K, exit pressure pd while subsonic;
 * when pd is at or below the sonic exit pressure p*, the pipe is choked: exit Mach 1 and the
 * capacity flow, whatever pd. Isothermal: inlet static pressure p0 and static temperature T0,
 * m^2 = A^2 (p1^2 - p2^2) / (R T (fD L/D + K + 2 ln(p1/p2))), choked at exit Mach 1/sqrt(gamma).
 *
 * @param gas - the gas
 * @param pipe - the pipe (SI)
 * @param upstream - stagnation state of the upstream plenum [Pa, K]
 * @param downstreamPressure - static pressure of the downstream plenum [Pa], <= upstream
 * @returns flow, choke and end states; with pd > p0 a RangeError (flow would run the other way)
 * @example
 * // Air from 7 bar(a), 20 degC through 50 m of 52.5 mm pipe to 6.5 bar(a): about 0.98 kg/s
 * // (checked against python3-fluids in test/physics/pipe.test.ts)
 * pipeFlow(gasPreset("air"), { length: 50, diameter: 0.0525, roughness: 4.5e-5 },
 *   { pressure: 7e5, temperature: 293.15 }, 6.5e5).massFlow
 */
export function pipeFlow(
  gas: Gas,
  pipe: Pipe,
  upstream: PlenumState,
  downstreamPressure: number,
): PipeFlowResult {
  checkPipe(pipe, upstream);
  if (!(downstreamPressure > 0))
    throw new RangeError(`downstream pressure must be > 0 Pa (got ${downstreamPressure})`);
  if (downstreamPressure > upstream.pressure) {
    throw new RangeError(
      `downstream pressure ${downstreamPressure} Pa is above the upstream pressure ${upstream.pressure} Pa; swap the ends`,
    );
  }
  const geometry = pipeGeometry(pipe);
  const kernelGas = pipeGas(gas);
  const evaluation = evaluatePipeFlow(
    geometry,
    kernelGas,
    upstream.pressure,
    upstream.temperature,
    downstreamPressure,
    new PipeFlowEvaluation(),
  );
  const ends = endStatesOf(kernelGas, geometry.model, upstream.temperature, evaluation);
  return {
    massFlow: evaluation.massFlow,
    choked: evaluation.choked,
    capacity: evaluation.capacity,
    chokeRatio: evaluation.capacity > 0 ? evaluation.massFlow / evaluation.capacity : 0,
    reynolds: evaluation.reynolds,
    frictionFactor: evaluation.frictionFactor,
    inlet: ends.inlet,
    outlet: ends.outlet,
    heatFlow: heatFlowOf(
      gas,
      geometry,
      upstream.temperature,
      evaluation,
      ends.outlet.stagnationTemperature,
    ),
  };
}

/** Heat into the gas of an evaluated pipe [W] (see {@link PipeFlowResult.heatFlow}). */
export function heatFlowOf(
  gas: Gas,
  geometry: PipeGeometry,
  upstreamTemperature: number,
  evaluation: PipeFlowEvaluation,
  outletStagnationTemperature: number,
): number {
  if (geometry.model === "heat-transfer") return evaluation.heatFlow;
  if (geometry.model === "adiabatic") return 0;
  // Isothermal with cp(T) or a real gas: the relation's own m (h2 + v2^2/2 - h1).
  if (!isPerfectGas(gas)) return evaluation.heatFlow;
  return (
    evaluation.massFlow * gas.specificHeatCp * (outletStagnationTemperature - upstreamTemperature)
  );
}

/** Result of {@link pipeOutlet}. */
export type PipeOutletResult =
  | { ok: true; flow: PipeFlowResult }
  | {
      ok: false;
      reason: "over-capacity";
      /** Largest flow that passes for this upstream state [kg/s]. */
      capacity: number;
      /** Exit static pressure when the capacity flows (the sonic exit pressure) [Pa]. */
      chokedOutletPressure: number;
      message: string;
    };

/**
 * The inverse of {@link pipeFlow}: the outlet state for a given mass flow from a plenum at
 * (p0, T0). When the flow exceeds the pipe's capacity, says so and gives the capacity.
 *
 * Adiabatic: G = m/A; inlet Mach from G sqrt(R T0)/p0 on the subsonic branch; Re = G D / mu(T0);
 * exit Mach from F(M2) = F(M1) - (fD L/D + K); p2 = p1 (p/p*)(M2) / (p/p*)(M1).
 * Isothermal: p2 from G^2 R T (X + 2 ln(p1/p2)) = p1^2 - p2^2 on the subsonic branch.
 *
 * @example
 * pipeOutlet(gasPreset("air"), { length: 50, diameter: 0.0525 }, { pressure: 7e5, temperature: 293.15 }, 0.5)
 */
export function pipeOutlet(
  gas: Gas,
  pipe: Pipe,
  upstream: PlenumState,
  massFlow: number,
): PipeOutletResult {
  checkPipe(pipe, upstream);
  if (!(massFlow >= 0 && Number.isFinite(massFlow))) {
    throw new RangeError(`mass flow must be >= 0 kg/s (got ${massFlow})`);
  }
  const geometry = pipeGeometry(pipe);
  const kernelGas = pipeGas(gas);
  const p0 = upstream.pressure;
  const t0 = upstream.temperature;
  // Capacity and choked exit pressure from the forward kernel at a vanishing back-pressure.
  const capacityEvaluation = evaluatePipeFlow(
    geometry,
    kernelGas,
    p0,
    t0,
    p0 * 1e-9,
    new PipeFlowEvaluation(),
  );
  const capacity = capacityEvaluation.capacity;
  const overCapacity = (): PipeOutletResult => ({
    ok: false,
    reason: "over-capacity",
    capacity,
    chokedOutletPressure: capacityEvaluation.outletPressure,
    message: `a flow of ${massFlow} kg/s cannot pass: the pipe chokes at ${capacity.toPrecision(6)} kg/s for this upstream state (exit pressure then ${capacityEvaluation.outletPressure.toPrecision(6)} Pa)`,
  });
  if (massFlow > capacity * (1 + 1e-12)) return overCapacity();

  let evaluation = new PipeFlowEvaluation();
  if (!outletForMassFlow(geometry, gas, p0, t0, massFlow, evaluation)) return overCapacity();
  if (!isPerfectGas(gas) && massFlow > 0) {
    // cp(T) or a real gas: the forward relation at the exit pressure found fills the arrival,
    // heat and end states of the same flow consistently.
    evaluation = evaluatePipeFlow(
      geometry,
      kernelGas,
      p0,
      t0,
      evaluation.outletPressure,
      new PipeFlowEvaluation(),
    );
  }
  evaluation.capacity = capacity;
  const { reynolds, frictionFactor } = evaluation;
  const ends = endStatesOf(kernelGas, geometry.model, t0, evaluation);
  return {
    ok: true,
    flow: {
      massFlow,
      choked: evaluation.choked,
      capacity,
      chokeRatio: capacity > 0 ? massFlow / capacity : 0,
      reynolds,
      frictionFactor,
      inlet: ends.inlet,
      outlet: ends.outlet,
      heatFlow: heatFlowOf(gas, geometry, t0, evaluation, ends.outlet.stagnationTemperature),
    },
  };
}

/**
 * The outlet state for a given mass flow from a plenum at (p0, T0), written into `evaluation`
 * (massFlow, inlet and outlet pressures and Mach numbers, Re, fD, choked). Returns false when the
 * flow cannot pass (above the pipe's capacity). Internal: no argument checks, no capacity solve;
 * the solver's independent check of exit pressures uses it directly.
 */
export function outletForMassFlow(
  geometry: PipeGeometry,
  gas: Gas,
  p0: number,
  t0: number,
  massFlow: number,
  evaluation: PipeFlowEvaluation,
  forward = true,
): boolean {
  const perfect = isPerfectGas(gas);
  if (
    (geometry.model === "heat-transfer" || (geometry.model === "adiabatic" && !perfect)) &&
    massFlow > 0
  ) {
    const rise = geometry.rise ?? 0;
    return heatTransferOutlet(
      geometry,
      gas,
      (temperature) => gasViscosity(gas, temperature),
      frictionParameterOf,
      p0,
      t0,
      massFlow,
      forward ? rise : -rise,
      evaluation,
    );
  }
  if (geometry.model === "isothermal" && gas.equationOfState !== undefined) {
    return realGasIsothermalOutlet(
      geometry,
      gas,
      (temperature) => gasViscosity(gas, temperature),
      frictionParameterOf,
      p0,
      t0,
      massFlow,
      evaluation,
    );
  }
  const gamma = gas.heatCapacityRatio;
  const r = gas.specificGasConstant;
  const area = 0.25 * Math.PI * geometry.diameter * geometry.diameter;
  const flux = massFlow / area;
  const mu = gasViscosity(gas, t0);
  const reynolds = (flux * geometry.diameter) / mu;
  const frictionFactor = Number.isNaN(geometry.fixedFrictionFactor)
    ? darcyFrictionFactor(reynolds, geometry.roughness / geometry.diameter)
    : Math.max(
        geometry.fixedFrictionFactor,
        reynolds > 0 ? 64 / reynolds : Number.POSITIVE_INFINITY,
      );
  const frictionParameter =
    frictionFactor * (geometry.length / geometry.diameter) + geometry.minorLoss;
  evaluation.massFlow = massFlow;
  evaluation.reynolds = reynolds;
  evaluation.frictionFactor = frictionFactor;

  if (massFlow === 0) {
    evaluation.inletPressure = p0;
    evaluation.outletPressure = p0;
  } else if (geometry.model === "adiabatic") {
    const parameter = (flux * Math.sqrt(r * t0)) / p0;
    if (parameter > maxMassFluxParameter(gamma)) return false;
    const inletMach = machFromMassFluxParameter(parameter, gamma, "subsonic");
    const remaining = fannoParameter(inletMach, gamma) - frictionParameter;
    if (remaining < 0) {
      if (remaining < -1e-9 * frictionParameter) return false;
    }
    const outletMach = remaining <= 0 ? 1 : machFromFannoParameter(remaining, gamma, "subsonic");
    const inletPressure = p0 * isentropicPressureRatio(inletMach, gamma);
    evaluation.inletMach = inletMach;
    evaluation.outletMach = outletMach;
    evaluation.inletPressure = inletPressure;
    evaluation.outletPressure =
      (inletPressure * fannoPressureRatio(outletMach, gamma)) /
      fannoPressureRatio(inletMach, gamma);
    evaluation.choked = outletMach >= 1;
  } else {
    // Isothermal: bisection-safeguarded Newton on p2 in [G sqrt(RT), p1].
    const rt = r * t0;
    const lowest = flux * Math.sqrt(rt); // exit Mach 1/sqrt(gamma)
    const h = (p2: number) =>
      flux * flux * rt * (frictionParameter + 2 * Math.log(p0 / p2)) - (p0 * p0 - p2 * p2);
    if (h(lowest) > 0) return false;
    let lo = lowest;
    let hi = p0;
    let p2 = 0.5 * (lo + hi);
    for (let iteration = 0; iteration < 200; iteration++) {
      const value = h(p2);
      if (value === 0) break;
      // h rises with p2 on the subsonic branch: a positive h means p2 is too high.
      if (value > 0) hi = p2;
      else lo = p2;
      const slope = (-2 * flux * flux * rt) / p2 + 2 * p2;
      let next = p2 - value / slope;
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
      if (Math.abs(next - p2) <= 1e-15 * p0) {
        p2 = next;
        break;
      }
      p2 = next;
    }
    evaluation.inletPressure = p0;
    evaluation.outletPressure = p2;
    evaluation.inletMach = (flux * Math.sqrt(rt)) / (p0 * Math.sqrt(gamma));
    evaluation.outletMach = (flux * Math.sqrt(rt)) / (p2 * Math.sqrt(gamma));
    evaluation.choked = Math.abs(p2 - lowest) <= 1e-9 * p0;
  }
  return true;
}
