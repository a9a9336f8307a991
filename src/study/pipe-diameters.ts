/**
 * The default list of allowed sizes for pipe sizing: carbon-steel pipe to ASME B36.10M,
 * schedule 40, DN 25 to DN 300. Browser-safe.
 */

/** One allowed pipe size. */
export interface PipeSize {
  /** Nominal size: "DN 50". */
  label: string;
  /** Inside diameter [m]. */
  diameter: number;
}

/**
 * Inside diameters of ASME B36.10M schedule 40 pipe, DN 25 (NPS 1) to DN 300 (NPS 12): ID = OD -
 * 2 t, as tabulated in python-fluids' `fluids/piping.py` (NPS40/S40i).
 */
const SCHEDULE_40: readonly PipeSize[] = Object.freeze([
  { label: "DN 25", diameter: 0.02664 },
  { label: "DN 50", diameter: 0.05248 },
  { label: "DN 80", diameter: 0.07792 },
  { label: "DN 100", diameter: 0.10226 },
  { label: "DN 150", diameter: 0.15408 },
  { label: "DN 200", diameter: 0.20274 },
  { label: "DN 250", diameter: 0.25446 },
  { label: "DN 300", diameter: 0.30318 },
]);

/**
 * The default sizes of {@link sizePipes}: ASME B36.10M schedule 40 inside diameters, DN 25 to
 * DN 300, smallest first.
 *
 * @returns a new array of `{ label, diameter }` [m]
 * @remarks Source: ASME B36.10M (welded and seamless wrought steel pipe), schedule 40 wall
 *   thicknesses, as tabulated in python-fluids 1.0.22, `fluids.piping` (checked against it in
 *   test/study/pipe-diameters.test.ts). DN 32, 40, 65 and 125 exist in the standard but are not
 *   in this list; a sizing block can name a schedule and nominal sizes of machnet's pipe catalog
 *   instead.
 * @example defaultPipeDiameters()[1] // { label: "DN 50", diameter: 0.05248 }
 */
export function defaultPipeDiameters(): PipeSize[] {
  return SCHEDULE_40.map((size) => ({ ...size }));
}
