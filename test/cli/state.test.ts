import { describe, expect, test } from "vitest";
import { lines, runCli } from "./run-cli.js";

// Hand calculation for air as an ideal, calorically perfect gas (closed forms, common practice):
/** Molar gas constant, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010, 2021). */
const RU = 8.314462618;
/** Molar mass of dry air, ISO 2533:1975: 28.96442 kg/kmol. */
const R_AIR = RU / 0.02896442;
/** Heat capacity ratio of air: 1.4 (ISO 2533:1975 uses kappa = 1.4). */
const GAMMA = 1.4;
/** Celsius scale: T [K] = t [degC] + 273.15. */
const celsius = (t: number) => t + 273.15;

/** Closed forms evaluated two ways in double precision: rounding only. */
const CLOSED_FORM = 1e-12;

function expectRelative(actual: unknown, expected: number, tolerance: number): void {
  expect(typeof actual).toBe("number");
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(
    tolerance * Math.abs(expected),
  );
}

async function stateJson(args: string[]): Promise<Record<string, number | null>> {
  const run = await runCli(["state", "--gas", "air", ...args, "--format", "json"]);
  expect(run.stderr).toBe("");
  expect(run.code).toBe(0);
  return JSON.parse(run.stdout) as Record<string, number | null>;
}

describe("machnet state: static pressure and temperature with one flow quantity", () => {
  const pressure = 101325;
  const temperature = 288.15;
  const mach = 0.5;

  test("air at 101325 Pa, 288.15 K, Mach 0.5 matches the hand calculation", async () => {
    const state = await stateJson([
      "--pressure",
      "101325 Pa",
      "--temperature",
      "288.15 K",
      "--mach",
      "0.5",
    ]);
    expect(Object.keys(state)).toEqual([
      "density",
      "speedOfSound",
      "mach",
      "velocity",
      "stagnationTemperature",
      "stagnationPressure",
    ]);
    const a = Math.sqrt(GAMMA * R_AIR * temperature);
    expectRelative(state.speedOfSound, a, CLOSED_FORM);
    expectRelative(state.density, pressure / (R_AIR * temperature), CLOSED_FORM);
    expectRelative(state.mach, mach, CLOSED_FORM);
    expectRelative(state.velocity, mach * a, CLOSED_FORM);
    expectRelative(state.stagnationTemperature, temperature * (1 + 0.2 * mach ** 2), CLOSED_FORM);
    expectRelative(state.stagnationPressure, pressure * (1 + 0.2 * mach ** 2) ** 3.5, CLOSED_FORM);
  });

  test("p / p0 at Mach 0.5 is the isentropic table value 0.8430", async () => {
    // NACA Report 1135 (Ames Research Staff, 1953), Table I, gamma 1.4, M 0.50: p/p0 = 0.8430
    // (PRACTICE.md 7.1). Tolerance: half a unit in the fourth digit.
    const state = await stateJson([
      "--pressure",
      "101325 Pa",
      "--temperature",
      "288.15 K",
      "--mach",
      "0.5",
    ]);
    expect(Math.abs(pressure / (state.stagnationPressure as number) - 0.843)).toBeLessThanOrEqual(
      5e-5,
    );
  });

  test("the sea-level state has the ISO 2533 density and speed of sound", async () => {
    // ISO 2533:1975 sea level: rho 1.2250 kg/m3 (tolerance: half a unit in the last printed
    // digit), a 340.294 m/s (computed there with Ru = 8.31432, 9e-6 lower: tolerance 2e-5).
    const state = await stateJson([
      "--pressure",
      "1 atm",
      "--temperature",
      "15 degC",
      "--velocity",
      "0 m/s",
    ]);
    expect(Math.abs((state.density as number) - 1.225)).toBeLessThanOrEqual(5e-5);
    expectRelative(state.speedOfSound, 340.294, 2e-5);
    expect(state.mach).toBe(0);
    expectRelative(state.stagnationPressure, 101325, CLOSED_FORM);
  });

  test("--velocity gives Mach v / a", async () => {
    const state = await stateJson([
      "--pressure",
      "6 bar(g)",
      "--temperature",
      "25 degC",
      "--velocity",
      "20 m/s",
    ]);
    const t = celsius(25);
    expectRelative(state.mach, 20 / Math.sqrt(GAMMA * R_AIR * t), CLOSED_FORM);
    expectRelative(state.density, (6e5 + 101325) / (R_AIR * t), CLOSED_FORM);
  });

  test("--mass-flux gives v = G / rho", async () => {
    const state = await stateJson([
      "--pressure",
      "6 bar(g)",
      "--temperature",
      "25 degC",
      "--mass-flux",
      "150 kg/(m2 s)",
    ]);
    const t = celsius(25);
    const density = (6e5 + 101325) / (R_AIR * t);
    expectRelative(state.velocity, 150 / density, CLOSED_FORM);
    expectRelative(state.mach, 150 / density / Math.sqrt(GAMMA * R_AIR * t), CLOSED_FORM);
  });

  test("--mass-flux in US units reads through the unit library: 30 lb/(ft2 s)", async () => {
    // 1 lb = 0.45359237 kg, 1 ft = 0.3048 m (1959 international yard and pound).
    const flux = (30 * 0.45359237) / 0.3048 ** 2;
    const metric = await stateJson([
      "--pressure",
      "1 atm",
      "--temperature",
      "0 degC",
      "--mass-flux",
      `${flux} kg/(m2 s)`,
    ]);
    const us = await stateJson([
      "--pressure",
      "1 atm",
      "--temperature",
      "0 degC",
      "--mass-flux",
      "30 lb/(ft2 s)",
    ]);
    expectRelative(us.velocity, metric.velocity as number, CLOSED_FORM);
  });

  test("the table shows the values with units and marks the given ones", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--pressure",
      "101325 Pa",
      "--temperature",
      "288.15 K",
      "--mach",
      "0.5",
    ]);
    expect(run.code).toBe(0);
    const rows = lines(run.stdout).map((line) => line.trim().split(/\s{2,}/));
    expect(rows).toContainEqual(["static pressure", "1.01325", "bar(a)", "given"]);
    expect(rows).toContainEqual(["static temperature", "15.000", "°C", "given"]);
    // a = 340.297 m/s by the hand calculation above, shown to 5 digits.
    expect(rows).toContainEqual(["speed of sound", "340.30", "m/s"]);
    expect(rows).toContainEqual(["Mach number", "0.50000", "given"]);
    expect(lines(run.stdout).at(-1)).toMatch(/^Results are engineering estimates;/);
  });
});

describe("machnet state: stagnation temperature and static temperature", () => {
  test("Mach from M = sqrt(2 / (gamma - 1) (T0 / T - 1)); no pressure, no density", async () => {
    const state = await stateJson([
      "--stagnation-temperature",
      "20 degC",
      "--temperature",
      "10 degC",
    ]);
    const t0 = celsius(20);
    const t = celsius(10);
    const mach = Math.sqrt((2 / (GAMMA - 1)) * (t0 / t - 1));
    expectRelative(state.mach, mach, CLOSED_FORM);
    expectRelative(state.velocity, mach * Math.sqrt(GAMMA * R_AIR * t), CLOSED_FORM);
    expect(state.density).toBeNull();
    expect(state.stagnationPressure).toBeNull();
  });

  test("T / T0 = 0.95238 is Mach 0.5 (NACA Report 1135, Table I)", async () => {
    // Table value printed to 5 digits: M is then good to 5e-6 / |d(T/T0)/dM| = 2.8e-5.
    const state = await stateJson([
      "--stagnation-temperature",
      `${288.15 / 0.95238} K`,
      "--temperature",
      "288.15 K",
    ]);
    expect(Math.abs((state.mach as number) - 0.5)).toBeLessThanOrEqual(5e-5);
  });

  test("with --pressure also density and p0 = p (T0 / T)^(gamma / (gamma - 1))", async () => {
    const state = await stateJson([
      "--stagnation-temperature",
      "20 degC",
      "--temperature",
      "10 degC",
      "--pressure",
      "5 bar(a)",
    ]);
    const ratio = celsius(20) / celsius(10);
    expectRelative(state.stagnationPressure, 5e5 * ratio ** 3.5, CLOSED_FORM);
    expectRelative(state.density, 5e5 / (R_AIR * celsius(10)), CLOSED_FORM);
  });

  test("a static temperature above the stagnation temperature is exit 2", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--stagnation-temperature",
      "20 degC",
      "--temperature",
      "30 degC",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      "--temperature: the static temperature 303.150 K is above the stagnation temperature 293.150 K; in adiabatic flow T <= T0\n",
    );
  });
});

describe("machnet state: stagnation state and static pressure", () => {
  test("p / p0 = 0.84302 is Mach 0.5 and T = T0 / 1.05", async () => {
    // NACA Report 1135, Table I, M 0.50: p/p0 = 0.84302 (5 digits: M good to 5e-6 / 0.56 = 1e-5).
    const state = await stateJson([
      "--stagnation-temperature",
      "20 degC",
      "--stagnation-pressure",
      "8 bar(a)",
      "--pressure",
      `${8 * 0.84302} bar(a)`,
    ]);
    expect(Math.abs((state.mach as number) - 0.5)).toBeLessThanOrEqual(2e-5);
    expect(Math.abs((state.temperature as number) - celsius(20) / 1.05)).toBeLessThanOrEqual(1e-3);
    expectRelative(state.stagnationPressure, 8e5, CLOSED_FORM);
  });

  test("round trip: the static state with its computed Mach gives back p0 and T0", async () => {
    const first = await stateJson([
      "--stagnation-temperature",
      "40 degC",
      "--stagnation-pressure",
      "3 bar(a)",
      "--pressure",
      "2 bar(a)",
    ]);
    const back = await stateJson([
      "--pressure",
      "2 bar(a)",
      "--temperature",
      `${first.temperature} K`,
      "--mach",
      `${first.mach}`,
    ]);
    expectRelative(back.stagnationPressure, 3e5, 1e-12);
    expectRelative(back.stagnationTemperature, celsius(40), 1e-12);
  });

  test("a static pressure above the stagnation pressure is exit 2", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--stagnation-temperature",
      "20 degC",
      "--stagnation-pressure",
      "2 bar(a)",
      "--pressure",
      "3 bar(a)",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      "--pressure: the static pressure 300000 Pa is above the stagnation pressure 200000 Pa; in isentropic flow p <= p0\n",
    );
  });
});

describe("machnet state: wrong calls exit 2 with a message", () => {
  const MODES =
    "give either --pressure and --temperature (static) with one of --velocity, --mach, --mass-flux; or --stagnation-temperature with --temperature (static; --pressure optional); or --stagnation-temperature, --stagnation-pressure and --pressure (static)";

  test.each([
    [["--pressure", "6 bar(g)"], "not enough to go on"],
    [["--pressure", "6 bar(g)", "--mach", "0.3"], "--mach also needs --temperature"],
    [
      [
        "--pressure",
        "6 bar(g)",
        "--temperature",
        "20 degC",
        "--mach",
        "0.3",
        "--velocity",
        "20 m/s",
      ],
      "give only one of --velocity, --mach, --mass-flux (got --velocity, --mach)",
    ],
    [
      [
        "--pressure",
        "6 bar(g)",
        "--temperature",
        "20 degC",
        "--mach",
        "0.3",
        "--stagnation-temperature",
        "30 degC",
      ],
      "--stagnation-temperature cannot be combined with --mach",
    ],
    [
      [
        "--stagnation-pressure",
        "8 bar(a)",
        "--stagnation-temperature",
        "20 degC",
        "--pressure",
        "7 bar(a)",
        "--temperature",
        "15 degC",
      ],
      "--temperature cannot be combined with --stagnation-pressure (the static temperature is computed from it)",
    ],
    [
      ["--stagnation-pressure", "8 bar(a)", "--pressure", "7 bar(a)"],
      "--stagnation-pressure also needs --stagnation-temperature",
    ],
  ])("%j", async (args, problem) => {
    const run = await runCli(["state", "--gas", "air", ...args]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(`state: ${problem}; ${MODES}\n`);
    expect(run.stdout).toBe("");
  });

  test("an unknown gas lists the presets", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "xenon",
      "--pressure",
      "1 atm",
      "--temperature",
      "20 degC",
      "--mach",
      "0.1",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      '--gas: unknown gas "xenon"; presets: air, nitrogen, oxygen, argon, helium, hydrogen, carbon-dioxide, methane, natural-gas\n',
    );
  });

  test("a missing --gas is exit 2", async () => {
    const run = await runCli([
      "state",
      "--pressure",
      "1 atm",
      "--temperature",
      "20 degC",
      "--mach",
      "0.1",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/required option '--gas <name>' not specified/);
  });

  test("a quantity that cannot be read names the flag", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--pressure",
      "6 bra",
      "--temperature",
      "20 degC",
      "--mach",
      "0.1",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/^--pressure: unknown unit "bra" \(got "6 bra"\); pressure units: /);
    expect(lines(run.stderr)).toHaveLength(1);
  });

  test("a Mach number with a unit is refused", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--pressure",
      "1 atm",
      "--temperature",
      "20 degC",
      "--mach",
      "0.5 m",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      '--mach: must be a plain number such as "0.5", without a unit (got "0.5 m")\n',
    );
  });

  test("a negative velocity is refused", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--pressure",
      "1 atm",
      "--temperature",
      "20 degC",
      "--velocity",
      "-5 m/s",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe("--velocity: must be 0 or more (got -5 m/s)\n");
  });

  test("a gauge ambient pressure is refused", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--pressure",
      "1 bar(g)",
      "--temperature",
      "20 degC",
      "--mach",
      "0.1",
      "--ambient-pressure",
      "0 bar(g)",
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(
      /^--ambient-pressure: the reference of gauge pressures must be absolute/,
    );
  });

  test("--ambient-pressure moves gauge readings", async () => {
    const state = await stateJson([
      "--pressure",
      "1 bar(g)",
      "--temperature",
      "0 degC",
      "--velocity",
      "0 m/s",
      "--ambient-pressure",
      "0.95 bar(a)",
    ]);
    expectRelative(state.stagnationPressure, 1.95e5, CLOSED_FORM);
  });

  test("a bare bar is read as absolute with a note on standard error", async () => {
    const run = await runCli([
      "state",
      "--gas",
      "air",
      "--pressure",
      "6 bar",
      "--temperature",
      "20 degC",
      "--mach",
      "0",
      "--format",
      "json",
    ]);
    expect(run.code).toBe(0);
    expect(run.stderr).toMatch(/^note: --pressure: "6 bar" was read as an absolute pressure/);
    expectRelative(
      (JSON.parse(run.stdout) as { stagnationPressure: number }).stagnationPressure,
      6e5,
      CLOSED_FORM,
    );
  });
});
