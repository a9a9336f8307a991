/**
 * Running a sweep: every case of a block solved in case order, each warm-started from the nearest
 * converged case of its block, and an async iterator over the rows of a whole study or of one
 * shard. Browser-safe; the command line runs the same blocks on worker threads.
 */

import type { NetworkResult, NodeResult } from "../results/result-types.js";
import type { StructureHolder } from "../solve/network-system.js";
import {
  blockCount,
  blockRange,
  caseAt,
  caseIndexAt,
  nearestCase,
  type Shard,
  type StudyCase,
  shardBlockRange,
} from "./cases.js";
import { outputValue } from "./outputs.js";
import { type CaseStatus, solveCase } from "./solve-case.js";
import type { PreparedStudy } from "./study-types.js";

/** One row of a sweep's output: a case, how its solve ended, and the recorded results (SI). */
export interface StudyRow {
  /** Case number, 1-based, in case order. */
  case: number;
  /** The value of each varied input [SI, or a scale factor], in the order of `study.inputs`. */
  values: number[];
  status: CaseStatus;
  /** Newton iterations of the solve. */
  iterations: number;
  /** The case number the solve started from (warm start), or undefined for a cold start. */
  warmStartFrom?: number;
  /** The recorded results [SI] in the order of `study.outputs`; only for a converged case. */
  outputs?: (number | boolean)[];
  /** Why the case did not converge, in one line. */
  message?: string;
}

/**
 * The rows of one block, solved one after the other (a generator: each row as soon as it is
 * solved).
 *
 * @param study - a prepared study (from {@link readStudyDocument})
 * @param block - the block number, 0-based
 */
export function* blockRows(study: PreparedStudy, block: number): Generator<StudyRow> {
  const [first, end] = blockRange(study, block);
  const solved: StudyCase[] = [];
  const results = new Map<number, Pick<NetworkResult, "nodes">>();
  // The cases of a block share their layout unless an input changes it: one sparse structure.
  const structureHolder: StructureHolder = {};
  for (let index = first; index < end; index++) {
    const current = caseAt(study, index);
    const neighbour = study.warmStart ? nearestCase(current, solved) : undefined;
    const start = neighbour ? predictedStart(study, current, neighbour, results) : undefined;
    const outcome = solveCase(study.network, study.inputs, current.values, start, structureHolder);
    const row: StudyRow = {
      case: index + 1,
      values: current.values,
      status: outcome.status,
      iterations: outcome.iterations,
    };
    if (neighbour) row.warmStartFrom = neighbour.index + 1;
    if (outcome.status === "converged" && outcome.result) {
      const result = outcome.result;
      row.outputs = study.outputs.map((output) => outputValue(result, output));
      solved.push(current);
      results.set(index, { nodes: result.nodes });
    } else if (outcome.message !== undefined) {
      row.message = outcome.message;
    }
    yield row;
  }
}

/**
 * The state to start a case from: the neighbour's node pressures and temperatures, extrapolated
 * along the line through the neighbour and the case one step further back when that one was
 * solved in this block as well (a secant predictor, as in the continuation methods of E. L.
 * Allgower and K. Georg, Introduction to Numerical Continuation Methods, SIAM, 2003, ch. 2).
 */
function predictedStart(
  study: PreparedStudy,
  current: StudyCase,
  neighbour: StudyCase,
  results: ReadonlyMap<number, Pick<NetworkResult, "nodes">>,
): Pick<NetworkResult, "nodes"> | undefined {
  const near = results.get(neighbour.index);
  if (near === undefined) return undefined;
  const back = neighbour.positions.map(
    (position, i) => 2 * position - (current.positions[i] as number),
  );
  const backIndex = caseIndexAt(study, back);
  const far = backIndex === undefined ? undefined : results.get(backIndex);
  if (far === undefined) return near;
  // The step along the line, as a multiple of the last one, from the first input that moves.
  const axis = current.positions.findIndex((position, i) => position !== neighbour.positions[i]);
  const values = study.inputs[axis]?.values ?? [];
  const lastStep =
    (values[neighbour.positions[axis] as number] as number) -
    (values[back[axis] as number] as number);
  const nextStep =
    (values[current.positions[axis] as number] as number) -
    (values[neighbour.positions[axis] as number] as number);
  const ratio = nextStep / lastStep;
  if (!(ratio > 0 && ratio <= 4)) return near;
  const nodes: NodeResult[] = [];
  for (let i = 0; i < near.nodes.length; i++) {
    const a = near.nodes[i] as NodeResult;
    const b = far.nodes[i] as NodeResult;
    const pressure = a.pressure + ratio * (a.pressure - b.pressure);
    const temperature = a.temperature + ratio * (a.temperature - b.temperature);
    if (!(pressure > 0 && temperature > 0)) return near;
    nodes.push({ ...a, pressure, temperature });
  }
  return { nodes };
}

/** The rows of one block as an array. */
export function solveStudyBlock(study: PreparedStudy, block: number): StudyRow[] {
  return [...blockRows(study, block)];
}

/** Options of {@link studyRows}. */
export interface StudyRunOptions {
  /** Run only this slice: shard `index` (1-based) of `count`. @defaultValue the whole study */
  shard?: Shard;
  /** Stop between cases when this signal is aborted (the iterator then ends early). */
  signal?: { readonly aborted: boolean };
}

/**
 * Every case of a sweep, solved in case order, as an async iterator of rows. Failed cases are
 * rows too (status and message); the iteration goes on.
 *
 * @example
 * const read = readStudyDocument(studyDocument);
 * if (read.ok) for await (const row of studyRows(read.study)) console.log(row.case, row.outputs);
 * // (checked in test/study/examples.test.ts)
 */
export async function* studyRows(
  study: PreparedStudy,
  options: StudyRunOptions = {},
): AsyncGenerator<StudyRow> {
  const blocks = blockCount(study);
  const [first, end] = options.shard ? shardBlockRange(blocks, options.shard) : [0, blocks];
  for (let block = first; block < end; block++) {
    for (const row of blockRows(study, block)) {
      if (options.signal?.aborted) return;
      yield row;
    }
  }
}

/** Average Newton iterations per case over rows that ran a solve. */
export function averageIterations(
  rows: readonly Pick<StudyRow, "iterations" | "status">[],
): number {
  const ran = rows.filter((row) => row.status !== "invalid-input" && row.status !== "failed");
  if (ran.length === 0) return 0;
  return ran.reduce((sum, row) => sum + row.iterations, 0) / ran.length;
}
