/**
 * Small networks invented for the study tests (no published problem behind any of them).
 */
import type { NetworkDocument } from "../../src/input/document-types.js";

/** A receiver at 7 bar(g) feeding a tee and two consumers; all SI numbers but the pressure. */
export const BRANCH: NetworkDocument = {
  name: "receiver, tee and two consumers",
  gas: { preset: "air" },
  settings: { limits: { minPressure: "6.5 bar(g)", maxVelocity: "20 m/s" } },
  nodes: [
    { id: "REC", kind: "reservoir", pressure: "7 bar(g)", temperature: "25 degC" },
    { id: "TEE", kind: "junction" },
    { id: "SHOP", kind: "junction", demand: "300 kg/h" },
    { id: "PAINT", kind: "junction", demand: "150 kg/h" },
  ],
  edges: [
    { id: "MAIN", kind: "pipe", from: "REC", to: "TEE", length: 60, diameter: 0.05248 },
    { id: "B1", kind: "pipe", from: "TEE", to: "SHOP", length: 25, diameter: 0.04089 },
    { id: "B2", kind: "pipe", from: "TEE", to: "PAINT", length: 35, diameter: 0.02664 },
  ],
};

/**
 * A small ring fed at one corner from a receiver, with three consumers, one of them on a drop:
 * flows split round the loop.
 */
export const RING: NetworkDocument = {
  name: "small ring",
  gas: { preset: "air" },
  settings: { limits: { minPressure: "6 bar(g)" } },
  nodes: [
    { id: "REC", kind: "reservoir", pressure: "7 bar(g)", temperature: "30 degC" },
    { id: "A", kind: "junction" },
    { id: "B", kind: "junction", demand: "400 kg/h" },
    { id: "C", kind: "junction", demand: "250 kg/h" },
    { id: "D", kind: "junction" },
    { id: "TOOL", kind: "junction", demand: "120 kg/h" },
  ],
  edges: [
    {
      id: "FEED",
      kind: "pipe",
      from: "REC",
      to: "A",
      length: 30,
      diameter: 0.07792,
      minorLoss: 1.5,
    },
    { id: "AB", kind: "pipe", from: "A", to: "B", length: 40, diameter: 0.05248 },
    { id: "BC", kind: "pipe", from: "B", to: "C", length: 35, diameter: 0.05248 },
    { id: "CD", kind: "pipe", from: "C", to: "D", length: 40, diameter: 0.05248 },
    { id: "DA", kind: "pipe", from: "D", to: "A", length: 35, diameter: 0.05248 },
    {
      id: "DROP",
      kind: "pipe",
      from: "D",
      to: "TOOL",
      length: 12,
      diameter: 0.02664,
      minorLoss: 3,
    },
  ],
};

/**
 * Two relief discharges (injections at their own temperatures) into a header that vents to
 * atmosphere through a tailpipe.
 */
export const VENT_HEADER: NetworkDocument = {
  name: "two reliefs into a vent header",
  gas: { preset: "nitrogen" },
  nodes: [
    { id: "RV-1", kind: "junction", demand: "-0.6 kg/s", temperature: "40 degC" },
    { id: "RV-2", kind: "junction", demand: "-0.3 kg/s", temperature: "15 degC" },
    { id: "HDR", kind: "junction" },
    { id: "ATM", kind: "reservoir", pressure: "1.01325 bar(a)", temperature: "20 degC" },
  ],
  edges: [
    { id: "L1", kind: "pipe", from: "RV-1", to: "HDR", length: 8, diameter: 0.07792 },
    { id: "L2", kind: "pipe", from: "RV-2", to: "HDR", length: 12, diameter: 0.05248 },
    { id: "TAIL", kind: "pipe", from: "HDR", to: "ATM", length: 15, diameter: 0.10226 },
  ],
};

/**
 * A short pipe with almost no friction (Darcy factor 1e-6 over L/D = 1) between a reservoir at
 * 700 kPa, 293.15 K and one consumer: its capacity is the isentropic choked flow of its bore.
 */
export const SHORT_PIPE: NetworkDocument = {
  name: "short smooth pipe",
  nodes: [
    { id: "S", kind: "reservoir", pressure: 700000, temperature: 293.15 },
    { id: "U", kind: "junction", demand: 0.5 },
  ],
  edges: [
    {
      id: "P",
      kind: "pipe",
      from: "S",
      to: "U",
      length: 0.05,
      diameter: 0.05,
      frictionFactor: 1e-6,
    },
  ],
};

/** A deep copy with a tighter solver tolerance, for finite differences of full solves. */
export function withTolerance(document: NetworkDocument, tolerance: number): NetworkDocument {
  const copy = structuredClone(document);
  copy.settings = { ...copy.settings, tolerance };
  return copy;
}

/** {@link BRANCH} with its demands as SI numbers, so a scaled demand can be written exactly. */
export const BRANCH_SI: NetworkDocument = {
  ...BRANCH,
  nodes: [
    { id: "REC", kind: "reservoir", pressure: 801325, temperature: 298.15 },
    { id: "TEE", kind: "junction" },
    { id: "SHOP", kind: "junction", demand: 300 / 3600 },
    { id: "PAINT", kind: "junction", demand: 150 / 3600 },
  ],
};
