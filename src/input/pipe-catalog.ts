/**
 * Pipe by nominal size and schedule (ASME B36.10M and B36.19M inside diameters), and typical
 * wall roughness by material.
 */
import {
  B36_10M_SCHEDULES,
  B36_19M_SCHEDULES,
  PIPE_DIMENSIONS,
  type PipeDimensionRow,
} from "./pipe-catalog-data.js";

/** Every schedule machnet knows, B36.10M first. */
export const PIPE_SCHEDULES: readonly string[] = [...B36_10M_SCHEDULES, ...B36_19M_SCHEDULES];

/** A nominal size as written: DN (mm, ISO 6708) or NPS (inches). */
export type NominalSize = { system: "DN"; value: number } | { system: "NPS"; value: number };

/** A pipe found in the catalog. */
export interface CatalogPipe {
  /** Nominal pipe size [in]. */
  nominalPipeSize: number;
  /** DN [-] */
  nominalDiameter: number;
  schedule: string;
  /** The standard whose table it comes from. */
  standard: "ASME B36.10M" | "ASME B36.19M";
  /** [m] */
  outsideDiameter: number;
  /** [m] */
  wallThickness: number;
  /** [m] */
  insideDiameter: number;
}

/**
 * Read a nominal size: "DN80", "DN 80", "NPS 3", "3 in", "3in", "3\"", "1 1/2 in", "1-1/2 in",
 * "3/4 in", "1.5 in". A bare number is refused (DN or NPS?).
 *
 * @returns the size, or undefined if the text is not a nominal size
 * @example parseNominalSize("1 1/2 in") // { system: "NPS", value: 1.5 } (checked in
 *   test/input/components.test.ts)
 */
export function parseNominalSize(text: string): NominalSize | undefined {
  const trimmed = text.trim();
  const dn = /^DN\s*(\d+)$/i.exec(trimmed);
  if (dn) return { system: "DN", value: Number(dn[1]) };
  const nps = /^(?:NPS\s*)?([\d./\s-]*\d)\s*(?:in|inch|inches|")?$/i.exec(trimmed);
  const hasUnit = /^NPS/i.test(trimmed) || /(in|inch|inches|")$/i.test(trimmed);
  if (!nps || !hasUnit) return undefined;
  const value = inches((nps[1] as string).trim());
  return value === undefined ? undefined : { system: "NPS", value };
}

/** "3", "1.5", "3/4", "1 1/2", "1-1/2" -> inches; undefined otherwise. */
function inches(text: string): number | undefined {
  const mixed = /^(\d+)[\s-]+(\d+)\/(\d+)$/.exec(text);
  if (mixed) return Number(mixed[1]) + Number(mixed[2]) / Number(mixed[3]);
  const fraction = /^(\d+)\/(\d+)$/.exec(text);
  if (fraction) return Number(fraction[1]) / Number(fraction[2]);
  if (/^\d+(\.\d+)?$/.test(text)) return Number(text);
  return undefined;
}

/** Write an NPS the way the trade does: 1.5 -> "1 1/2". */
export function formatNominalPipeSize(nps: number): string {
  const whole = Math.floor(nps);
  const part = nps - whole;
  const fractions: [number, string][] = [
    [0.125, "1/8"],
    [0.25, "1/4"],
    [0.375, "3/8"],
    [0.5, "1/2"],
    [0.75, "3/4"],
  ];
  const match = fractions.find(([value]) => Math.abs(value - part) < 1e-9);
  if (part === 0) return String(whole);
  if (!match) return String(nps);
  return whole === 0 ? match[1] : `${whole} ${match[1]}`;
}

/**
 * The pipe of a nominal size in a schedule, from ASME B36.10M (carbon and alloy steel: 10 to
 * 160, STD, XS, XXS) or B36.19M (stainless: 5S, 10S, 40S, 80S).
 *
 * @param size - DN or NPS
 * @param schedule - e.g. "40", "STD", "10S" (case-insensitive)
 * @returns the pipe, or a message naming what is wrong and what exists
 * @remarks Tables from python3-fluids 1.0.22 (see src/input/pipe-catalog-data.ts).
 * @example catalogPipe({ system: "DN", value: 80 }, "40").insideDiameter // 0.07792 m (ASME
 *   B36.10M Sch 40, PRACTICE.md 6; checked in test/input/components.test.ts)
 */
export function catalogPipe(size: NominalSize, schedule: string): CatalogPipe | { error: string } {
  const name = PIPE_SCHEDULES.find(
    (known) => known.toUpperCase() === schedule.trim().toUpperCase(),
  );
  if (name === undefined) {
    return {
      error: `unknown schedule "${schedule}"; known schedules: ${PIPE_SCHEDULES.join(", ")} (ASME B36.10M and B36.19M)`,
    };
  }
  const rows = PIPE_DIMENSIONS[name] as readonly PipeDimensionRow[];
  const row = rows.find((candidate) =>
    size.system === "DN" ? candidate[1] === size.value : Math.abs(candidate[0] - size.value) < 1e-9,
  );
  if (row === undefined) {
    const listed =
      size.system === "DN"
        ? rows.map((candidate) => `DN${candidate[1]}`)
        : rows.map((candidate) => `${formatNominalPipeSize(candidate[0])} in`);
    return {
      error: `schedule ${name} has no ${size.system === "DN" ? `DN${size.value}` : `${formatNominalPipeSize(size.value)} in`} pipe; its sizes: ${listed.join(", ")}`,
    };
  }
  return {
    nominalPipeSize: row[0],
    nominalDiameter: row[1],
    schedule: name,
    standard: (B36_19M_SCHEDULES as readonly string[]).includes(name)
      ? "ASME B36.19M"
      : "ASME B36.10M",
    outsideDiameter: row[2] / 1000,
    wallThickness: row[3] / 1000,
    insideDiameter: row[4] / 1000,
  };
}

/**
 * Nominal pipe size [in] for an inside diameter, by linear interpolation along the ASME B36.10M
 * Sch 40 inside diameters (extrapolated above NPS 36; NPS 1/8 below its 6.84 mm), as Darby's
 * 3-K method needs a nominal size.
 *
 * @param insideDiameter - [m]
 * @returns NPS [in]
 * @remarks As python3-fluids 1.0.22 Darby3K does for a diameter (checked in
 *   test/input/components.test.ts).
 * @example nominalSizeFromInsideDiameter(0.05248) // 2
 */
export function nominalSizeFromInsideDiameter(insideDiameter: number): number {
  const rows = PIPE_DIMENSIONS["40"] as readonly PipeDimensionRow[];
  const millimetres = insideDiameter * 1000;
  const first = rows[0] as PipeDimensionRow;
  if (millimetres <= first[4]) return first[0];
  let index = rows.findIndex((row) => row[4] >= millimetres);
  if (index < 0) index = rows.length - 1;
  const upper = rows[index] as PipeDimensionRow;
  const lower = rows[index - 1] as PipeDimensionRow;
  return lower[0] + ((upper[0] - lower[0]) * (millimetres - lower[4])) / (upper[4] - lower[4]);
}

/** A wall material with its typical absolute roughness. */
export interface PipeMaterial {
  /** Absolute roughness [m]. */
  roughness: number;
  source: string;
}

/**
 * Typical absolute roughness by material (PRACTICE.md section 4). NORSOK rows are the standard's
 * design values; Idel'chik rows give the upper end of the handbook's range (more friction).
 */
export const PIPE_MATERIALS = {
  "carbon-steel": {
    roughness: 0.05e-3,
    source: "NORSOK P-001 Rev. 3 (1997) sec. 5.2.2, carbon steel, not corroded",
  },
  "carbon-steel-corroded": {
    roughness: 0.5e-3,
    source: "NORSOK P-001 Rev. 3 (1997) and Ed. 5 (2006), carbon steel, corroded",
  },
  "stainless-steel": { roughness: 0.05e-3, source: "NORSOK P-001, stainless steel" },
  titanium: { roughness: 0.05e-3, source: "NORSOK P-001, titanium and Cu-Ni" },
  "copper-nickel": { roughness: 0.05e-3, source: "NORSOK P-001, titanium and Cu-Ni" },
  grp: { roughness: 0.02e-3, source: "NORSOK P-001, GRP" },
  polyethylene: { roughness: 0.005e-3, source: "NORSOK P-001 Ed. 5 (2006), PE and PVC" },
  pvc: { roughness: 0.005e-3, source: "NORSOK P-001 Ed. 5 (2006), PE and PVC" },
  copper: {
    roughness: 0.01e-3,
    source:
      "Idel'chik, Handbook of Hydraulic Resistance, seamless tubes of brass, copper, lead, aluminium, commercially smooth: 0.0015-0.01 mm (via python3-fluids 1.0.22)",
  },
  "galvanized-steel": {
    roughness: 0.15e-3,
    source:
      "Idel'chik, Handbook of Hydraulic Resistance, galvanized steel tubes, ordinary galvanization: 0.10-0.15 mm (via python3-fluids 1.0.22)",
  },
  "steel-compressed-air-service": {
    roughness: 0.8e-3,
    source:
      "Idel'chik, Handbook of Hydraulic Resistance, seamless steel tubes, compressed air piping: 0.8 mm (via python3-fluids 1.0.22)",
  },
} as const satisfies Record<string, PipeMaterial>;

/** A material name. */
export type PipeMaterialName = keyof typeof PIPE_MATERIALS;

/** The material names, for the schema and messages. */
export const PIPE_MATERIAL_NAMES = Object.keys(PIPE_MATERIALS) as PipeMaterialName[];
