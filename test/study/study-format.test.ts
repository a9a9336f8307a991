/**
 * Sweep rows as text: CSV in the study's unit set with units in the header, JSON lines in SI, and
 * the shard header line that machnet merge reads.
 */
import { describe, expect, it } from "vitest";
import {
  parseShardHeaderLine,
  readStudyDocument,
  type ShardHeader,
  type StudyRow,
  shardHeaderLine,
  studyRows,
  studyWriter,
} from "../../src/study/index.js";
import { BRANCH_SI } from "./networks.js";

function prepare(units: "si" | "metric" | "us") {
  const read = readStudyDocument({
    network: BRANCH_SI,
    units,
    inputs: [
      { name: "supply", path: "/nodes/0/pressure", values: [801325] },
      { group: "demands", values: [1, 40] },
    ],
    outputs: [
      "nodes/PAINT/pressure",
      "nodes/PAINT/gaugePressure",
      "edges/B2/mach",
      "edges/B2/choked",
      "edges/MAIN/massFlow",
    ],
  });
  if (!read.ok) throw new Error(JSON.stringify(read.issues));
  return read.study;
}

async function rows(study: ReturnType<typeof prepare>): Promise<StudyRow[]> {
  const all: StudyRow[] = [];
  for await (const row of studyRows(study)) all.push(row);
  return all;
}

describe("study output", () => {
  it("writes CSV in the metric set with units in the header", async () => {
    const study = prepare("metric");
    const writer = studyWriter(study, "csv");
    expect(writer.header()).toBe(
      "case,supply [bar(a)],demand scale,status,iterations,warm start from,nodes/PAINT/pressure [bar(a)],nodes/PAINT/gaugePressure [bar(g)],edges/B2/mach,edges/B2/choked,edges/MAIN/massFlow [kg/h],message",
    );
    const [first, second] = await rows(study);
    const cells = writer.row(first as StudyRow).split(",");
    // bar = 1e5 Pa (BIPM SI Brochure, Table 8); 1 h = 3600 s. 1e-12 relative: one conversion.
    expect(cells.slice(0, 6)).toEqual(["1", "8.01325", "1", "converged", expect.any(String), ""]);
    const [pressure, gauge, , choked, flow] = (first?.outputs ?? []) as number[];
    expect(Number(cells[6])).toBeCloseTo((pressure as number) / 1e5, 12);
    expect(Number(cells[7])).toBeCloseTo(((pressure as number) - 101325) / 1e5, 12);
    expect(gauge).toBe(pressure); // the row holds the absolute value; the writer shows it gauge
    expect(cells[9]).toBe(String(choked));
    expect(Number(cells[10])).toBeCloseTo((flow as number) * 3600, 9);
    // 40 times the demands cannot be delivered: empty result cells and the reason last.
    const failed = writer.row(second as StudyRow);
    expect(failed).toMatch(
      /^2,8\.01325,40,(no-solution|not-converged),\d+,1,,,,,,"?(no solution|not converged)/,
    );
  });

  it("writes JSON lines in SI with the gauge pressure relative to the ambient", async () => {
    const study = prepare("us");
    const writer = studyWriter(study, "jsonl");
    expect(writer.header()).toBeUndefined();
    const [first, second] = await rows(study);
    const line = JSON.parse(writer.row(first as StudyRow));
    expect(Object.keys(line)).toEqual([
      "case",
      "inputs",
      "status",
      "iterations",
      "warmStartFrom",
      "outputs",
      "message",
    ]);
    expect(line.inputs).toEqual({ supply: 801325, "demand scale": 1 });
    const pressure = first?.outputs?.[0] as number;
    expect(line.outputs["nodes/PAINT/pressure"]).toBe(pressure);
    expect(line.outputs["nodes/PAINT/gaugePressure"]).toBe(pressure - 101325);
    expect(line.outputs["edges/B2/choked"]).toBe(false);
    expect(line.message).toBeNull();
    const failed = JSON.parse(writer.row(second as StudyRow));
    expect(failed.outputs).toBeNull();
    expect(failed.warmStartFrom).toBe(1);
    expect(failed.message).toMatch(/^(no solution|not converged)/);
  });

  it("writes CSV in US units", () => {
    expect(studyWriter(prepare("us"), "csv").header()).toContain(
      "nodes/PAINT/gaugePressure [psig]",
    );
  });

  it("reads back the shard header it writes, in both formats", () => {
    const header: ShardHeader = {
      shard: 2,
      of: 5,
      firstCase: 33,
      lastCase: 64,
      cases: 150,
      format: "csv",
      study: "abc123",
    };
    const csvLine = shardHeaderLine(header);
    expect(csvLine.startsWith("# machnetShard {")).toBe(true);
    expect(parseShardHeaderLine(csvLine)).toEqual(header);
    const jsonLine = shardHeaderLine({ ...header, format: "jsonl" });
    expect(parseShardHeaderLine(jsonLine)).toEqual({ ...header, format: "jsonl" });
    expect(parseShardHeaderLine("case,supply")).toBeUndefined();
    expect(parseShardHeaderLine('# machnetShard {"shard":1}')).toBeUndefined();
  });
});
