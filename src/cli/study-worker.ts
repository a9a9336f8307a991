/**
 * The worker thread of `machnet study --workers N`: piscina loads this file in each thread with
 * the prepared study as `workerData`, then calls the default export once per block. A block is
 * solved exactly as the single-thread run solves it (src/study/run-study.ts), so the rows are the
 * same numbers whichever thread solved them.
 *
 * It runs from the compiled file next to study-command.js (dist/src/cli/study-worker.js after
 * `npm run build`).
 */

import { workerData } from "node:worker_threads";
import { type StudyRow, solveStudyBlock } from "../study/run-study.js";
import type { PreparedStudy } from "../study/study-types.js";

/** What the pool passes to every thread. */
export interface StudyWorkerData {
  study: PreparedStudy;
}

const study = (workerData as StudyWorkerData | undefined)?.study;

/**
 * Solve one block of the study.
 *
 * @param block - the block number, 0-based
 * @returns its rows, in case order
 */
export default function solveBlock(block: number): StudyRow[] {
  if (study === undefined) {
    throw new Error(
      "study-worker.js runs inside the study's worker pool, with the study as workerData",
    );
  }
  return solveStudyBlock(study, block);
}
