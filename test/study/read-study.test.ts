/**
 * Reading study documents: every problem with its JSON Pointer into the study, a stable code and
 * a message that says what is expected; a valid study comes back prepared in SI.
 */
import { describe, expect, it } from "vitest";
import {
  caseCount,
  readStudyDocument,
  readStudyText,
  type StudyIssue,
} from "../../src/study/index.js";
import { BRANCH_SI } from "./networks.js";

function issuesOf(document: unknown, options = {}): [string, string, string][] {
  const read = readStudyDocument(document, options);
  if (read.ok) throw new Error("expected problems");
  return read.issues.map((issue: StudyIssue) => [issue.code, issue.path, issue.message]);
}

describe("readStudyDocument", () => {
  it("prepares a valid sweep: values in SI, outputs resolved, defaults filled", () => {
    const read = readStudyDocument({
      network: BRANCH_SI,
      inputs: [
        { path: "/nodes/REC/pressure", values: ["6 bar(g)", 900000] },
        {
          name: "load",
          group: { nodes: ["SHOP"] },
          range: { from: 1, to: 100, steps: 2, spacing: "log" },
        },
      ],
      outputs: ["edges/B2/outlet/mach", "nodes/0/gaugePressure", "network/maxMach"],
    });
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    const study = read.study;
    expect(study).toMatchObject({
      question: "sweep",
      units: "si",
      combine: "grid",
      warmStart: true,
      blockSize: 32,
    });
    expect(study.inputs.map((input) => input.label)).toEqual(["/nodes/REC/pressure", "load"]);
    // 6 bar(g) on the default ambient 101325 Pa; bar = 1e5 Pa (BIPM SI Brochure, Table 8).
    expect(study.inputs[0]?.values).toEqual([701325, 900000]);
    // Equal ratios from 1 to 100 in 2 steps: 1, 10, 100.
    expect(study.inputs[1]?.values).toEqual([1, expect.closeTo(10, 12), 100]);
    expect(study.outputs.map((output) => [output.scope, output.index, output.field])).toEqual([
      ["edges", 2, "outlet/mach"],
      ["nodes", 0, "gaugePressure"],
      ["network", -1, "maxMach"],
    ]);
    expect(caseCount(study)).toBe(6);
  });

  it("takes every output of every node and edge for outputs 'all' (the default)", () => {
    const read = readStudyDocument({
      network: BRANCH_SI,
      inputs: [{ group: "demands", values: [1] }],
    });
    expect(read.ok && read.study.outputs.length).toBe(4 * 3 + 3 * 5);
  });

  it("reports schema problems at their paths", () => {
    expect(
      issuesOf({
        network: BRANCH_SI,
        question: "guess",
        inputs: [{ path: "/nodes/0/pressure", values: [], colour: "red" }],
        blockSize: 0,
      }),
    ).toEqual([
      ["schema", "/blockSize", "must be >= 1"],
      [
        "schema",
        "/inputs/0/colour",
        'unknown field "colour"; allowed fields here: name, path, group, values, range, bracket',
      ],
      ["schema", "/inputs/0/values", "must have at least 1 item(s)"],
      [
        "schema",
        "/question",
        'must be one of "sweep", "target", "capacity", "sensitivities", "sizing"',
      ],
    ]);
  });

  it("reports references that do not resolve, values that cannot be read, and clashes", () => {
    expect(
      issuesOf({
        network: BRANCH_SI,
        combine: "zip",
        inputs: [
          { path: "/nodes/7/demand", values: [1] },
          { path: "/edges/B9/diameter", values: [1] },
          { path: "/nodes/REC/demand", values: [1] },
          { path: "/edges/0/diameter", values: ["80 mm", "3 parsec"] },
          { path: "/nodes/2/demand", range: { from: 1, to: 2, steps: 3 }, values: [1] },
          { group: "injections", values: [1] },
        ],
        outputs: ["edges/B2/colour", "pipes/B2/mach", "network/nothing"],
      }),
    ).toEqual([
      [
        "unknown-reference",
        "/inputs/0/path",
        "the network has 4 nodes (indices 0 to 3); there is no node 7",
      ],
      [
        "unknown-reference",
        "/inputs/1/path",
        'no edge "B9" in the network; edges are MAIN, B1, B2',
      ],
      [
        "value",
        "/inputs/2/path",
        'node "REC": a reservoir takes no demand: its flow follows from the network',
      ],
      [
        "unit",
        "/inputs/3/values/1",
        expect.stringMatching(/^unknown unit "parsec" \(got "3 parsec"\)/),
      ],
      [
        "schema",
        "/inputs/4",
        'give either "values" (a list) or "range" ({ "from", "to", "steps" }), not both or neither',
      ],
      ["value", "/inputs/5/group", "the network has no injection (negative demand) to scale"],
      [
        "unknown-reference",
        "/outputs/0",
        expect.stringMatching(/^"edges\/B2\/colour" names no edge field; fields are massFlow, /),
      ],
      [
        "value",
        "/outputs/1",
        'must be "nodes/<id>/<field>", "edges/<id>/<field>" or "network/<field>" (got "pipes/B2/mach")',
      ],
      [
        "unknown-reference",
        "/outputs/2",
        expect.stringMatching(/^unknown network field "nothing"; network fields are minPressure, /),
      ],
    ]);
  });

  it("reports zip inputs of different lengths and input names used twice", () => {
    expect(
      issuesOf({
        network: BRANCH_SI,
        combine: "zip",
        inputs: [
          { name: "x", path: "/nodes/0/pressure", values: [7e5, 8e5] },
          { name: "x", path: "/nodes/0/temperature", values: [290, 300, 310] },
        ],
      }),
    ).toEqual([
      [
        "value",
        "/inputs/1",
        '"combine": "zip" takes the i-th value of every input together, so every input needs the same number of values: /inputs/0 has 2, this one 3',
      ],
      [
        "value",
        "/inputs/1",
        'input name "x" is used by /inputs/0 already; give each input its own "name"',
      ],
    ]);
    expect(
      issuesOf({
        network: BRANCH_SI,
        inputs: [
          { name: "x", path: "/nodes/0/pressure", values: [7e5] },
          { name: "x", path: "/nodes/0/temperature", values: [290] },
        ],
      }),
    ).toEqual([
      [
        "value",
        "/inputs/1",
        'input name "x" is used by /inputs/0 already; give each input its own "name"',
      ],
    ]);
  });

  it("reports problems of an inline network under /network, of a separate one apart", () => {
    const broken = { ...BRANCH_SI, edges: [{ ...BRANCH_SI.edges[0], diameter: "-80 mm" }] };
    expect(issuesOf({ network: broken, inputs: [{ group: "demands", values: [1] }] })).toEqual([
      ["value", "/network/edges/0/diameter", 'must be greater than 0 (got "-80 mm")'],
    ]);
    const read = readStudyDocument(
      { network: "plant.json", inputs: [{ group: "demands", values: [1] }] },
      { network: broken },
    );
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.issues).toEqual([]);
    expect(read.networkIssues.map((issue) => issue.path)).toEqual(["/edges/0/diameter"]);
  });

  it("asks for the network document when the study names a file and none is given", () => {
    expect(
      issuesOf({ network: "plant.json", inputs: [{ group: "demands", values: [1] }] }),
    ).toEqual([
      [
        "document",
        "/network",
        'names the network file "plant.json"; the library reads no files: pass the network document in the options (the command line reads the file)',
      ],
    ]);
  });

  it("checks the block of the question asked", () => {
    expect(issuesOf({ network: BRANCH_SI, question: "target" })).toEqual([
      ["schema", "", 'question "target" needs a "target" block'],
    ]);
    expect(
      issuesOf({
        network: BRANCH_SI,
        question: "capacity",
        sizing: {},
        inputs: [{ group: "demands", values: [1] }],
      }),
    ).toEqual([
      [
        "value",
        "/inputs",
        '"inputs" are the varied inputs of a sweep; question "capacity" takes its inputs from its own block "capacity"',
      ],
      [
        "value",
        "/sizing",
        'the "sizing" block is read only with "question": "sizing" (the question is "capacity")',
      ],
    ]);
  });

  it("reports JSON syntax errors with line and column", () => {
    const read = readStudyText('{\n  "network": "x.json",\n  "inputs": [,]\n}');
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.issues[0]).toMatchObject({ code: "json-syntax", line: 3, column: 14 });
  });
});
