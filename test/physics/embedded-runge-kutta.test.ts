import { describe, expect, it } from "vitest";
import { DormandPrinceIntegrator } from "../../src/physics/embedded-runge-kutta.js";

// Closed-form solutions of textbook ODEs (any ODE text, e.g. Hairer, Norsett and Wanner,
// Solving Ordinary Differential Equations I, 1993): the integrator's result must match them to a
// small multiple of its local tolerance times the number of steps (global error accumulates).

describe("DormandPrinceIntegrator", () => {
  it("integrates y' = -2 y to exp(-2 x) within its tolerance", () => {
    const integrator = new DormandPrinceIntegrator(1);
    integrator.tolerance = 1e-10;
    const end = integrator.integrate(
      (_x, y, slope) => {
        slope[0] = -2 * (y[0] as number);
        return true;
      },
      0,
      [1],
      3,
      0,
      1e-12,
      () => true,
    );
    expect(end).toBe("reached");
    expect(integrator.x).toBe(3);
    const exact = Math.exp(-6);
    // Relative error below (steps x tolerance): the global error of a stable linear problem.
    const bound = integrator.acceptedSteps * 1e-10;
    expect(Math.abs((integrator.y[0] as number) / exact - 1)).toBeLessThan(bound);
    // A 5th-order pair needs few steps: (1e-10)^(-1/5) = 100 per unit of the decay scale at most.
    expect(integrator.acceptedSteps).toBeLessThan(200);
  });

  it("integrates the harmonic oscillator to (cos x, -sin x) over five periods", () => {
    const integrator = new DormandPrinceIntegrator(2);
    integrator.tolerance = 1e-11;
    const end = integrator.integrate(
      (_x, y, slope) => {
        slope[0] = y[1] as number;
        slope[1] = -(y[0] as number);
        return true;
      },
      0,
      [1, 0],
      10 * Math.PI,
      0,
      1e-12,
      () => true,
    );
    expect(end).toBe("reached");
    // Absolute error against the unit amplitude: steps x tolerance (the phase error grows
    // linearly with the number of steps).
    const bound = integrator.acceptedSteps * 1e-11;
    expect(Math.abs((integrator.y[0] as number) - 1)).toBeLessThan(bound);
    expect(Math.abs(integrator.y[1] as number)).toBeLessThan(bound);
  });

  it("retries shorter steps before a point where the right-hand side is undefined and stops there", () => {
    // y' = 1 / (2 y), y(0) = 1: y = sqrt(1 + x); the right-hand side is refused beyond x = 0.5
    // (as the pipe model refuses states past the sonic point). The run ends just short of it.
    const integrator = new DormandPrinceIntegrator(1);
    integrator.tolerance = 1e-10;
    const end = integrator.integrate(
      (x, y, slope) => {
        if (x > 0.5) return false;
        slope[0] = 0.5 / (y[0] as number);
        return true;
      },
      0,
      [1],
      1,
      0,
      1e-9,
      () => true,
    );
    expect(end).toBe("step-too-small");
    expect(integrator.x).toBeLessThanOrEqual(0.5);
    expect(integrator.x).toBeGreaterThan(0.5 - 1e-8);
    expect(Math.abs((integrator.y[0] as number) - Math.sqrt(1 + integrator.x))).toBeLessThan(1e-9);
  });

  it("ends a run when the acceptance callback says so", () => {
    const integrator = new DormandPrinceIntegrator(1);
    const end = integrator.integrate(
      (_x, _y, slope) => {
        slope[0] = 1;
        return true;
      },
      0,
      [0],
      10,
      0.5,
      1e-9,
      (_x, y) => (y[0] as number) < 2,
    );
    expect(end).toBe("stopped");
    expect(integrator.y[0]).toBeGreaterThanOrEqual(2);
    expect(integrator.previousY[0]).toBeLessThan(2);
  });
});

describe("DormandPrinceIntegrator in the Lawson form for a stiff relaxation", () => {
  it("integrates y' = -lambda (y - 1) + cos x, lambda = 1e6, in few steps to its closed form", () => {
    // Closed form: u = y - 1 = (lambda cos x + sin x) / (lambda^2 + 1) + C exp(-lambda x),
    // C = u0 - lambda / (lambda^2 + 1). An explicit method would need steps below 3 / lambda
    // for stability: about a million steps over [0, 3]. This is the pipe's case: the gas
    // temperature relaxing to its surroundings under a slow forcing.
    const lambda = 1e6;
    const integrator = new DormandPrinceIntegrator(1);
    integrator.tolerance = 1e-10;
    integrator.rate[0] = 1;
    integrator.equilibrium[0] = 1;
    integrator.beforeStep = () => lambda;
    const end = integrator.integrate(
      (x, y, slope) => {
        slope[0] = -lambda * ((y[0] as number) - 1) + Math.cos(x);
        return true;
      },
      0,
      [2],
      3,
      0,
      1e-14,
      () => true,
    );
    expect(end).toBe("reached");
    // Far fewer than the explicit method's 3 lambda / 3 = 1e6 steps (the moving-equilibrium
    // Lawson step is first order in the remainder's change when lambda h is large: steps of
    // about sqrt(tolerance)).
    expect(integrator.acceptedSteps).toBeLessThan(1e5);
    const c = 1 - lambda / (lambda * lambda + 1);
    const exact =
      1 + (lambda * Math.cos(3) + Math.sin(3)) / (lambda * lambda + 1) + c * Math.exp(-3 * lambda);
    // Error against the solution's scale (1): steps x tolerance.
    expect(Math.abs((integrator.y[0] as number) - exact)).toBeLessThan(
      integrator.acceptedSteps * 1e-10,
    );
  });
});
