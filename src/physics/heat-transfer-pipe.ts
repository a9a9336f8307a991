/**
 * The heat-transfer pipe model: steady one-dimensional flow in a constant-area pipe with wall
 * friction, heat exchange with the surroundings and a change of elevation, integrated along the
 * pipe (docs/model.md, "Heat-transfer pipe model").
 *
 * Per unit length x along the flow, with the mass flux G = m/A constant (continuity rho v = G):
 *   momentum  dp/dx + G dv/dx = -(X/L) G v / 2 - rho g s
 *   energy    dh/dx + v dv/dx = U' (Ts - T) / m - g s
 * with v = G / rho(p, T), dv = -(v/rho)(rho_p dp + rho_T dT), dh = cp dT + h_p dp; X = fD L/D + K
 * (the minor losses spread evenly over the length, as the Fanno model counts them), s = dz/dx the
 * slope (rise over length), U' the overall heat-transfer coefficient per unit length [W/(m K)]
 * and Ts the surrounding temperature. This is a 2 x 2 linear system in (dp/dx, dT/dx) at each
 * point:
 *   [ 1 - v^2 rho_p           -v^2 rho_T         ] [p']   [ -(X/L) G v/2 - rho g s ]
 *   [ h_p - v^2 rho_p / rho    cp - v^2 rho_T/rho ] [T'] = [ U'(Ts - T)/m - g s     ]
 * whose determinant is cp (1 - M^2) for an ideal gas and vanishes at the speed of sound for any
 * gas (the sonic singularity). Every property comes from src/gas/thermo.ts (gasState), so the
 * same equations hold for a real gas. The heat flow into the gas Q = integral of U'(Ts - T) dx
 * is integrated with the state; the stagnation enthalpy arriving downstream is
 * h0_in + Q/m - g (z_out - z_in), exactly the first law, so network energy balances close.
 *
 * Sources: A. H. Shapiro, The Dynamics and Thermodynamics of Compressible Fluid Flow, vol. 1,
 * Ronald Press 1953, ch. 8 (generalized one-dimensional flow: friction, heat transfer, gravity);
 * the equations above are its momentum and energy equations written with a general equation of
 * state.
 *
 * Entrance: isentropic acceleration from the upstream plenum, as in the adiabatic model, with the
 * isentropic exponent rho a^2 / p and Z R of the plenum state (exact for a perfect gas); with
 * cp(T) or a real gas its temperature then closes the first law, h + v^2/2 = h0
 * (HeatTransferScratch.closeEntranceEnergy).
 * Friction: Darcy factor from Colebrook-White at Re = G D / mu(T0), T0 the upstream stagnation
 * temperature, constant along the pipe (as in the other models).
 *
 * Derivatives for Newton: forward sensitivity equations integrated with the state, with the same
 * steps (error control on the state only), in four directions: the inlet pressure, the inlet
 * temperature, the mass flux and the friction parameter; the state Jacobian of the right-hand side
 * by central differences of a smooth function (no adaptive step inside it), relative step 6e-6
 * (truncation and rounding about 1e-10). The mass flow follows by implicit differentiation of the
 * shooting condition p_exit(G; p0, T0) = pd. Choked: the capacity's derivatives by one-sided
 * differences of converged capacity solves (relative step 1e-5, error about 1e-5: Newton then
 * converges at a rate of 1e-5 per iteration near a choked edge).
 * @module
 */
import type { Gas } from "../gas/gas-types.js";
import { emptyPengRobinsonValues, type PengRobinsonValues } from "../gas/peng-robinson.js";
import {
  emptyThermoState,
  gasState,
  isPerfectGas,
  type ThermoState,
  temperatureFromEnthalpy,
} from "../gas/thermo.js";
import { DormandPrinceIntegrator } from "./embedded-runge-kutta.js";
import { machFromMassFluxParameter, maxMassFluxParameter } from "./isentropic.js";
import type { FrictionScratch, PipeFlowEvaluation, PipeGeometry } from "./pipe-flow.js";

/** Standard acceleration of gravity g [m/s2] (CGPM 1901, ISO 80000-3). */
export const STANDARD_GRAVITY = 9.80665;

/**
 * Local error tolerance of the integration, relative to the scale of each quantity's change over
 * the pipe (pressure: the frictional and hydrostatic drop; temperature: the larger of the
 * difference to the surroundings and v^2/cp; heat: m cp times that). Outlet pressures are then
 * accurate to about 1e-9 of the pressure drop, well inside the network tolerance.
 */
export const INTEGRATION_TOLERANCE = 1e-10;

/** 1 - M^2 at which the integration stops as sonic and extrapolates to the sonic point. */
const SONIC_MARGIN = 1e-4;

/** Relative step of the central differences of the right-hand side. */
const DIFFERENCE_STEP = 6e-6;

/** Relative step of the central differences of a real gas's entrance in the plenum state. */
const ENTRANCE_STEP = 1e-6;

/** Relative step of the one-sided differences of the capacity (choked derivatives). */
const CAPACITY_STEP = 1e-5;

/** Relative pressure difference (from the zero-flow outlet pressure) of the creeping-flow law. */
const CREEPING_PRESSURE_RATIO = 1e-10;

// State layout: [dp, dT, Q] then the sensitivities of those three in four directions.
const DIRECTIONS = 4; // inlet pressure, inlet temperature, mass flux, friction parameter
const DIMENSION = 3 + 3 * DIRECTIONS;

/** How one integration along the pipe ended. */
interface PipeRun {
  /** True when the flow reached the sonic point before the pipe's end. */
  sonic: boolean;
  /** Estimated position of the sonic point [m] (beyond L when the run reached the end). */
  sonicPosition: number;
  /** State at the exit (or at the sonic point): static pressure, temperature, heat, Mach. */
  pressure: number;
  temperature: number;
  heat: number;
  mach: number;
}

/** Inlet state after the isentropic entrance, with derivatives. */
interface Entrance {
  pressure: number;
  temperature: number;
  mach: number;
  /** d/dG, d/dp0, d/dT0 */
  pressureSlope: Float64Array;
  temperatureSlope: Float64Array;
}

/**
 * Work space of the heat-transfer model for one pipe: integrator, thermodynamic states and the
 * parameters of the current integration. Made once per pipe evaluation record, on first use.
 */
export class HeatTransferScratch {
  readonly integrator = new DormandPrinceIntegrator(DIMENSION, 2);
  readonly state: ThermoState = emptyThermoState();
  /** Working record of the equation of state (no allocation per property call). */
  readonly equationOfState: PengRobinsonValues = emptyPengRobinsonValues();
  /** Working record of the arrival-temperature inversions. */
  readonly arrivalState: ThermoState = emptyThermoState();
  /** The pipe's heat exchange and the plenum's figures of the current run (see startRun). */
  readonly exchange: HeatExchange = {
    heatTransferPerLength: 0,
    surroundingTemperature: 0,
    rise: 0,
  };
  readonly plenum: PlenumFigures = {
    kappa: 0,
    gasConstant: 0,
    enthalpy: 0,
    enthalpyPressureSlope: 0,
    specificHeatCp: 0,
  };
  readonly entrance: Entrance = {
    pressure: 0,
    temperature: 0,
    mach: 0,
    pressureSlope: new Float64Array(3),
    temperatureSlope: new Float64Array(3),
  };
  readonly run: PipeRun = {
    sonic: false,
    sonicPosition: 0,
    pressure: 0,
    temperature: 0,
    heat: 0,
    mach: 0,
  };
  readonly initial = new Float64Array(DIMENSION);
  private readonly base = new Float64Array(3);
  private readonly plus = new Float64Array(3);
  private readonly minus = new Float64Array(3);
  // Parameters of the integration in progress.
  gas: Gas | undefined;
  flux = 0;
  frictionPerLength = 0;
  area = 0;
  heatPerLength = 0;
  surroundingTemperature = 0;
  slope = 0;
  inletPressure = 0;
  inletTemperature = 0;
  withSensitivities = false;
  /** L [m] */
  length = 1;
  /** M^2 at the last point evaluated without perturbation. */
  lastMachSquared = 0;
  /** Integration statistics: runs, accepted steps and right-hand-side evaluations since creation. */
  runs = 0;
  acceptedSteps = 0;
  evaluations = 0;
  /** Last accepted 1 - M^2 and the one before, with positions and states (sonic extrapolation). */
  private previousMargin = 1;
  private previousPosition = 0;
  private margin = 1;
  readonly rightHandSide = (_x: number, y: Float64Array, out: Float64Array): boolean =>
    this.slopes(y, out);
  /** After each accepted step: the last evaluation was at the accepted point (FSAL). */
  readonly accept = (x: number, _y: Float64Array): boolean => {
    this.previousMargin = this.margin;
    this.previousPosition = this.currentPosition;
    this.margin = 1 - this.lastMachSquared;
    this.currentPosition = x;
    return this.margin > SONIC_MARGIN;
  };
  private currentPosition = 0;
  /** The gas, viscosity and friction law of the evaluation in progress. */
  readonly context: HeatTransferContext = {
    gas: undefined as unknown as Gas,
    viscosity: (temperature: number) => temperature,
    friction: (_pipe: PipeGeometry, _reynolds: number, _out: FrictionScratch) => {},
    pipe: undefined as unknown as PipeGeometry,
  };
  /** Scratch of the choked branch's differences. */
  readonly probe = new Float64Array(2);
  readonly probeFriction: FrictionScratch = {
    value: 0,
    slope: 0,
    factor: 0,
    colebrook: { factor: 0, logSlope: 0 },
  };

  /**
   * dp/dx, dT/dx and dQ/dx at (p, T) for mass flux G into `out`; false at or beyond the sonic
   * point (or at a non-physical state).
   */
  pointSlope(pressure: number, temperature: number, flux: number, out: Float64Array): boolean {
    if (!(pressure > 0 && temperature > 0)) return false;
    const s = gasState(this.gas as Gas, pressure, temperature, this.state, this.equationOfState);
    this.evaluations++;
    const rho = s.density;
    const v = flux / rho;
    const v2 = v * v;
    const machSquared = v2 / (s.soundSpeed * s.soundSpeed);
    if (!(machSquared < 1)) return false;
    const a11 = 1 - v2 * s.densityPressureSlope;
    const a12 = -v2 * s.densityTemperatureSlope;
    const a21 = s.enthalpyPressureSlope - (v2 * s.densityPressureSlope) / rho;
    const a22 = s.specificHeatCp - (v2 * s.densityTemperatureSlope) / rho;
    const det = a11 * a22 - a12 * a21;
    if (!(det > 0)) return false;
    const gravity = STANDARD_GRAVITY * this.slope;
    const b1 = -0.5 * this.frictionPerLength * flux * v - rho * gravity;
    const heat = this.heatPerLength * (this.surroundingTemperature - temperature);
    const b2 = heat / (flux * this.area) - gravity;
    out[0] = (b1 * a22 - a12 * b2) / det;
    out[1] = (a11 * b2 - a21 * b1) / det;
    out[2] = heat;
    this.lastMachSquared = machSquared;
    // Rate at which T relaxes to Ts: the coefficient of (Ts - T) in dT/dx [1/m].
    this.relaxation = (a11 * this.heatPerLength) / (flux * this.area * det);
    // Friction-parameter direction (analytic): d b1 / dX = -G v / (2 L), at fixed p and T.
    const frictionForcing = (-0.5 * flux * v) / this.length;
    this.frictionSlopeP = (frictionForcing * a22) / det;
    this.frictionSlopeT = (-a21 * frictionForcing) / det;
    return true;
  }
  private frictionSlopeP = 0;
  private frictionSlopeT = 0;
  /** Relaxation rate of the temperature at the last point evaluated [1/m]. */
  private relaxation = 0;
  private readonly relaxationSlope = new Float64Array(3);
  /** Before each step: the relaxation rate at the step's start (Lawson form for T). */
  readonly beforeStep = (_x: number, y: Float64Array): number => {
    const ok = this.pointSlope(
      this.inletPressure + (y[0] as number),
      this.inletTemperature + (y[1] as number),
      this.flux,
      this.relaxationSlope,
    );
    return ok && this.relaxation > 0 ? this.relaxation : 0;
  };
  /**
   * Stagnation enthalpy h + v^2/2 [J/kg] at (p, T) for flux G, with its partial derivatives in
   * `enthalpySlope` (d/dp, d/dT, d/dG).
   */
  stagnationEnthalpy(pressure: number, temperature: number, flux: number): number {
    const s = gasState(this.gas as Gas, pressure, temperature, this.state, this.equationOfState);
    const v = flux / s.density;
    const v2 = v * v;
    this.enthalpySlope[0] = s.enthalpyPressureSlope - (v2 * s.densityPressureSlope) / s.density;
    this.enthalpySlope[1] = s.specificHeatCp - (v2 * s.densityTemperatureSlope) / s.density;
    this.enthalpySlope[2] = v2 / flux;
    return s.enthalpy + 0.5 * v2;
  }
  readonly enthalpySlope = new Float64Array(3);

  /**
   * With cp(T) or a real gas, make the entrance state close the first law exactly:
   * h(p1, T1) + (G/rho1)^2/2 = h0 of the plenum, by Newton on T1 at the isentrope's p1 (the
   * isentropic form with the plenum's exponent rho a^2/p is exact for a perfect gas only, and
   * off by O(M^2 (1 - Z)) in enthalpy otherwise). The slopes of T1 follow from the same
   * condition: dT1 = (dh0 - H_p dp1 - H_G dG) / H_T, H = h + v^2/2 at fixed G. The Mach number
   * becomes v1 / a(p1, T1). The slopes of p1 with respect to p0 and T0 also follow the
   * plenum's exponent and Z R, which change with (p0, T0) for such a gas: by central differences
   * of the isentropic form (relative step 1e-6; no integration involved). A perfect gas is left
   * as it is (its entrance and slopes are exact).
   */
  closeEntranceEnergy(
    flux: number,
    p0: number,
    t0: number,
    h0: number,
    dh0dp0: number,
    dh0dT0: number,
  ): void {
    const gas = this.gas as Gas;
    if (isPerfectGas(gas)) return;
    const entrance = this.entrance;
    const p1s = entrance.pressureSlope;
    const dp = ENTRANCE_STEP * p0;
    const dt = ENTRANCE_STEP * t0;
    p1s[1] =
      (this.entrancePressureAt(flux, p0 + dp, t0) - this.entrancePressureAt(flux, p0 - dp, t0)) /
      (2 * dp);
    p1s[2] =
      (this.entrancePressureAt(flux, p0, t0 + dt) - this.entrancePressureAt(flux, p0, t0 - dt)) /
      (2 * dt);
    const p1 = entrance.pressure;
    let t1 = entrance.temperature;
    const slope = this.enthalpySlope;
    for (let iteration = 0; iteration < 20; iteration++) {
      const residual = this.stagnationEnthalpy(p1, t1, flux) - h0;
      const step = residual / (slope[1] as number);
      t1 -= step;
      if (Math.abs(step) <= 1e-13 * t1) break;
    }
    this.stagnationEnthalpy(p1, t1, flux);
    const hp = slope[0] as number;
    const ht = slope[1] as number;
    const hg = slope[2] as number;
    const t1s = entrance.temperatureSlope;
    entrance.temperature = t1;
    t1s[0] = -(hp * (p1s[0] as number) + hg) / ht;
    t1s[1] = (dh0dp0 - hp * (p1s[1] as number)) / ht;
    t1s[2] = (dh0dT0 - hp * (p1s[2] as number)) / ht;
    const s = this.state;
    entrance.mach = flux / s.density / s.soundSpeed;
  }

  /** Inlet pressure of the isentropic form from a plenum (p0, T0) with its own exponent and Z R. */
  private entrancePressureAt(flux: number, p0: number, t0: number): number {
    const plenum = gasState(this.gas as Gas, p0, t0, this.probeState, this.equationOfState);
    const kappa = (plenum.density * plenum.soundSpeed * plenum.soundSpeed) / p0;
    const gasConstant = p0 / (plenum.density * t0);
    return isentropicEntrance(flux, p0, t0, kappa, gasConstant, this.probeEntrance)
      ? this.probeEntrance.pressure
      : Number.NaN;
  }
  private readonly probeState: ThermoState = emptyThermoState();
  private readonly probeEntrance: Entrance = {
    pressure: 0,
    temperature: 0,
    mach: 0,
    pressureSlope: new Float64Array(3),
    temperatureSlope: new Float64Array(3),
  };

  private slopes(y: Float64Array, out: Float64Array): boolean {
    const p = this.inletPressure + (y[0] as number);
    const t = this.inletTemperature + (y[1] as number);
    const flux = this.flux;
    const base = this.base;
    if (!this.pointSlope(p, t, flux, base)) return false;
    const machSquared = this.lastMachSquared;
    out[0] = base[0] as number;
    out[1] = base[1] as number;
    out[2] = base[2] as number;
    if (this.withSensitivities) {
      const frictionP = this.frictionSlopeP;
      const frictionT = this.frictionSlopeT;
      const { plus, minus } = this;
      // Columns of the state Jacobian and the flux derivative by central differences.
      const dp = DIFFERENCE_STEP * p;
      const dt = DIFFERENCE_STEP * t;
      const dg = DIFFERENCE_STEP * flux;
      if (!this.pointSlope(p + dp, t, flux, plus) || !this.pointSlope(p - dp, t, flux, minus)) {
        return false;
      }
      const jpp = ((plus[0] as number) - (minus[0] as number)) / (2 * dp);
      const jtp = ((plus[1] as number) - (minus[1] as number)) / (2 * dp);
      const jqp = ((plus[2] as number) - (minus[2] as number)) / (2 * dp);
      if (!this.pointSlope(p, t + dt, flux, plus) || !this.pointSlope(p, t - dt, flux, minus)) {
        return false;
      }
      const jpt = ((plus[0] as number) - (minus[0] as number)) / (2 * dt);
      const jtt = ((plus[1] as number) - (minus[1] as number)) / (2 * dt);
      const jqt = ((plus[2] as number) - (minus[2] as number)) / (2 * dt);
      if (!this.pointSlope(p, t, flux + dg, plus) || !this.pointSlope(p, t, flux - dg, minus)) {
        return false;
      }
      const gp = ((plus[0] as number) - (minus[0] as number)) / (2 * dg);
      const gt = ((plus[1] as number) - (minus[1] as number)) / (2 * dg);
      const gq = ((plus[2] as number) - (minus[2] as number)) / (2 * dg);
      for (let d = 0; d < DIRECTIONS; d++) {
        const sp = y[3 + 3 * d] as number;
        const st = y[4 + 3 * d] as number;
        let fp = jpp * sp + jpt * st;
        let ft = jtp * sp + jtt * st;
        let fq = jqp * sp + jqt * st;
        if (d === 2) {
          fp += gp;
          ft += gt;
          fq += gq;
        } else if (d === 3) {
          fp += frictionP;
          ft += frictionT;
        }
        out[3 + 3 * d] = fp;
        out[4 + 3 * d] = ft;
        out[5 + 3 * d] = fq;
      }
    }
    this.lastMachSquared = machSquared;
    return true;
  }

  /**
   * Integrate the pipe from its inlet state (p1, T1) at mass flux G over length L; the result in
   * `this.run`, the sensitivities (when asked) in `this.integrator.y`. Sets the error scales from
   * the inlet state.
   */
  integrate(length: number, flux: number, withSensitivities: boolean): PipeRun {
    const integrator = this.integrator;
    const gas = this.gas as Gas;
    this.flux = flux;
    this.length = length;
    this.withSensitivities = withSensitivities;
    this.runs++;
    const p1 = this.inletPressure;
    const t1 = this.inletTemperature;
    const s = gasState(gas, p1, t1, this.state, this.equationOfState);
    const v = flux / s.density;
    const frictionDrop = 0.5 * this.frictionPerLength * length * flux * v;
    const hydrostatic = s.density * STANDARD_GRAVITY * Math.abs(this.slope) * length;
    const cp = s.specificHeatCp;
    const temperatureScale = Math.max(
      this.heatPerLength > 0 ? Math.abs(this.surroundingTemperature - t1) : 0,
      (v * v) / cp,
      (STANDARD_GRAVITY * Math.abs(this.slope) * length) / cp,
      1e-9 * t1,
    );
    integrator.scale[0] = Math.max(frictionDrop + hydrostatic, 1e-13 * p1);
    integrator.scale[1] = temperatureScale;
    integrator.scale[2] = Math.max(flux * this.area * cp * temperatureScale, 1e-300);
    integrator.tolerance = INTEGRATION_TOLERANCE;
    // With heat exchange, T relaxes to Ts at the rate U'/(m cp (1 - M^2)): taken in the Lawson
    // form (src/physics/embedded-runge-kutta.ts), so that a pipe many relaxation lengths long does
    // not need steps of the relaxation length. Relaxing: T and its sensitivities (to 0).
    const relaxing = this.heatPerLength > 0 ? 1 : 0;
    integrator.rate.fill(0);
    integrator.equilibrium.fill(0);
    for (let d = 0; d <= DIRECTIONS; d++) integrator.rate[1 + 3 * d] = relaxing;
    integrator.equilibrium[1] = this.surroundingTemperature - t1;
    integrator.relaxationRate = 0;
    integrator.beforeStep = relaxing ? this.beforeStep : undefined;
    const y0 = this.initial;
    y0.fill(0);
    // Sensitivities of (p, T, Q): d/dp1 starts as (1, 0, 0), d/dT1 as (0, 1, 0), d/dG and
    // d/dX as zeros.
    y0[3] = 1;
    y0[7] = 1;
    this.margin = 1;
    this.previousMargin = 1;
    this.currentPosition = 0;
    this.previousPosition = 0;
    const end = integrator.integrate(
      this.rightHandSide,
      0,
      y0,
      length,
      0,
      1e-14 * length,
      this.accept,
    );
    this.acceptedSteps += integrator.acceptedSteps;
    const run = this.run;
    const y = integrator.y;
    run.pressure = p1 + (y[0] as number);
    run.temperature = t1 + (y[1] as number);
    run.mach = Math.sqrt(Math.max(1 - this.margin, 0));
    if (end === "reached") {
      run.sonic = false;
      run.sonicPosition = this.extrapolatedSonicPosition(length);
      run.heat = this.heatOf(run.pressure, run.temperature, length);
      return run;
    }
    // Stopped near the sonic point, or a step beyond it could not be taken: extrapolate the
    // position and the state to M = 1, where (1 - M^2) falls linearly in the state and
    // (1 - M^2)^2 linearly in x (the square-root singularity of generalized 1-D flow).
    run.sonic = true;
    run.sonicPosition = this.extrapolatedSonicPosition(length);
    const margin = this.margin;
    const change = this.previousMargin - margin;
    if (change > 0 && margin < 0.5) {
      const w = margin / change;
      const prev = integrator.previousY;
      run.pressure += w * ((y[0] as number) - (prev[0] as number));
      run.temperature += w * ((y[1] as number) - (prev[1] as number));
    }
    run.mach = 1;
    run.heat = this.heatOf(
      run.pressure,
      run.temperature,
      Math.min(Math.max(run.sonicPosition, 0), length),
    );
    return run;
  }

  /**
   * Heat into the gas from the inlet to a point at distance x with state (p, T), by the first law:
   * Q = m (h + v^2/2 - (h1 + v1^2/2) + g s x). The integrated Q (component 2) is not used: under
   * the Lawson steps its quadrature of a fast relaxation is not accurate, the end states are.
   */
  heatOf(pressure: number, temperature: number, position: number): number {
    if (!(this.heatPerLength > 0)) return 0; // no heat exchange: exactly none
    const inlet = this.stagnationEnthalpy(this.inletPressure, this.inletTemperature, this.flux);
    const outlet = this.stagnationEnthalpy(pressure, temperature, this.flux);
    const lift = STANDARD_GRAVITY * this.slope * position;
    return this.flux * this.area * (outlet - inlet + lift);
  }

  /** Position where M = 1 from the last two accepted points: (1 - M^2)^2 linear in x. */
  private extrapolatedSonicPosition(length: number): number {
    const w = this.margin * this.margin;
    const wPrevious = this.previousMargin * this.previousMargin;
    if (!(wPrevious > w) || this.currentPosition <= this.previousPosition) {
      return this.margin <= SONIC_MARGIN ? this.currentPosition : 1e3 * length;
    }
    const position =
      this.currentPosition + (w * (this.currentPosition - this.previousPosition)) / (wPrevious - w);
    return Math.min(position, 1e3 * length);
  }
}

/**
 * The isentropic entrance from the plenum (p0, T0) at mass flux G, with derivatives with respect
 * to G, p0 and T0. False when G exceeds the largest flux an isentropic entrance passes.
 *
 * Phi = G sqrt(Z R T0) / p0; M1 from Phi(M1) on the subsonic branch; T1 = T0 / (1 + (k-1)/2 M1^2),
 * p1 = p0 (T1/T0)^(k/(k-1)), k = rho a^2 / p of the plenum (gamma for an ideal gas).
 * Source: J. D. Anderson, Modern Compressible Flow, 3rd ed., McGraw-Hill 2003, ch. 3 and 5.
 */
function isentropicEntrance(
  flux: number,
  p0: number,
  t0: number,
  kappa: number,
  gasConstant: number,
  out: Entrance,
): boolean {
  const phi = (flux * Math.sqrt(gasConstant * t0)) / p0;
  if (!(phi < maxMassFluxParameter(kappa))) return false;
  const mach = machFromMassFluxParameter(phi, kappa, "subsonic");
  const s = 1 + 0.5 * (kappa - 1) * mach * mach;
  const t1 = t0 / s;
  const p1 = p0 * s ** (-kappa / (kappa - 1));
  out.mach = mach;
  out.pressure = p1;
  out.temperature = t1;
  // d ln Phi / dM = 1/M - ((k+1)/2) M / s; M dM/d ln Phi is finite as M -> 0.
  const machPerLogPhi = 1 / (1 / mach - (0.5 * (kappa + 1) * mach) / s);
  const logT1PerMach = (-(kappa - 1) * mach) / s;
  const logP1PerMach = (-kappa * mach) / s;
  // d ln Phi = dG/G - dp0/p0 + dT0/(2 T0)
  const perFlux = machPerLogPhi / flux;
  out.temperatureSlope[0] = t1 * logT1PerMach * perFlux;
  out.temperatureSlope[1] = t1 * logT1PerMach * machPerLogPhi * (-1 / p0);
  out.temperatureSlope[2] = t1 * (1 / t0 + logT1PerMach * machPerLogPhi * (0.5 / t0));
  out.pressureSlope[0] = p1 * logP1PerMach * perFlux;
  out.pressureSlope[1] = p1 * (1 / p0 + logP1PerMach * machPerLogPhi * (-1 / p0));
  out.pressureSlope[2] = p1 * logP1PerMach * machPerLogPhi * (0.5 / t0);
  return true;
}

/** What the model needs of the gas and the friction law (passed in by pipe-flow.ts). */
export interface HeatTransferContext {
  gas: Gas;
  /** mu(T) [Pa s] */
  viscosity: (temperature: number) => number;
  /** Fills the friction scratch with X = fD L/D + K and dX/dRe at a Reynolds number. */
  friction: (pipe: PipeGeometry, reynolds: number, out: FrictionScratch) => void;
  /** The pipe being evaluated. */
  pipe: PipeGeometry;
}

/** Heat-exchange and elevation fields of a pipe, in SI. */
export interface HeatExchange {
  /** U' [W/(m K)], >= 0. */
  heatTransferPerLength: number;
  /** Ts [K]. */
  surroundingTemperature: number;
  /** Elevation of the pipe's `to` end minus its `from` end [m]. */
  rise: number;
}

/** The heat-exchange record of a pipe geometry (zeros when the pipe has none), into `out`. */
export function heatExchangeOf(
  pipe: PipeGeometry,
  out: HeatExchange = { heatTransferPerLength: 0, surroundingTemperature: 0, rise: 0 },
): HeatExchange {
  out.heatTransferPerLength = pipe.heatTransferPerLength ?? 0;
  out.surroundingTemperature = pipe.surroundingTemperature ?? 293.15;
  out.rise = pipe.rise ?? 0;
  return out;
}

/** The plenum's figures a run starts from (see {@link startRun}). */
interface PlenumFigures {
  /** Isentropic exponent rho a^2 / p [-]. */
  kappa: number;
  /** Z R = p0 / (rho0 T0) [J/(kg K)]. */
  gasConstant: number;
  /** h0 [J/kg] and its slopes (dh/dp)_T [J/(kg Pa)] and cp [J/(kg K)]. */
  enthalpy: number;
  enthalpyPressureSlope: number;
  specificHeatCp: number;
}

/**
 * Sets the scratch up for runs of `pipe` from a plenum at (p0, T0) with the downstream end
 * `rise` higher (gas, area, heat exchange, slope) and returns the plenum's figures (a record of
 * the scratch: no allocation).
 */
function startRun(
  scratch: HeatTransferScratch,
  pipe: PipeGeometry,
  gas: Gas,
  p0: number,
  t0: number,
  rise: number,
): PlenumFigures {
  const exchange = heatExchangeOf(pipe, scratch.exchange);
  scratch.gas = gas;
  scratch.area = 0.25 * Math.PI * pipe.diameter * pipe.diameter;
  scratch.heatPerLength = exchange.heatTransferPerLength;
  scratch.surroundingTemperature = exchange.surroundingTemperature;
  scratch.slope = rise / pipe.length;
  const state = gasState(gas, p0, t0, scratch.state, scratch.equationOfState);
  const plenum = scratch.plenum;
  plenum.kappa = (state.density * state.soundSpeed * state.soundSpeed) / p0;
  plenum.gasConstant = p0 / (state.density * t0);
  plenum.enthalpy = state.enthalpy;
  plenum.enthalpyPressureSlope = state.enthalpyPressureSlope;
  plenum.specificHeatCp = state.specificHeatCp;
  return plenum;
}

/**
 * Outlet pressure of the pipe at zero flow [Pa]: a column at rest, isothermal at the surrounding
 * temperature when the pipe exchanges heat (the gas has all the time in the world to reach it),
 * isentropic from the upstream state otherwise (dh = dp / rho = -g dz). Ideal-gas forms
 * p2 = p1 exp(-g dz / (Z R Ts)) and p2 = p1 (1 - g dz / (cp T0))^(cp / (Z R)).
 */
export function zeroFlowOutletPressure(
  gas: Gas,
  p0: number,
  t0: number,
  rise: number,
  heatTransferPerLength: number,
  surroundingTemperature: number,
  state: ThermoState,
): number {
  if (rise === 0) return p0;
  const s = gasState(gas, p0, t0, state);
  const gasConstant = p0 / (s.density * t0);
  if (heatTransferPerLength > 0) {
    return p0 * Math.exp((-STANDARD_GRAVITY * rise) / (gasConstant * surroundingTemperature));
  }
  const ratio = 1 - (STANDARD_GRAVITY * rise) / (s.specificHeatCp * t0);
  return ratio > 0 ? p0 * ratio ** (s.specificHeatCp / gasConstant) : 0;
}

/**
 * Evaluate a heat-transfer pipe from a plenum at (p0, T0) into a plenum at pd, filling `out` as
 * the other models do (mass flow and derivatives, choke and capacity, end pressures and Mach
 * numbers, arrival stagnation temperature and derivatives), plus the heat flow into the gas and
 * the static end temperatures.
 *
 * @param rise - elevation of the downstream end minus the upstream end (in the flow direction) [m]
 */
export function evaluateHeatTransferPipe(
  pipe: PipeGeometry,
  thermoGas: Gas,
  viscosity: (temperature: number) => number,
  frictionLaw: (pipe: PipeGeometry, reynolds: number, out: FrictionScratch) => void,
  p0: number,
  t0: number,
  pd: number,
  rise: number,
  out: PipeFlowEvaluation,
  needCapacity: boolean,
): void {
  const scratch = scratchOf(out);
  const context = scratch.context;
  context.gas = thermoGas;
  context.viscosity = viscosity;
  context.friction = frictionLaw;
  context.pipe = pipe;
  const gas = thermoGas;
  const length = pipe.length;
  const plenum = startRun(scratch, pipe, gas, p0, t0, rise);
  const area = scratch.area;
  const exchange = scratch.exchange;
  const kappa = plenum.kappa;
  const gasConstant = plenum.gasConstant;
  const h0 = plenum.enthalpy;
  const dh0dp0 = plenum.enthalpyPressureSlope;
  const dh0dT0 = plenum.specificHeatCp;
  const mu = context.viscosity(t0);
  const hMu = 1e-6 * t0;
  const muSlope = (context.viscosity(t0 + hMu) - context.viscosity(t0 - hMu)) / (2 * hMu) / mu;
  const reynoldsPerFlux = pipe.diameter / mu;
  const friction = out.friction;
  const entrance = scratch.entrance;

  out.capacity = Number.NaN;
  out.capacityKnown = false;

  // Integrate at flux G from the plenum; false if the entrance cannot pass it.
  const runAt = (flux: number, withSensitivities: boolean): PipeRun | undefined => {
    if (!isentropicEntrance(flux, p0, t0, kappa, gasConstant, entrance)) return undefined;
    scratch.closeEntranceEnergy(flux, p0, t0, h0, dh0dp0, dh0dT0);
    context.friction(context.pipe, flux * reynoldsPerFlux, friction);
    scratch.frictionPerLength = friction.value / length;
    scratch.inletPressure = entrance.pressure;
    scratch.inletTemperature = entrance.temperature;
    return scratch.integrate(length, flux, withSensitivities);
  };

  // --- Zero and creeping flow ---------------------------------------------------------------
  const zeroFlowPressure = zeroFlowOutletPressure(
    gas,
    p0,
    t0,
    rise,
    exchange.heatTransferPerLength,
    exchange.surroundingTemperature,
    scratch.state,
  );
  if (!(zeroFlowPressure - pd > CREEPING_PRESSURE_RATIO * p0)) {
    setCreeping(
      pipe,
      gas,
      p0,
      t0,
      pd,
      zeroFlowPressure,
      mu,
      muSlope,
      area,
      exchange,
      rise,
      scratch.state,
      out,
    );
    return;
  }

  // --- Capacity: the flux at which the sonic point sits at the pipe's end --------------------
  const largestFlux = (maxMassFluxParameter(kappa) * p0) / Math.sqrt(gasConstant * t0);
  let chokedExitPressure = Number.NaN;
  const solveCapacity = (): number => {
    const flux = capacityFlux(out.lastCapacityInletMach, largestFlux, length, runAt);
    out.lastCapacityInletMach = flux;
    out.capacity = flux * area;
    out.capacityKnown = true;
    const run = runAt(flux, false);
    chokedExitPressure = run === undefined ? p0 : run.pressure;
    return flux;
  };
  if (needCapacity || out.choked) solveCapacity();

  // --- Subsonic: Newton on G for p_exit(G) = pd ----------------------------------------------
  let lo = 0;
  let hi = out.capacityKnown ? (out.capacity as number) / area : largestFlux;
  let flux = out.lastInletMach;
  if (!(flux > 0 && flux < hi)) {
    flux = firstFluxGuess(
      p0,
      pd,
      zeroFlowPressure,
      gasConstant * t0,
      hi,
      context,
      reynoldsPerFlux,
      scratch.probeFriction,
    );
  }
  let choked = out.capacityKnown && !(pd > chokedExitPressure);
  let run: PipeRun | undefined;
  let slopeG = Number.NaN;
  if (!choked) {
    for (let iteration = 0; iteration < 60; iteration++) {
      run = runAt(flux, true);
      if (run === undefined || run.sonic) {
        hi = flux;
        if (!out.capacityKnown) {
          const capacity = solveCapacity();
          hi = capacity;
          if (!(pd > chokedExitPressure)) {
            choked = true;
            break;
          }
        }
        flux = 0.5 * (lo + hi);
        continue;
      }
      slopeG = exitSlope(scratch, entrance, friction.slope * reynoldsPerFlux, 0, EXIT_PRESSURE);
      const residual = run.pressure - pd;
      if (residual > 0) lo = flux;
      else hi = flux;
      let next = flux - residual / slopeG;
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
      const change = Math.abs(next - flux);
      if (change <= 1e-13 * flux || Math.abs(residual) <= 1e-15 * p0) break;
      if (hi - lo <= 1e-14 * hi) break;
      flux = next;
    }
    if (!choked && !out.capacityKnown && run !== undefined && run.mach > 0.999) {
      solveCapacity();
      if (!(pd > chokedExitPressure)) choked = true;
      else run = runAt(flux, true); // the capacity solve overwrote the sensitivities
    }
  }

  // (A last run that is sonic cannot remain: the bracket then shrank onto the capacity.)
  if (choked || run === undefined || run.sonic) {
    setChoked(pipe, p0, t0, pd, area, h0, runAt, out, scratch, largestFlux);
    return;
  }

  // --- Subsonic result and derivatives -------------------------------------------------------
  out.lastInletMach = flux;
  out.choked = false;
  const massFlow = flux * area;
  out.massFlow = massFlow;
  out.inletMach = entrance.mach;
  out.outletMach = run.mach;
  out.inletPressure = entrance.pressure;
  out.outletPressure = pd;
  out.inletTemperature = entrance.temperature;
  out.outletTemperature = run.temperature;
  out.heatFlow = run.heat;
  out.frictionFactor = friction.factor;
  out.reynolds = flux * reynoldsPerFlux;
  const dXdFlux = friction.slope * reynoldsPerFlux;
  const dXdT0 = friction.slope * out.reynolds * -muSlope;
  const pG = exitSlope(scratch, entrance, dXdFlux, 0, EXIT_PRESSURE);
  const pP0 = exitSlope(scratch, entrance, 0, 1, EXIT_PRESSURE);
  const pT0 = exitSlope(scratch, entrance, dXdT0, 2, EXIT_PRESSURE);
  const fluxPerPd = 1 / pG;
  const fluxPerP0 = -pP0 / pG;
  const fluxPerT0 = -pT0 / pG;
  out.dMassFlowdUpstreamPressure = area * fluxPerP0;
  out.dMassFlowdUpstreamTemperature = area * fluxPerT0;
  out.dMassFlowdDownstreamPressure = area * fluxPerPd;
  // Arrival: h0_out = h0_in + Q/m - g rise = h0_in + H2 - H1 (H = h + v^2/2 at the pipe's ends),
  // differentiated along the solution G(p0, T0, pd), on which p2 = pd.
  const tG = exitSlope(scratch, entrance, dXdFlux, 0, EXIT_TEMPERATURE);
  const tP0 = exitSlope(scratch, entrance, 0, 1, EXIT_TEMPERATURE) + tG * fluxPerP0;
  const tT0 = exitSlope(scratch, entrance, dXdT0, 2, EXIT_TEMPERATURE) + tG * fluxPerT0;
  const tPd = tG * fluxPerPd;
  const h2 = scratch.stagnationEnthalpy(pd, run.temperature, flux);
  const [h2p, h2t, h2g] = scratch.enthalpySlope as unknown as [number, number, number];
  const h1 = scratch.stagnationEnthalpy(entrance.pressure, entrance.temperature, flux);
  const [h1p, h1t, h1g] = scratch.enthalpySlope as unknown as [number, number, number];
  const p1s = entrance.pressureSlope;
  const t1s = entrance.temperatureSlope;
  const inletChange = (index: number, fluxSlope: number): number =>
    h1p * ((p1s[index] as number) + (p1s[0] as number) * fluxSlope) +
    h1t * ((t1s[index] as number) + (t1s[0] as number) * fluxSlope) +
    h1g * fluxSlope;
  const dP0 = dh0dp0 + h2t * tP0 + h2g * fluxPerP0 - inletChange(1, fluxPerP0);
  const dT0 = dh0dT0 + h2t * tT0 + h2g * fluxPerT0 - inletChange(2, fluxPerT0);
  const dPd =
    h2p +
    h2t * tPd +
    h2g * fluxPerPd -
    (h1p * (p1s[0] as number) + h1t * (t1s[0] as number) + h1g) * fluxPerPd;
  if (exchange.heatTransferPerLength > 0) {
    setArrival(gas, h0 + h2 - h1, pd, scratch.state, out, dP0, dT0, dPd, scratch.equationOfState);
  } else {
    // No heat exchange: h0_out = h0_in - g rise exactly (the integration's error stays out).
    setArrival(
      gas,
      h0 - STANDARD_GRAVITY * rise,
      pd,
      scratch.state,
      out,
      dh0dp0,
      dh0dT0,
      0,
      scratch.equationOfState,
    );
  }
}

/** The model's scratch inside an evaluation record (made on first use, then reused). */
function scratchOf(out: PipeFlowEvaluation): HeatTransferScratch {
  if (out.heatTransfer === undefined) out.heatTransfer = new HeatTransferScratch();
  return out.heatTransfer;
}

/** Which exit quantity {@link exitSlope} differentiates: the pressure (0) or temperature (1). */
const EXIT_PRESSURE = 0;
const EXIT_TEMPERATURE = 1;

/**
 * d p_exit / d theta (quantity EXIT_PRESSURE) or d T_exit / d theta (EXIT_TEMPERATURE) at fixed
 * everything else, theta = G (entranceIndex 0, with the flux direction), p0 (1) or T0 (2),
 * through the inlet state, the flux and the friction parameter. The sensitivities of the state
 * (p, T) along direction d sit at y[3 + 3 d + quantity].
 */
function exitSlope(
  scratch: HeatTransferScratch,
  entrance: Entrance,
  frictionSlope: number,
  entranceIndex: number,
  quantity: typeof EXIT_PRESSURE | typeof EXIT_TEMPERATURE,
): number {
  const y = scratch.integrator.y;
  const dp1 = entrance.pressureSlope[entranceIndex] as number;
  const dt1 = entrance.temperatureSlope[entranceIndex] as number;
  let value = dp1 * (y[3 + quantity] as number) + dt1 * (y[6 + quantity] as number);
  if (entranceIndex === 0) value += y[9 + quantity] as number;
  value += frictionSlope * (y[12 + quantity] as number);
  return value;
}

/**
 * Arrival stagnation temperature at the downstream plenum pressure from the stagnation enthalpy
 * h0_out, with its derivatives from those of h0_out (d/dp0, d/dT0, d/dpd along the solution):
 * h(T_arrive, pd) = h0_out, so dT_arrive = (dh0_out - (dh/dp)_T dpd) / cp at (T_arrive, pd).
 * Also used by the real-gas isothermal pipe (src/physics/real-gas-pipe.ts). `state` and
 * `eosScratch` are working records (allocation-free when given).
 */
export function setArrival(
  gas: Gas,
  h0Out: number,
  pd: number,
  state: ThermoState,
  out: PipeFlowEvaluation,
  dP0: number,
  dT0: number,
  dPd: number,
  eosScratch?: PengRobinsonValues,
): void {
  const arrival = temperatureFromEnthalpy(gas, h0Out, pd, state, eosScratch);
  const s = gasState(gas, pd, arrival, state, eosScratch);
  const perEnthalpy = 1 / s.specificHeatCp;
  out.arrivalTemperature = arrival;
  out.dArrivalTemperaturedUpstreamPressure = perEnthalpy * dP0;
  out.dArrivalTemperaturedUpstreamTemperature = perEnthalpy * dT0;
  out.dArrivalTemperaturedDownstreamPressure = perEnthalpy * (dPd - s.enthalpyPressureSlope);
}

/**
 * A first flux for the shooting iteration: the isothermal friction law with the inlet at the
 * plenum state, G^2 = (p0^2 - pd^2) / (Z R T0 (X + 2 ln(p0/pd))), kept below the upper bound.
 */
function firstFluxGuess(
  p0: number,
  pd: number,
  zeroFlowPressure: number,
  gasConstantTimesTemperature: number,
  upper: number,
  context: HeatTransferContext,
  reynoldsPerFlux: number,
  probeFriction: FrictionScratch,
): number {
  const drive = Math.max(zeroFlowPressure - pd, 1e-12 * p0);
  const pressureSquares = drive * (zeroFlowPressure + pd);
  const friction = probeFriction;
  context.friction(context.pipe, Math.max(0.1 * upper * reynoldsPerFlux, 1), friction);
  const logRatio = Math.log(Math.max(zeroFlowPressure, pd * (1 + 1e-15)) / pd);
  const flux = Math.sqrt(
    pressureSquares / (gasConstantTimesTemperature * (friction.value + 2 * logRatio)),
  );
  return Math.min(flux, 0.9 * upper);
}

/**
 * Capacity flux: the flux at which the flow reaches M = 1 exactly at the pipe's end, by the
 * Illinois variant of regula falsi on the extrapolated sonic position minus the length (smooth
 * and falling in G). Bracket (0, the entrance's largest flux).
 */
function capacityFlux(
  guess: number,
  largestFlux: number,
  length: number,
  runAt: (flux: number, withSensitivities: boolean) => PipeRun | undefined,
): number {
  const positionAt = (flux: number): number => {
    const run = runAt(flux, false);
    if (run === undefined) return -length;
    return run.sonicPosition - length;
  };
  let hi = largestFlux * (1 - 1e-12);
  let fHi = -length; // chokes at the inlet
  let lo = 0;
  let fLo = Number.POSITIVE_INFINITY;
  let flux = guess > 0 && guess < hi ? guess : 0.5 * hi;
  let value = positionAt(flux);
  // Find a subsonic point with a finite value to bracket from below.
  for (let i = 0; i < 60 && !(value > 0); i++) {
    hi = flux;
    fHi = value;
    flux *= 0.7;
    value = positionAt(flux);
  }
  lo = flux;
  fLo = value;
  if (guess > 0 && guess < largestFlux) {
    // A warm start: probe just above the guess for the bracket's other end.
    const probe = Math.min(flux * (1 + 1e-6), 0.5 * (flux + hi));
    const probeValue = positionAt(probe);
    if (probeValue <= 0) {
      hi = probe;
      fHi = probeValue;
    } else {
      lo = probe;
      fLo = probeValue;
    }
  }
  let side = 0;
  for (let iteration = 0; iteration < 100; iteration++) {
    let next = Number.isFinite(fLo) ? (lo * fHi - hi * fLo) / (fHi - fLo) : 0.5 * (lo + hi);
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    const v = positionAt(next);
    if (Math.abs(v) <= 1e-11 * length || hi - lo <= 1e-13 * hi) {
      flux = next;
      break;
    }
    if (v > 0) {
      lo = next;
      fLo = v;
      if (side === 1) fHi *= 0.5;
      side = 1;
    } else {
      hi = next;
      fHi = v;
      if (side === -1) fLo *= 0.5;
      side = -1;
    }
    flux = next;
  }
  return flux;
}

/**
 * Choked: the capacity flows; derivatives by one-sided differences of capacity solves. The
 * arrival stagnation temperature is taken at the downstream plenum pressure pd, as for a
 * subsonic pipe, so that the junction turns it back into the same enthalpy (with a real gas
 * h depends on p: dT_arrive/dpd = -(dh/dp)_T / cp at fixed h0).
 */
function setChoked(
  pipe: PipeGeometry,
  p0: number,
  t0: number,
  pd: number,
  area: number,
  h0: number,
  runAt: (flux: number, withSensitivities: boolean) => PipeRun | undefined,
  out: PipeFlowEvaluation,
  scratch: HeatTransferScratch,
  largestFlux: number,
): void {
  const context = scratch.context;
  const gas = context.gas;
  const length = pipe.length;
  const flux = out.capacityKnown
    ? out.lastCapacityInletMach
    : capacityFlux(out.lastCapacityInletMach, largestFlux, length, runAt);
  const run = runAt(flux, false) as PipeRun;
  const rise = scratch.slope * length;
  out.lastCapacityInletMach = flux;
  out.capacity = flux * area;
  out.capacityKnown = true;
  out.choked = true;
  out.massFlow = flux * area;
  out.inletMach = scratch.entrance.mach;
  out.outletMach = 1;
  out.inletPressure = scratch.entrance.pressure;
  out.outletPressure = run.pressure;
  out.inletTemperature = scratch.entrance.temperature;
  out.outletTemperature = run.temperature;
  out.heatFlow = run.heat;
  out.frictionFactor = out.friction.factor;
  out.reynolds = (flux * pipe.diameter) / context.viscosity(t0);
  const arrival = temperatureFromEnthalpy(
    gas,
    h0 + run.heat / out.massFlow - STANDARD_GRAVITY * rise,
    pd,
    scratch.arrivalState,
    scratch.equationOfState,
  );
  out.arrivalTemperature = arrival;
  // One-sided differences in p0 and T0 of converged capacity solves, warm-started at this one.
  const dp = CAPACITY_STEP * p0;
  const dt = CAPACITY_STEP * t0;
  const probe = scratch.probe;
  capacityAt(pipe, p0 + dp, t0, pd, scratch, area, flux, probe);
  out.dMassFlowdUpstreamPressure = ((probe[0] as number) - out.massFlow) / dp;
  out.dArrivalTemperaturedUpstreamPressure = ((probe[1] as number) - arrival) / dp;
  capacityAt(pipe, p0, t0 + dt, pd, scratch, area, flux, probe);
  out.dMassFlowdUpstreamTemperature = ((probe[0] as number) - out.massFlow) / dt;
  out.dArrivalTemperaturedUpstreamTemperature = ((probe[1] as number) - arrival) / dt;
  out.dMassFlowdDownstreamPressure = 0;
  out.dArrivalTemperaturedDownstreamPressure = 0;
  if (gas.equationOfState !== undefined) {
    const s = gasState(gas, pd, arrival, scratch.state, scratch.equationOfState);
    out.dArrivalTemperaturedDownstreamPressure = -s.enthalpyPressureSlope / s.specificHeatCp;
  }
}

/**
 * Capacity [kg/s] and the arrival stagnation temperature at capacity (at the downstream plenum
 * pressure pd) for a plenum state (p0, T0), into `result` [capacity, arrival temperature].
 */
function capacityAt(
  pipe: PipeGeometry,
  p0: number,
  t0: number,
  pd: number,
  scratch: HeatTransferScratch,
  area: number,
  guess: number,
  result: Float64Array,
): void {
  const context = scratch.context;
  const gas = context.gas;
  const length = pipe.length;
  const plenum = gasState(gas, p0, t0, scratch.state, scratch.equationOfState);
  const kappa = (plenum.density * plenum.soundSpeed * plenum.soundSpeed) / p0;
  const gasConstant = p0 / (plenum.density * t0);
  const h0 = plenum.enthalpy;
  const dh0dp0 = plenum.enthalpyPressureSlope;
  const dh0dT0 = plenum.specificHeatCp;
  const reynoldsPerFlux = pipe.diameter / context.viscosity(t0);
  const friction = scratch.probeFriction;
  const entrance = scratch.entrance;
  const runAt = (flux: number, withSensitivities: boolean): PipeRun | undefined => {
    if (!isentropicEntrance(flux, p0, t0, kappa, gasConstant, entrance)) return undefined;
    scratch.closeEntranceEnergy(flux, p0, t0, h0, dh0dp0, dh0dT0);
    context.friction(context.pipe, flux * reynoldsPerFlux, friction);
    scratch.frictionPerLength = friction.value / length;
    scratch.inletPressure = entrance.pressure;
    scratch.inletTemperature = entrance.temperature;
    return scratch.integrate(length, flux, withSensitivities);
  };
  const largestFlux = (maxMassFluxParameter(kappa) * p0) / Math.sqrt(gasConstant * t0);
  const flux = capacityFlux(guess, largestFlux, length, runAt);
  const run = runAt(flux, false) as PipeRun;
  const massFlow = flux * area;
  result[0] = massFlow;
  result[1] = temperatureFromEnthalpy(
    gas,
    h0 + run.heat / massFlow - STANDARD_GRAVITY * scratch.slope * length,
    pd,
    scratch.arrivalState,
    scratch.equationOfState,
  );
}

/**
 * Creeping flow near zero: m = rho D^2 A (pz - pd) / (32 mu L) (Hagen-Poiseuille), pz the
 * zero-flow outlet pressure; the gas arrives at the surrounding temperature when the pipe
 * exchanges heat (its residence time is unbounded), otherwise with the upstream stagnation
 * enthalpy less the lift, h0 - g rise. Q = m (h0_out - h0_in + g rise) closes the first law.
 */
function setCreeping(
  pipe: PipeGeometry,
  gas: Gas,
  p0: number,
  t0: number,
  pd: number,
  zeroFlowPressure: number,
  mu: number,
  muSlope: number,
  area: number,
  exchange: HeatExchange,
  rise: number,
  state: ThermoState,
  out: PipeFlowEvaluation,
): void {
  const plenum = gasState(gas, p0, t0, state);
  const density = plenum.density;
  const h0 = plenum.enthalpy;
  const soundSpeed = plenum.soundSpeed;
  const conductance = (density * pipe.diameter * pipe.diameter * area) / (32 * mu * pipe.length);
  // A pd above the zero-flow pressure means the flow would run the other way (the caller picks
  // the upstream end by flowsForward in edge-flow.ts); in the narrow band where the two ends'
  // columns disagree, the flow is held at the creeping band's edge, of order 1e-10 of a flow.
  const drive = Math.max(zeroFlowPressure - pd, -CREEPING_PRESSURE_RATIO * p0);
  const massFlow = conductance * drive;
  const ratio = zeroFlowPressure / p0;
  out.choked = false;
  out.massFlow = massFlow;
  out.dMassFlowdUpstreamPressure = conductance * (ratio + drive / p0);
  out.dMassFlowdUpstreamTemperature = -massFlow * (1 / t0 + muSlope);
  out.dMassFlowdDownstreamPressure = -conductance;
  const mach = Math.abs(massFlow) / (area * density) / soundSpeed;
  out.inletMach = mach;
  out.outletMach = mach;
  out.inletPressure = p0;
  out.outletPressure = pd;
  out.inletTemperature = t0;
  const exchanging = exchange.heatTransferPerLength > 0;
  const arrival = exchanging
    ? exchange.surroundingTemperature
    : temperatureFromEnthalpy(gas, h0 - STANDARD_GRAVITY * rise, pd);
  out.outletTemperature = arrival;
  out.reynolds = (Math.abs(massFlow) * pipe.diameter) / (area * mu);
  out.frictionFactor = out.reynolds > 0 ? 64 / out.reynolds : 0;
  out.arrivalTemperature = arrival;
  const arrivalEnthalpy = gasState(gas, pd, arrival, state).enthalpy;
  out.heatFlow = Math.abs(massFlow) * (arrivalEnthalpy - h0 + STANDARD_GRAVITY * rise);
  out.dArrivalTemperaturedUpstreamPressure = 0;
  out.dArrivalTemperaturedUpstreamTemperature = exchanging ? 0 : 1;
  out.dArrivalTemperaturedDownstreamPressure = 0;
}

/**
 * The inverse: the exit state of a given mass flow from a plenum at (p0, T0), into `out`
 * (pressures, Mach numbers, temperatures, heat, arrival temperature at the exit pressure).
 * False when the flow cannot pass (the entrance or the pipe chokes before its end).
 *
 * @param rise - elevation of the downstream end minus the upstream end [m]
 */
export function heatTransferOutlet(
  pipe: PipeGeometry,
  thermoGas: Gas,
  viscosity: (temperature: number) => number,
  frictionLaw: (pipe: PipeGeometry, reynolds: number, out: FrictionScratch) => void,
  p0: number,
  t0: number,
  massFlow: number,
  rise: number,
  out: PipeFlowEvaluation,
): boolean {
  const scratch = scratchOf(out);
  const plenum = startRun(scratch, pipe, thermoGas, p0, t0, rise);
  const area = scratch.area;
  const kappa = plenum.kappa;
  const gasConstant = plenum.gasConstant;
  const h0 = plenum.enthalpy;
  const dh0dp0 = plenum.enthalpyPressureSlope;
  const dh0dT0 = plenum.specificHeatCp;
  const flux = massFlow / area;
  const entrance = scratch.entrance;
  if (!isentropicEntrance(flux, p0, t0, kappa, gasConstant, entrance)) return false;
  scratch.closeEntranceEnergy(flux, p0, t0, h0, dh0dp0, dh0dT0);
  const reynolds = (flux * pipe.diameter) / viscosity(t0);
  frictionLaw(pipe, reynolds, out.friction);
  scratch.frictionPerLength = out.friction.value / pipe.length;
  scratch.inletPressure = entrance.pressure;
  scratch.inletTemperature = entrance.temperature;
  const run = scratch.integrate(pipe.length, flux, false);
  if (run.sonic) return false;
  out.massFlow = massFlow;
  out.choked = false;
  out.reynolds = reynolds;
  out.frictionFactor = out.friction.factor;
  out.inletMach = entrance.mach;
  out.outletMach = run.mach;
  out.inletPressure = entrance.pressure;
  out.outletPressure = run.pressure;
  out.inletTemperature = entrance.temperature;
  out.outletTemperature = run.temperature;
  out.heatFlow = run.heat;
  out.arrivalTemperature = temperatureFromEnthalpy(
    thermoGas,
    h0 + run.heat / massFlow - STANDARD_GRAVITY * rise,
    run.pressure,
    scratch.arrivalState,
    scratch.equationOfState,
  );
  return true;
}
