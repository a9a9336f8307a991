import { expect, test } from "vitest";
import { resultJson } from "../../src/output/result-json.js";
import { sampleResult } from "./result-sample.js";

test("resultJson writes the result object unchanged with a 2-space indent and a final line break", () => {
  const result = sampleResult();
  const text = resultJson(result);
  expect(JSON.parse(text)).toEqual(result);
  expect(text.startsWith('{\n  "converged": true,\n  "status": "converged",\n')).toBe(true);
  expect(text.endsWith("}\n")).toBe(true);
});
