/**
 * An adaptive, error-controlled integrator of y' = f(x, y): the Dormand-Prince 5(4) embedded
 * Runge-Kutta pair, for the pipe models that integrate along the pipe.
 *
 * Why our own and not a package: the npm registry's maintained ODE package, `odex` (2.0.4, Hairer's
 * Gragg-Bulirsch-Stoer extrapolation), takes a right-hand side that returns a new array on every
 * call and allocates per step; a pipe model here runs this integration once per pipe per Newton
 * evaluation, so the right-hand side writes into a typed array and nothing is allocated per step.
 * The pipe models also need to stop a step that would cross a singular point (the sonic point,
 * where the right-hand side cannot be evaluated) and to integrate sensitivities with the same
 * steps as the state, with the error control on the state only; both are a few lines here.
 *
 * Method: J. R. Dormand and P. J. Prince, "A family of embedded Runge-Kutta formulae", Journal of
 * Computational and Applied Mathematics 6 (1980) 19-26 (the RK5(4)7M coefficients); step-size
 * control as in E. Hairer, S. P. Norsett and G. Wanner, Solving Ordinary Differential Equations I,
 * 2nd ed., Springer 1993, section II.4 (safety factor 0.9, step growth between 0.2 and 5).
 * @module
 */

/**
 * Right-hand side: write y'(x) into `slope`; return false when f cannot be evaluated at (x, y)
 * (outside its domain), and the step is then retried shorter.
 */
export type RightHandSide = (x: number, y: Float64Array, slope: Float64Array) => boolean;

/** How an integration ended. */
export type IntegrationEnd = "reached" | "stopped" | "step-too-small" | "too-many-steps";

// Dormand-Prince 5(4) tableau.
const C2 = 1 / 5;
const C3 = 3 / 10;
const C4 = 4 / 5;
const C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40;
const A32 = 9 / 40;
const A41 = 44 / 45;
const A42 = -56 / 15;
const A43 = 32 / 9;
const A51 = 19372 / 6561;
const A52 = -25360 / 2187;
const A53 = 64448 / 6561;
const A54 = -212 / 729;
const A61 = 9017 / 3168;
const A62 = -355 / 33;
const A63 = 46732 / 5247;
const A64 = 49 / 176;
const A65 = -5103 / 18656;
const A71 = 35 / 384;
const A73 = 500 / 1113;
const A74 = 125 / 192;
const A75 = -2187 / 6784;
const A76 = 11 / 84;
// Error coefficients: fifth-order weights minus the embedded fourth-order ones.
const E1 = 71 / 57600;
const E3 = -71 / 16695;
const E4 = 71 / 1920;
const E5 = -17253 / 339200;
const E6 = 22 / 525;
const E7 = -1 / 40;

/**
 * A reusable Dormand-Prince 5(4) integrator for a system of fixed dimension. All work arrays are
 * allocated once, in the constructor.
 */
export class DormandPrinceIntegrator {
  readonly dimension: number;
  /** Number of leading components that the error control looks at (the rest ride along). */
  controlled: number;
  /** Error scale per controlled component: the error allowed is tolerance * max(scale, |y|). */
  readonly scale: Float64Array;
  /** Relative tolerance of the local error per step [-]. */
  tolerance = 1e-10;
  /** Largest number of steps (accepted and rejected). */
  maxSteps = 100000;
  /** Accepted and rejected steps and right-hand-side evaluations of the last run. */
  acceptedSteps = 0;
  rejectedSteps = 0;
  evaluations = 0;
  /** Position and state at the end of the last run. */
  x = 0;
  readonly y: Float64Array;
  /** Position and state before the last accepted step. */
  previousX = 0;
  readonly previousY: Float64Array;
  /** Slope at the end of the last run (first-same-as-last). */
  readonly slope: Float64Array;
  private readonly k2: Float64Array;
  private readonly k3: Float64Array;
  private readonly k4: Float64Array;
  private readonly k5: Float64Array;
  private readonly k6: Float64Array;
  private readonly k7: Float64Array;
  private readonly stage: Float64Array;
  private readonly next: Float64Array;
  private readonly n1: Float64Array;
  private readonly error: Float64Array;
  /**
   * Components that relax towards an equilibrium at a common, large rate (a stiff linear decay,
   * such as a gas temperature approaching its surroundings): 1 for those, 0 for the others. For
   * them the step is taken in the Lawson (integrating-factor) form, so that the step length is
   * set by accuracy, not by the explicit method's stability limit of about 3 / rate.
   * Source: J. D. Lawson, "Generalized Runge-Kutta processes for stable systems with large
   * Lipschitz constants", SIAM J. Numer. Anal. 4 (1967) 372-380.
   */
  readonly rate: Float64Array;
  /** Equilibrium of each relaxing component in the current step (set by the step itself). */
  readonly equilibrium: Float64Array;
  /** The common relaxation rate lambda [1/unit of x] of the current step (0: none). */
  relaxationRate = 0;
  /** Called before each step with the current point: returns the relaxation rate to use. */
  beforeStep: ((x: number, y: Float64Array) => number) | undefined = undefined;

  constructor(dimension: number, controlled = dimension) {
    this.dimension = dimension;
    this.controlled = controlled;
    this.scale = new Float64Array(dimension).fill(1);
    this.y = new Float64Array(dimension);
    this.previousY = new Float64Array(dimension);
    this.slope = new Float64Array(dimension);
    this.k2 = new Float64Array(dimension);
    this.k3 = new Float64Array(dimension);
    this.k4 = new Float64Array(dimension);
    this.k5 = new Float64Array(dimension);
    this.k6 = new Float64Array(dimension);
    this.k7 = new Float64Array(dimension);
    this.stage = new Float64Array(dimension);
    this.next = new Float64Array(dimension);
    this.n1 = new Float64Array(dimension);
    this.error = new Float64Array(dimension);
    this.rate = new Float64Array(dimension);
    this.equilibrium = new Float64Array(dimension);
  }

  /**
   * Integrate from (x0, y0) to xEnd > x0. After each accepted step `accept(x, y)` is called; when
   * it returns false the run ends there ("stopped"). A step whose right-hand side cannot be
   * evaluated is retried at a quarter of its length; below `minStep` the run ends
   * ("step-too-small") at the last accepted point.
   *
   * @param firstStep - a first step length, or 0 to choose one from the slope and the scales
   */
  integrate(
    f: RightHandSide,
    x0: number,
    y0: ArrayLike<number>,
    xEnd: number,
    firstStep: number,
    minStep: number,
    accept: (x: number, y: Float64Array) => boolean,
  ): IntegrationEnd {
    const n = this.dimension;
    const { y, slope, k7, next, scale } = this;
    for (let i = 0; i < n; i++) y[i] = y0[i] as number;
    this.acceptedSteps = 0;
    this.rejectedSteps = 0;
    this.evaluations = 1;
    this.x = x0;
    this.previousX = x0;
    this.previousY.set(y);
    if (!f(x0, y, slope)) return "step-too-small";
    const span = xEnd - x0;
    let h = firstStep;
    if (!(h > 0)) {
      // A first step that changes no controlled component by more than 1e-2 of its scale.
      let rate = 0;
      for (let i = 0; i < this.controlled; i++) {
        const s = Math.max(scale[i] as number, Math.abs(y[i] as number));
        rate = Math.max(rate, Math.abs(slope[i] as number) / s);
      }
      h = rate > 0 ? 1e-2 / rate : span;
    }
    h = Math.min(h, span);
    let x = x0;
    let lastRejected = false;
    for (let step = 0; step < this.maxSteps; step++) {
      if (x + h > xEnd || xEnd - (x + h) < 1e-12 * span) h = xEnd - x;
      if (this.beforeStep !== undefined) this.relaxationRate = this.beforeStep(x, y);
      const ok = this.trialStep(f, x, h);
      if (!ok) {
        this.rejectedSteps++;
        h *= 0.25;
        lastRejected = true;
        if (h < minStep) return "step-too-small";
        continue;
      }
      // Error norm: largest error over tolerance times scale (the max norm).
      let error = 0;
      for (let i = 0; i < this.controlled; i++) {
        const e = this.error[i] as number;
        const s = Math.max(
          scale[i] as number,
          Math.abs(y[i] as number),
          Math.abs(next[i] as number),
        );
        error = Math.max(error, Math.abs(e) / (this.tolerance * s));
      }
      if (!(error <= 1)) {
        this.rejectedSteps++;
        const factor = Number.isFinite(error) ? Math.max(0.2, 0.9 * error ** -0.2) : 0.2;
        h *= factor;
        lastRejected = true;
        if (h < minStep) return "step-too-small";
        continue;
      }
      this.previousX = x;
      this.previousY.set(y);
      x = x + h === xEnd || xEnd - (x + h) < 1e-12 * span ? xEnd : x + h;
      y.set(next);
      slope.set(k7);
      this.x = x;
      this.acceptedSteps++;
      if (!accept(x, y)) return "stopped";
      if (x >= xEnd) return "reached";
      let factor = error > 0 ? 0.9 * error ** -0.2 : 5;
      factor = Math.min(lastRejected ? 1 : 5, Math.max(0.2, factor));
      lastRejected = false;
      h *= factor;
    }
    return "too-many-steps";
  }

  /**
   * One step of length h from (x, y) with y'(x) in `slope`: the 5th-order result in `next`, the
   * error estimate in `error`. Relaxing components (see {@link relaxing}) take the Lawson form:
   * u = y - e, u' = -lambda u + N, each stage and the result written with exp(-lambda c h) factors
   * so that the decay is exact and only N is integrated by the Runge-Kutta weights.
   */
  private trialStep(f: RightHandSide, x: number, h: number): boolean {
    const n = this.dimension;
    const { y, slope: k1, k2, k3, k4, k5, k6, k7, stage, next, rate, equilibrium } = this;
    const lambda = this.relaxationRate;
    // Decay factors exp(-lambda d h) for the stage offsets d = c_i - c_j that occur.
    const e2 = this.decay(lambda * h, C2);
    const e3 = this.decay(lambda * h, C3);
    const e32 = this.decay(lambda * h, C3 - C2);
    const e4 = this.decay(lambda * h, C4);
    const e42 = this.decay(lambda * h, C4 - C2);
    const e43 = this.decay(lambda * h, C4 - C3);
    const e5 = this.decay(lambda * h, C5);
    const e52 = this.decay(lambda * h, C5 - C2);
    const e53 = this.decay(lambda * h, C5 - C3);
    const e54 = this.decay(lambda * h, C5 - C4);
    const e6 = this.decay(lambda * h, 1);
    const e62 = this.decay(lambda * h, 1 - C2);
    const e63 = this.decay(lambda * h, 1 - C3);
    const e64 = this.decay(lambda * h, 1 - C4);
    const e65 = this.decay(lambda * h, 1 - C5);
    const n1 = this.n1;
    for (let i = 0; i < n; i++) {
      // The equilibrium of this step: where the linear decay balances the slope at the step's
      // start, e = y + y'/lambda. Then N = y' + lambda (y - e) is 0 at the start and only its
      // change over the step is integrated by the weights (a Lawson step about a moving
      // equilibrium: accurate also when lambda h is large, where the plain Lawson form is not).
      if ((rate[i] as number) > 0 && lambda > 0) {
        equilibrium[i] = (y[i] as number) + (k1[i] as number) / lambda;
        n1[i] = 0;
      } else {
        n1[i] = k1[i] as number;
      }
    }
    for (let i = 0; i < n; i++) {
      stage[i] = this.base(i, e2) + h * A21 * this.pick(i, e2) * (n1[i] as number);
    }
    this.evaluations++;
    if (!f(x + C2 * h, stage, k2)) return false;
    this.toRemainder(k2, lambda);
    for (let i = 0; i < n; i++) {
      stage[i] =
        this.base(i, e3) +
        h *
          (A31 * this.pick(i, e3) * (n1[i] as number) +
            A32 * this.pick(i, e32) * (k2[i] as number));
    }
    this.evaluations++;
    if (!f(x + C3 * h, stage, k3)) return false;
    this.toRemainder(k3, lambda);
    for (let i = 0; i < n; i++) {
      stage[i] =
        this.base(i, e4) +
        h *
          (A41 * this.pick(i, e4) * (n1[i] as number) +
            A42 * this.pick(i, e42) * (k2[i] as number) +
            A43 * this.pick(i, e43) * (k3[i] as number));
    }
    this.evaluations++;
    if (!f(x + C4 * h, stage, k4)) return false;
    this.toRemainder(k4, lambda);
    for (let i = 0; i < n; i++) {
      stage[i] =
        this.base(i, e5) +
        h *
          (A51 * this.pick(i, e5) * (n1[i] as number) +
            A52 * this.pick(i, e52) * (k2[i] as number) +
            A53 * this.pick(i, e53) * (k3[i] as number) +
            A54 * this.pick(i, e54) * (k4[i] as number));
    }
    this.evaluations++;
    if (!f(x + C5 * h, stage, k5)) return false;
    this.toRemainder(k5, lambda);
    for (let i = 0; i < n; i++) {
      stage[i] =
        this.base(i, e6) +
        h *
          (A61 * this.pick(i, e6) * (n1[i] as number) +
            A62 * this.pick(i, e62) * (k2[i] as number) +
            A63 * this.pick(i, e63) * (k3[i] as number) +
            A64 * this.pick(i, e64) * (k4[i] as number) +
            A65 * this.pick(i, e65) * (k5[i] as number));
    }
    this.evaluations++;
    if (!f(x + h, stage, k6)) return false;
    this.toRemainder(k6, lambda);
    // c6 = c7 = 1: the result's weights on stage 6 carry no decay.
    for (let i = 0; i < n; i++) {
      next[i] =
        this.base(i, e6) +
        h *
          (A71 * this.pick(i, e6) * (n1[i] as number) +
            A73 * this.pick(i, e63) * (k3[i] as number) +
            A74 * this.pick(i, e64) * (k4[i] as number) +
            A75 * this.pick(i, e65) * (k5[i] as number) +
            A76 * (k6[i] as number));
    }
    this.evaluations++;
    if (!f(x + h, next, k7)) return false;
    const error = this.error;
    for (let i = 0; i < this.controlled; i++) {
      const n7 =
        (k7[i] as number) +
        ((rate[i] as number) > 0 ? lambda * ((next[i] as number) - (equilibrium[i] as number)) : 0);
      error[i] =
        h *
        (E1 * this.pick(i, e6) * (n1[i] as number) +
          E3 * this.pick(i, e63) * (k3[i] as number) +
          E4 * this.pick(i, e64) * (k4[i] as number) +
          E5 * this.pick(i, e65) * (k5[i] as number) +
          E6 * (k6[i] as number) +
          E7 * n7);
    }
    return true;
  }

  /** exp(-lambda h d), 1 without relaxation. */
  private decay(lambdaStep: number, offset: number): number {
    return lambdaStep > 0 ? Math.exp(-lambdaStep * offset) : 1;
  }

  /** Turn the slopes k of the stage in `stage` into N = k + lambda (y - e) for relaxing parts. */
  private toRemainder(k: Float64Array, lambda: number): void {
    const { rate, stage, equilibrium } = this;
    for (let i = 0; i < this.dimension; i++) {
      if ((rate[i] as number) > 0) {
        k[i] = (k[i] as number) + lambda * ((stage[i] as number) - (equilibrium[i] as number));
      }
    }
  }

  /** Start value of component i for a stage at decay factor `factor`: e + factor (y - e). */
  private base(i: number, factor: number): number {
    const y = this.y[i] as number;
    if (!((this.rate[i] as number) > 0)) return y;
    const e = this.equilibrium[i] as number;
    return e + factor * (y - e);
  }

  /** The decay factor for a relaxing component, 1 for the others. */
  private pick(i: number, factor: number): number {
    return (this.rate[i] as number) > 0 ? factor : 1;
  }
}
