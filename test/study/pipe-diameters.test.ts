import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { defaultPipeDiameters } from "../../src/study/index.js";

const reference = JSON.parse(
  readFileSync(new URL("../fixtures/study/sch40.json", import.meta.url), "utf8"),
) as { source: string; sizes: { nps: number; insideDiameter: number }[] };

describe("defaultPipeDiameters", () => {
  it("are the ASME B36.10M schedule 40 inside diameters of python-fluids, DN 25 to DN 300", () => {
    // Source: python-fluids 1.0.22, fluids.piping.nearest_pipe(NPS, schedule="40")
    // (test/fixtures/study/generate_sch40.py). 1e-9 m: both tabulate the same figures, in mm to
    // two decimals; only the binary rounding of mm -> m may differ.
    const sizes = defaultPipeDiameters();
    expect(sizes.map((size) => size.label)).toEqual([
      "DN 25",
      "DN 50",
      "DN 80",
      "DN 100",
      "DN 150",
      "DN 200",
      "DN 250",
      "DN 300",
    ]);
    sizes.forEach((size, i) => {
      expect(Math.abs(size.diameter - (reference.sizes[i]?.insideDiameter as number))).toBeLessThan(
        1e-9,
      );
    });
  });

  it("matches its @example and returns a fresh copy each time", () => {
    expect(defaultPipeDiameters()[1]).toEqual({ label: "DN 50", diameter: 0.05248 });
    const first = defaultPipeDiameters();
    (first[0] as { diameter: number }).diameter = 1;
    expect(defaultPipeDiameters()[0]?.diameter).toBe(0.02664);
  });
});
