/**
 * The @example of every public study function, run as written (on the branch network of these
 * tests), so that the documentation cannot drift from the code.
 */
import { describe, expect, it } from "vitest";
import {
  capacity,
  caseCount,
  findTarget,
  readStudyDocument,
  sensitivities,
  sizePipes,
  studyRows,
} from "../../src/study/index.js";
import { BRANCH_SI } from "./networks.js";

const network = BRANCH_SI;

describe("the @examples of src/study", () => {
  it("readStudyDocument: a range of 10 steps gives 11 cases", () => {
    const read = readStudyDocument({
      network,
      inputs: [{ group: "demands", range: { from: 0.5, to: 1.5, steps: 10 } }],
      outputs: ["network/minPressure"],
    });
    expect(read.ok && caseCount(read.study)).toBe(11);
  });

  it("studyRows: one row per case with its outputs", async () => {
    const read = readStudyDocument({
      network,
      inputs: [{ group: "demands", range: { from: 0.5, to: 1.5, steps: 10 } }],
      outputs: ["network/minPressure"],
    });
    const seen: number[] = [];
    if (read.ok)
      for await (const row of studyRows(read.study)) seen.push(row.case, row.outputs?.length ?? 0);
    expect(seen).toEqual(Array.from({ length: 11 }, (_, i) => [i + 1, 1]).flat());
  });

  it("findTarget: the supply pressure for 6.5 bar(g) everywhere", () => {
    const answer = findTarget(network, {
      input: { path: "/nodes/0/pressure", bracket: ["6 bar(g)", "9 bar(g)"] },
      output: "network/minPressure",
      value: "6.5 bar(g)",
    });
    expect(answer.found && answer.input).toBeGreaterThan(6.5e5 + 101325);
  });

  it("capacity: a scale and what limits it", () => {
    const answer = capacity(network, { group: "demands" });
    expect(
      answer.found && [typeof answer.scale, answer.limitedBy.kind, answer.limitedBy.id],
    ).toEqual(["number", "min-pressure", "PAINT"]);
  });

  it("sensitivities: a larger main raises the smallest pressure, more demand lowers it", () => {
    const s = sensitivities(network, {
      inputs: [{ path: "/edges/0/diameter" }, { group: "demands" }],
      outputs: ["network/minPressure"],
    });
    expect(s.derivatives[0]?.[0]).toBeGreaterThan(0);
    expect(s.derivatives[0]?.[1]).toBeLessThan(0);
  });

  it("sizePipes: a size and a binding limit (or none) per pipe", () => {
    const sized = sizePipes(network, {
      limits: { maxVelocity: "15 m/s", minDeliveryPressure: "6.3 bar(g)" },
    });
    expect(sized.pipes.map((pipe) => pipe.id)).toEqual(["MAIN", "B1", "B2"]);
    for (const pipe of sized.pipes) expect(pipe.label).toMatch(/^DN \d+$/);
  });
});
