/**
 * The closed-form pipe models with a gas that is not calorically perfect (the gas carries NASA
 * cp(T) data, `heatCapacity`, or the Peng-Robinson equation of state, `equationOfState`):
 * docs/model.md, "Pipe models with cp(T) and a real gas".
 *
 * - Adiabatic: Fanno's closed form holds for a perfect gas only; such a pipe is evaluated by the
 *   heat-transfer integrator with no heat exchange (src/physics/heat-transfer-pipe.ts), which
 *   conserves stagnation enthalpy h + v^2/2 with every property from src/gas/thermo.ts. The
 *   dispatch in src/physics/pipe-flow.ts does that; nothing of it is here.
 * - Isothermal with an ideal gas and cp(T): the flow is the perfect gas's (it depends on
 *   p, rho = p/(R T) and T only); the stagnation enthalpy arriving is h(T) + v2^2/2 with the
 *   polynomial h, and the heat the pipe takes in is m v2^2/2 ({@link applyCaloricIsothermal}).
 * - Isothermal with Peng-Robinson: the momentum balance integrated along the isotherm with
 *   rho(p, T) from the equation of state ({@link evaluateRealGasIsothermal}).
 *
 * Pure functions of numbers and reusable records; no allocation per call once a pipe's
 * {@link RealGasScratch} exists.
 * @module
 */
import type { Gas } from "../gas/gas-types.js";
import { emptyPengRobinsonValues } from "../gas/peng-robinson.js";
import { emptyThermoState, gasState, type ThermoState } from "../gas/thermo.js";
import { setArrival } from "./heat-transfer-pipe.js";
import type { FrictionScratch, PipeFlowEvaluation, PipeGas, PipeGeometry } from "./pipe-flow.js";

/** The friction law X = fD L/D + K and dX/dRe at a Reynolds number (pipe-flow.ts passes it). */
export type FrictionLaw = (pipe: PipeGeometry, reynolds: number, out: FrictionScratch) => void;

/** Abscissae and weights of 8-point Gauss-Legendre quadrature on [-1, 1] (numpy leggauss). */
const GAUSS_NODES = [
  -0.9602898564975362, -0.7966664774136267, -0.525532409916329, -0.18343464249564978,
  0.18343464249564978, 0.525532409916329, 0.7966664774136267, 0.9602898564975362,
];
const GAUSS_WEIGHTS = [
  0.10122853629037669, 0.22238103445337434, 0.31370664587788705, 0.36268378337836177,
  0.36268378337836177, 0.31370664587788705, 0.22238103445337434, 0.10122853629037669,
];

/** Relative step of the central differences of the capacity (choked derivatives). */
const CAPACITY_STEP = 1e-5;

/** Exit velocity over the isothermal sound speed above which the capacity is solved. */
const NEAR_CHOKE = 0.999;

/** Work space of the real-gas relations of one edge, made on first use and kept in its record. */
export class RealGasScratch {
  /** States for the relations' own use (the plenum, the exit, the quadrature nodes). */
  readonly inlet: ThermoState = emptyThermoState();
  readonly exit: ThermoState = emptyThermoState();
  readonly node: ThermoState = emptyThermoState();
  readonly equationOfState = emptyPengRobinsonValues();
  /** Results of {@link isothermIntegrals}: integral of rho dp and of (d rho/d T)_p dp. */
  densityIntegral = 0;
  densitySlopeIntegral = 0;
  /** Results of {@link chokedState}: G* [kg/(m2 s)], p2* [Pa], h + v^2/2 at the exit [J/kg]. */
  chokedFlux = 0;
  chokedExitPressure = 0;
  chokedExitEnthalpy = 0;
  /** The ideal gas's d phi / d ln r at the last {@link chokedResidual} (a Newton slope). */
  chokedSlope = 0;
  chokedFriction: FrictionScratch = {
    value: 0,
    slope: 0,
    factor: 0,
    colebrook: { factor: 0, logSlope: 0 },
  };
  /** Components: a second evaluation record and a gas record for the perfect-gas forms. */
  component: unknown = undefined;
}

/** The real-gas scratch of an evaluation record (made on first use, then reused). */
export function realGasScratchOf(out: PipeFlowEvaluation): RealGasScratch {
  if (out.realGas === undefined) out.realGas = new RealGasScratch();
  return out.realGas;
}

/**
 * The integrals of rho and of (d rho / d T)_p over pressure along an isotherm, from p2 to
 * p1 = p2 + drop, into scratch.densityIntegral [Pa kg/m3] and
 * scratch.densitySlopeIntegral [Pa kg/(m3 K)].
 *
 * The ideal-gas part p / (Z=1 R T) is integrated exactly, (p1^2 - p2^2) / (2 R T) =
 * drop (p1 + p2) / (2 R T); the departure rho - p/(R T) by 8-point Gauss-Legendre quadrature,
 * exact for a departure polynomial of degree 15 in p. So a gas that is nearly ideal (low
 * pressure) has the ideal relation to rounding, and the quadrature error scales with the
 * departure (below 1e-12 of it for methane and nitrogen up to 100 bar: test/physics/
 * real-gas-pipe.test.ts compares with 16 nodes). `drop` is passed apart from p2 so that a small
 * drop keeps its digits.
 */
export function isothermIntegrals(
  gas: Gas,
  p2: number,
  drop: number,
  temperature: number,
  scratch: RealGasScratch,
): void {
  const rt = gas.specificGasConstant * temperature;
  const half = 0.5 * drop;
  const middle = p2 + half;
  let departure = 0;
  let slopeDeparture = 0;
  for (let i = 0; i < GAUSS_NODES.length; i++) {
    const pressure = middle + half * (GAUSS_NODES[i] as number);
    const s = gasState(gas, pressure, temperature, scratch.node, scratch.equationOfState);
    const ideal = pressure / rt;
    const weight = GAUSS_WEIGHTS[i] as number;
    departure += weight * (s.density - ideal);
    slopeDeparture += weight * (s.densityTemperatureSlope + ideal / temperature);
  }
  const idealIntegral = (drop * (2 * p2 + drop)) / (2 * rt);
  scratch.densityIntegral = idealIntegral + half * departure;
  scratch.densitySlopeIntegral = -idealIntegral / temperature + half * slopeDeparture;
}

/**
 * The isothermal pipe with a real gas: mass flux G between the inlet at the upstream plenum's
 * pressure p1 and the exit at p2, temperature T throughout.
 *
 * Momentum per unit length of a constant-area pipe, with v = G / rho:
 *   dp/dx + G dv/dx = -(X/L) G v / 2,   X = fD L/D + K.
 * Times rho, with rho dv = -G d rho / rho:  rho dp - G^2 d(ln rho) + (X/L) G^2 / 2 dx = 0,
 * integrated from the inlet to the exit along the isotherm:
 *   integral_{p1}^{p2} rho(p, T) dp - G^2 ln(rho2 / rho1) + X G^2 / 2 = 0,
 * i.e. G^2 (X/2 + ln(rho1/rho2)) = integral_{p2}^{p1} rho dp. For an ideal gas, rho = p/(R T),
 * this is G^2 R T (X + 2 ln(p1/p2)) = p1^2 - p2^2, the relation of src/physics/isothermal.ts.
 *
 * Choke: at fixed X, dG/dp2 = 0 where G^2 = rho2^2 / (d rho/d p)_T, the exit velocity equal
 * to the isothermal sound speed ((dp/d rho)_T)^0.5 ((R T)^0.5 for an ideal gas, Mach
 * gamma^-0.5). A lower back-pressure leaves the exit there (choked).
 *
 * @param x - the friction parameter X [-]
 * @param flux - G [kg/(m2 s)]
 * @param logDensityRatio - ln(rho1 / rho2) [-], rho at (p1, T) and (p2, T) from the equation
 *   of state
 * @param integral - integral_{p2}^{p1} rho dp at T [Pa kg/m3] ({@link isothermIntegrals})
 * @returns the residual G^2 (X/2 + ln(rho1/rho2)) - integral [Pa kg/m3]; zero on the solution
 * @remarks Sources: A. H. Shapiro, The Dynamics and Thermodynamics of Compressible Fluid Flow,
 *   vol. 1, Ronald Press 1953, ch. 6 (isothermal flow with friction) and ch. 8 (the momentum
 *   equation of generalized one-dimensional flow, here with a general equation of state); the
 *   Peng-Robinson density from src/gas/peng-robinson.ts. Valid while the gas stays a gas on the
 *   isotherm (a condensing state is reported by the results' warnings).
 */
function isothermalResidual(
  x: number,
  flux: number,
  logDensityRatio: number,
  integral: number,
): number {
  return flux * flux * (0.5 * x + logDensityRatio) - integral;
}

/**
 * Evaluate an isothermal pipe with a Peng-Robinson gas from the plenum (p1, T) into the plenum at
 * pd, filling `out` as the perfect-gas isothermal model does (docs/model.md): inlet static
 * pressure p1 (the entrance velocity head is neglected), static temperature T along the pipe, the
 * relation of {@link isothermalResidual}; choked at the isothermal sound speed. The heat taken in
 * is m (h(p2, T) + v2^2/2 - h(p1, T)), with the departure enthalpy, and the arrival temperature
 * the one with that stagnation enthalpy at pd.
 */
export function evaluateRealGasIsothermal(
  pipe: PipeGeometry,
  gas: PipeGas,
  p1: number,
  t: number,
  pd: number,
  out: PipeFlowEvaluation,
  needCapacity: boolean,
  drop: number,
  frictionLaw: FrictionLaw,
): void {
  const thermoGas = gas.gas;
  const scratch = realGasScratchOf(out);
  const area = 0.25 * Math.PI * pipe.diameter * pipe.diameter;
  const mu = gas.viscosity(t);
  const muStep = 1e-6 * t;
  const muSlope = (gas.viscosity(t + muStep) - gas.viscosity(t - muStep)) / (2 * muStep) / mu;
  const reynoldsPerFlux = pipe.diameter / mu;
  const friction = out.friction;
  const inlet = gasState(thermoGas, p1, t, scratch.inlet, scratch.equationOfState);
  const rho1 = inlet.density;
  const rho1p = inlet.densityPressureSlope;
  const rho1t = inlet.densityTemperatureSlope;
  const h1 = inlet.enthalpy;
  const a1 = inlet.soundSpeed;
  out.capacity = Number.NaN;
  out.capacityKnown = false;
  out.inletPressure = p1;
  out.inletTemperature = t;
  out.outletTemperature = t;

  let chokedFlux = Number.NaN;
  let chokedExitPressure = Number.NaN;
  if (needCapacity || out.choked || !(drop > 0)) {
    solveCapacity(pipe, thermoGas, p1, t, reynoldsPerFlux, area, frictionLaw, scratch, out);
    chokedFlux = scratch.chokedFlux;
    chokedExitPressure = scratch.chokedExitPressure;
  }

  if (!(drop > 0)) {
    // At rest: the laminar (Hagen-Poiseuille) slope m = rho D^2 A (p1 - pd) / (32 mu L).
    const conductance = (rho1 * pipe.diameter * pipe.diameter * area) / (32 * mu * pipe.length);
    out.choked = false;
    out.massFlow = 0;
    out.dMassFlowdUpstreamPressure = conductance;
    out.dMassFlowdUpstreamTemperature = 0;
    out.dMassFlowdDownstreamPressure = -conductance;
    out.inletMach = 0;
    out.outletMach = 0;
    out.outletPressure = pd;
    out.reynolds = 0;
    out.frictionFactor = 0;
    out.heatFlow = 0;
    out.arrivalTemperature = t;
    out.dArrivalTemperaturedUpstreamPressure = 0;
    out.dArrivalTemperaturedUpstreamTemperature = 1;
    out.dArrivalTemperaturedDownstreamPressure = 0;
    return;
  }

  // Subsonic: the exit at pd; the integral and the exit state do not depend on G.
  let flux = Number.NaN;
  let choked = out.capacityKnown && !(pd > chokedExitPressure);
  if (!choked) {
    isothermIntegrals(thermoGas, pd, drop, t, scratch);
    const integral = scratch.densityIntegral;
    const slopeIntegral = scratch.densitySlopeIntegral;
    const exit = gasState(thermoGas, pd, t, scratch.exit, scratch.equationOfState);
    const rho2 = exit.density;
    const rho2p = exit.densityPressureSlope;
    const rho2t = exit.densityTemperatureSlope;
    const logDensityRatio = Math.log(rho1 / rho2);
    const upper = out.capacityKnown ? chokedFlux : Number.POSITIVE_INFINITY;
    flux = isothermalFlux(
      pipe,
      reynoldsPerFlux,
      logDensityRatio,
      integral,
      upper,
      frictionLaw,
      out,
    );
    if (!out.capacityKnown && !((flux * flux * rho2p) / (rho2 * rho2) < NEAR_CHOKE * NEAR_CHOKE)) {
      solveCapacity(pipe, thermoGas, p1, t, reynoldsPerFlux, area, frictionLaw, scratch, out);
      chokedFlux = scratch.chokedFlux;
      chokedExitPressure = scratch.chokedExitPressure;
      choked = !(pd > chokedExitPressure);
      if (!choked) {
        flux = isothermalFlux(
          pipe,
          reynoldsPerFlux,
          logDensityRatio,
          integral,
          chokedFlux,
          frictionLaw,
          out,
        );
      }
    }
    if (!choked) {
      // The exit state again: the capacity solve may have used the records.
      const s2 = gasState(thermoGas, pd, t, scratch.exit, scratch.equationOfState);
      const reynolds = flux * reynoldsPerFlux;
      frictionLaw(pipe, reynolds, friction);
      out.lastInletMach = flux; // stores G for this model
      out.choked = false;
      const massFlow = flux * area;
      out.massFlow = massFlow;
      const v2 = flux / rho2;
      out.inletMach = flux / rho1 / a1;
      out.outletMach = v2 / s2.soundSpeed;
      out.outletPressure = pd;
      out.frictionFactor = friction.factor;
      out.reynolds = reynolds;
      // Implicit derivatives of R(G; p1, T, pd) = G^2 (X/2 + ln(rho1/rho2)) - integral = 0.
      const g2 = flux * flux;
      const frictionTerm = friction.slope * reynolds; // dX / d ln Re
      const rG = flux * (friction.value + 2 * logDensityRatio) + 0.5 * flux * frictionTerm;
      const rP1 = (g2 * rho1p) / rho1 - rho1;
      const rPd = (-g2 * rho2p) / rho2 + rho2;
      const rT =
        g2 * (rho1t / rho1 - rho2t / rho2) - 0.5 * g2 * frictionTerm * muSlope - slopeIntegral;
      const fluxP1 = -rP1 / rG;
      const fluxPd = -rPd / rG;
      const fluxT = -rT / rG;
      out.dMassFlowdUpstreamPressure = fluxP1 * area;
      out.dMassFlowdUpstreamTemperature = fluxT * area;
      out.dMassFlowdDownstreamPressure = fluxPd * area;
      // Stagnation enthalpy at the exit H = h(pd, T) + v2^2/2, v2 = G / rho2.
      const exitEnthalpy = s2.enthalpy + 0.5 * v2 * v2;
      const hP1 = (v2 * fluxP1) / rho2;
      const hT = s2.specificHeatCp + v2 * (fluxT / rho2 - (flux * rho2t) / (rho2 * rho2));
      const hPd = s2.enthalpyPressureSlope + v2 * (fluxPd / rho2 - (flux * rho2p) / (rho2 * rho2));
      out.heatFlow = massFlow * (exitEnthalpy - h1);
      setArrival(
        thermoGas,
        exitEnthalpy,
        pd,
        scratch.exit,
        out,
        hP1,
        hT,
        hPd,
        scratch.equationOfState,
      );
      return;
    }
  }

  // Choked: the capacity flows; derivatives by central differences of capacity solves.
  const ratio = out.lastCapacityInletMach;
  const massFlow = chokedFlux * area;
  const exitEnthalpy = scratch.chokedExitEnthalpy;
  frictionLaw(pipe, chokedFlux * reynoldsPerFlux, friction);
  out.choked = true;
  out.massFlow = massFlow;
  out.capacity = massFlow;
  out.inletMach = chokedFlux / rho1 / a1;
  const s2 = gasState(thermoGas, chokedExitPressure, t, scratch.exit, scratch.equationOfState);
  out.outletMach = chokedFlux / s2.density / s2.soundSpeed;
  out.outletPressure = chokedExitPressure;
  out.frictionFactor = friction.factor;
  out.reynolds = chokedFlux * reynoldsPerFlux;
  out.heatFlow = massFlow * (exitEnthalpy - h1);
  const dp = CAPACITY_STEP * p1;
  const dt = CAPACITY_STEP * t;
  chokedState(pipe, thermoGas, p1 + dp, t, reynoldsPerFlux, ratio, frictionLaw, scratch);
  const fluxPlusP = scratch.chokedFlux;
  const enthalpyPlusP = scratch.chokedExitEnthalpy;
  chokedState(pipe, thermoGas, p1 - dp, t, reynoldsPerFlux, ratio, frictionLaw, scratch);
  const fluxMinusP = scratch.chokedFlux;
  const enthalpyMinusP = scratch.chokedExitEnthalpy;
  chokedState(
    pipe,
    thermoGas,
    p1,
    t + dt,
    pipe.diameter / gas.viscosity(t + dt),
    ratio,
    frictionLaw,
    scratch,
  );
  const fluxPlusT = scratch.chokedFlux;
  const enthalpyPlusT = scratch.chokedExitEnthalpy;
  chokedState(
    pipe,
    thermoGas,
    p1,
    t - dt,
    pipe.diameter / gas.viscosity(t - dt),
    ratio,
    frictionLaw,
    scratch,
  );
  const fluxMinusT = scratch.chokedFlux;
  const enthalpyMinusT = scratch.chokedExitEnthalpy;
  out.dMassFlowdUpstreamPressure = (area * (fluxPlusP - fluxMinusP)) / (2 * dp);
  out.dMassFlowdUpstreamTemperature = (area * (fluxPlusT - fluxMinusT)) / (2 * dt);
  out.dMassFlowdDownstreamPressure = 0;
  setArrival(
    thermoGas,
    exitEnthalpy,
    pd,
    scratch.exit,
    out,
    (enthalpyPlusP - enthalpyMinusP) / (2 * dp),
    (enthalpyPlusT - enthalpyMinusT) / (2 * dt),
    0,
    scratch.equationOfState,
  );
}

/**
 * G from G^2 (X(Re)/2 + L) = I on (0, upper) by safeguarded Newton in ln G on
 * q = ln(G^2 (X/2 + L) / I), nearly linear in ln G (slope 2 turbulent, 1 laminar).
 */
function isothermalFlux(
  pipe: PipeGeometry,
  reynoldsPerFlux: number,
  logDensityRatio: number,
  integral: number,
  upper: number,
  frictionLaw: FrictionLaw,
  out: PipeFlowEvaluation,
): number {
  const friction = out.friction;
  let flux = out.lastInletMach;
  let lo = 0;
  let hi = upper;
  if (!(flux > 0 && flux < hi)) {
    const guessReynolds = Number.isFinite(upper) ? 0.5 * upper * reynoldsPerFlux : 1e5;
    frictionLaw(pipe, Math.max(guessReynolds, 1), friction);
    flux = Math.sqrt(integral / (0.5 * friction.value + logDensityRatio));
    if (Number.isFinite(upper)) flux = Math.min(0.9 * upper, flux);
  }
  for (let iteration = 0; iteration < 100; iteration++) {
    const reynolds = flux * reynoldsPerFlux;
    frictionLaw(pipe, reynolds, friction);
    const total = 0.5 * friction.value + logDensityRatio;
    const q = Math.log((flux * flux * total) / integral);
    if (Math.abs(q) <= 1e-14) break;
    if (q > 0) hi = flux;
    else lo = flux;
    const slope = 2 + (0.5 * friction.slope * reynolds) / total;
    let next = flux * Math.exp(-q / slope);
    if (!(next > lo && next < hi)) {
      next = Number.isFinite(hi) ? 0.5 * (lo + hi) : 2 * Math.max(flux, lo);
    }
    const change = Math.abs(next - flux);
    flux = next;
    if (change <= 1e-13 * flux) break;
  }
  return flux;
}

/**
 * The choked state of a real-gas isothermal pipe from the plenum (p1, T): the exit pressure
 * ratio r = p2* / p1 at which G*(p2) = rho2 / ((d rho/d p)_T)^0.5 satisfies the pipe's relation,
 * phi(r) = ln(G*^2 (X(Re*)/2 + ln(rho1/rho2)) / integral_{p2}^{p1} rho dp) = 0 (phi rises
 * with r from -infinity to +infinity). Safeguarded secant steps in ln r (the first a Newton step
 * with the ideal-gas slope). Fills scratch.chokedFlux, chokedExitPressure and
 * chokedExitEnthalpy (h(p2*, T) + G*^2 / (2 rho2^2)); returns r.
 */
function chokedState(
  pipe: PipeGeometry,
  gas: Gas,
  p1: number,
  t: number,
  reynoldsPerFlux: number,
  guess: number,
  frictionLaw: FrictionLaw,
  scratch: RealGasScratch,
): number {
  const rho1 = gasState(gas, p1, t, scratch.inlet, scratch.equationOfState).density;
  let lo = 0;
  let hi = 1;
  let ratio = guess > 0 && guess < 1 ? guess : 0.5;
  let value = chokedResidual(pipe, gas, p1, t, rho1, reynoldsPerFlux, ratio, frictionLaw, scratch);
  let previousRatio = Number.NaN;
  let previousValue = Number.NaN;
  for (let iteration = 0; iteration < 100; iteration++) {
    if (Math.abs(value) <= 1e-14) break;
    if (value > 0) hi = ratio;
    else lo = ratio;
    let slope = scratch.chokedSlope;
    if (Number.isFinite(previousValue) && previousValue !== value) {
      slope = (value - previousValue) / Math.log(ratio / previousRatio);
    }
    let next = slope > 0 ? ratio * Math.exp(-value / slope) : Number.NaN;
    if (!(next > lo && next < hi)) next = lo > 0 ? Math.sqrt(lo * hi) : 0.5 * hi;
    const change = Math.abs(next - ratio);
    previousRatio = ratio;
    previousValue = value;
    ratio = next;
    value = chokedResidual(pipe, gas, p1, t, rho1, reynoldsPerFlux, ratio, frictionLaw, scratch);
    if (change <= 1e-14 * ratio) break;
  }
  scratch.chokedExitPressure = ratio * p1;
  return ratio;
}

/**
 * phi(r) of {@link chokedState} at r = p2/p1, leaving G*(p2), h(p2, T) + G*^2/(2 rho2^2) and
 * the ideal gas's d phi / d ln r (2 + (X_Re Re - 1)/(X/2 + L) + rho2 p2 / integral) in
 * `scratch`.
 */
function chokedResidual(
  pipe: PipeGeometry,
  gas: Gas,
  p1: number,
  t: number,
  rho1: number,
  reynoldsPerFlux: number,
  ratio: number,
  frictionLaw: FrictionLaw,
  scratch: RealGasScratch,
): number {
  const friction = scratch.chokedFriction;
  const p2 = ratio * p1;
  const exit = gasState(gas, p2, t, scratch.exit, scratch.equationOfState);
  const rho2 = exit.density;
  const chokedFlux = rho2 / Math.sqrt(exit.densityPressureSlope);
  scratch.chokedFlux = chokedFlux;
  scratch.chokedExitEnthalpy = exit.enthalpy + (0.5 * chokedFlux * chokedFlux) / (rho2 * rho2);
  const reynolds = chokedFlux * reynoldsPerFlux;
  frictionLaw(pipe, reynolds, friction);
  const total = 0.5 * friction.value + Math.log(rho1 / rho2);
  isothermIntegrals(gas, p2, p1 * (1 - ratio), t, scratch);
  const integral = scratch.densityIntegral;
  scratch.chokedSlope = 2 + (friction.slope * reynolds - 1) / total + (rho2 * p2) / integral;
  return Math.log((chokedFlux * chokedFlux * total) / integral);
}

/** Solve the capacity of a real-gas isothermal pipe into `scratch` and `out` (p2* / p1 kept). */
function solveCapacity(
  pipe: PipeGeometry,
  gas: Gas,
  p1: number,
  t: number,
  reynoldsPerFlux: number,
  area: number,
  frictionLaw: FrictionLaw,
  scratch: RealGasScratch,
  out: PipeFlowEvaluation,
): void {
  // lastCapacityInletMach stores p2*/p1 for this model.
  out.lastCapacityInletMach = chokedState(
    pipe,
    gas,
    p1,
    t,
    reynoldsPerFlux,
    out.lastCapacityInletMach,
    frictionLaw,
    scratch,
  );
  out.capacity = scratch.chokedFlux * area;
  out.capacityKnown = true;
}

/**
 * The inverse for the independent check: the exit pressure of a real-gas isothermal pipe
 * carrying `massFlow` from the plenum (p1, T), into out.outletPressure (and the Mach numbers);
 * false when the flow cannot pass (the exit would pass the isothermal sound speed). Newton on
 * p2 for R(p2) = G^2 (X/2 + ln(rho1/rho2)) - integral_{p2}^{p1} rho dp, which rises with p2 on
 * the subsonic branch (dR/dp2 = rho2 (1 - v2^2 (d rho/d p)_T)), safeguarded by bisection.
 */
export function realGasIsothermalOutlet(
  pipe: PipeGeometry,
  gas: Gas,
  viscosity: (temperature: number) => number,
  frictionLaw: FrictionLaw,
  p1: number,
  t: number,
  massFlow: number,
  out: PipeFlowEvaluation,
): boolean {
  const scratch = realGasScratchOf(out);
  const area = 0.25 * Math.PI * pipe.diameter * pipe.diameter;
  const flux = massFlow / area;
  const reynolds = (flux * pipe.diameter) / viscosity(t);
  frictionLaw(pipe, reynolds, out.friction);
  const x = out.friction.value;
  const inlet = gasState(gas, p1, t, scratch.inlet, scratch.equationOfState);
  const rho1 = inlet.density;
  const a1 = inlet.soundSpeed;
  out.massFlow = massFlow;
  out.reynolds = reynolds;
  out.frictionFactor = out.friction.factor;
  out.inletPressure = p1;
  out.inletTemperature = t;
  out.outletTemperature = t;
  out.inletMach = flux / rho1 / a1;
  out.choked = false;
  if (!(massFlow > 0)) {
    out.outletPressure = p1;
    out.outletMach = 0;
    return true;
  }
  let lo = 0;
  let hi = p1;
  // Start from the ideal-gas relation with the inlet's Z R T, at most halfway down.
  const zrt = p1 / rho1;
  let p2 = p1 * Math.sqrt(Math.max(1 - (flux * flux * zrt * x) / (p1 * p1), 0.25));
  for (let iteration = 0; iteration < 200; iteration++) {
    const exit = gasState(gas, p2, t, scratch.exit, scratch.equationOfState);
    const rho2 = exit.density;
    const slope = rho2 - (flux * flux * exit.densityPressureSlope) / rho2;
    let next: number;
    if (!(slope > 0)) {
      lo = p2; // at or beyond the isothermal sound speed: the subsonic root lies above
      next = 0.5 * (lo + hi);
    } else {
      isothermIntegrals(gas, p2, p1 - p2, t, scratch);
      const value = isothermalResidual(x, flux, Math.log(rho1 / rho2), scratch.densityIntegral);
      if (value > 0) hi = p2;
      else lo = p2;
      next = p2 - value / slope;
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    }
    const change = Math.abs(next - p2);
    p2 = next;
    if (change <= 1e-15 * p1) break;
  }
  const exit = gasState(gas, p2, t, scratch.exit, scratch.equationOfState);
  const v2 = flux / exit.density;
  // Reaching the sonic end of the bracket means the flow does not pass.
  if (v2 * v2 * exit.densityPressureSlope > 1 + 1e-9) return false;
  out.outletPressure = p2;
  out.outletMach = v2 / exit.soundSpeed;
  return true;
}

/**
 * The isothermal pipe with an ideal gas and cp(T), after the perfect-gas relation has filled
 * `out` (flow, derivatives, pressures, and the perfect gas's arrival T (1 + (gamma-1)/2 M2^2)):
 * the flow stands (it depends on p, T and rho = p/(R T) only), the arrival becomes the
 * temperature of stagnation enthalpy h(T) + v2^2/2 with the polynomial h, the Mach numbers
 * those of the polynomial's sound speed (cp/cv R T)^0.5, and the heat taken in m v2^2/2.
 *
 * The kinetic part v2^2/2 and its derivatives are read off the perfect-gas arrival:
 * v2^2/2 = cp_const (T_arrive,perfect - T).
 */
export function applyCaloricIsothermal(
  gas: Gas,
  gamma: number,
  t: number,
  pd: number,
  out: PipeFlowEvaluation,
): void {
  const scratch = realGasScratchOf(out);
  const cp = gas.specificHeatCp;
  const kinetic = cp * (out.arrivalTemperature - t);
  const kineticP1 = cp * out.dArrivalTemperaturedUpstreamPressure;
  const kineticT = cp * (out.dArrivalTemperaturedUpstreamTemperature - 1);
  const kineticPd = cp * out.dArrivalTemperaturedDownstreamPressure;
  const s = gasState(gas, pd, t, scratch.exit);
  const machFactor = Math.sqrt(gamma * gas.specificGasConstant * t) / s.soundSpeed;
  out.inletMach *= machFactor;
  out.outletMach *= machFactor;
  out.heatFlow = out.massFlow * kinetic;
  setArrival(
    gas,
    s.enthalpy + kinetic,
    pd,
    scratch.exit,
    out,
    kineticP1,
    s.specificHeatCp + kineticT,
    kineticPd,
  );
}
