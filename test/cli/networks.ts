/**
 * Small networks invented for the command-line tests (not taken from any published problem).
 */

/** A receiver at 7 bar(g) feeding two consumers through a tee. */
export const TWO_CONSUMERS = {
  name: "receiver and two consumers",
  gas: { preset: "air" },
  nodes: [
    { id: "REC", kind: "reservoir", pressure: "7 bar(g)", temperature: "25 degC" },
    { id: "TEE", kind: "junction" },
    { id: "SHOP", kind: "junction", demand: "300 kg/h" },
    { id: "PAINT", kind: "junction", demand: "150 kg/h" },
  ],
  edges: [
    { id: "MAIN", kind: "pipe", from: "REC", to: "TEE", length: "60 m", diameter: "52.5 mm" },
    { id: "B1", kind: "pipe", from: "TEE", to: "SHOP", length: "25 m", diameter: "40.9 mm" },
    { id: "B2", kind: "pipe", from: "TEE", to: "PAINT", length: "35 m", diameter: "26.6 mm" },
  ],
};

/**
 * A short vent pipe from 8 bar(a) to the atmosphere. The pressure ratio 8 / 1.01325 = 7.9 is far
 * above 1 / 0.528 = 1.89, the ratio that chokes an isentropic nozzle in air (common practice), and
 * a pipe of L / D = 80 adds too little friction to keep its exit subsonic: it chokes.
 */
export const VENT = {
  name: "vent",
  nodes: [
    { id: "HP", kind: "reservoir", pressure: "8 bar(a)", temperature: "20 degC" },
    { id: "ATM", kind: "reservoir", pressure: "1.01325 bar(a)", temperature: "20 degC" },
  ],
  edges: [{ id: "VENT", kind: "pipe", from: "HP", to: "ATM", length: "2 m", diameter: "25 mm" }],
};

/** The same network with one Newton iteration allowed: the solve cannot finish. */
export const ONE_ITERATION = { ...TWO_CONSUMERS, settings: { maxIterations: 1 } };

export function json(document: unknown): string {
  return JSON.stringify(document, null, 2);
}

/**
 * 1 kg/s asked through 100 m of 20 mm pipe from 3 bar(a), 20 degC. Even a frictionless nozzle of
 * that bore would pass at most 0.0404 p0 A / sqrt(T0) = 0.0404 x 3e5 Pa x 3.14e-4 m2 / 17.12 =
 * 0.22 kg/s (Fliegner's formula for choked air, SI units; common practice), and the pipe's
 * friction lowers that further: the demand cannot be met.
 */
export const OVERLOADED = {
  name: "overloaded",
  nodes: [
    { id: "S", kind: "reservoir", pressure: "3 bar(a)", temperature: "20 degC" },
    { id: "U", kind: "junction", demand: "1 kg/s" },
  ],
  edges: [{ id: "P", kind: "pipe", from: "S", to: "U", length: "100 m", diameter: "20 mm" }],
};
