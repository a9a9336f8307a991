/**
 * The cases of a sweep: their order, the blocks they are solved in, the warm-start neighbour of
 * each case, and the deterministic slice of blocks that a shard runs. Browser-safe.
 *
 * Order. A grid runs like nested loops over the inputs in the order written, the last input
 * varying fastest; zip takes the i-th value of every input together.
 *
 * Blocks. Cases are cut into blocks of `blockSize` consecutive cases. The first case of a block
 * starts from the solver's own first guess ("cold"); every other case starts from the nearest
 * case of the same block that has already converged (continuation). Nearest is the smallest
 * number of grid steps (the sum over the inputs of how many values apart the two cases are),
 * ties going to the later case. Since a case's start depends only on its block, every case gives
 * the same numbers however the blocks are spread over worker threads, shards or machines.
 */

import type { PreparedStudy } from "./study-types.js";

/** One case of a sweep. */
export interface StudyCase {
  /** Position in case order, 0-based (the output's `case` column is this plus 1). */
  index: number;
  /** For each input, the position of its value in the input's list. */
  positions: number[];
  /** For each input, its value [SI, or a scale factor]. */
  values: number[];
}

/** Largest number of cases of one study. */
export const MAX_CASES = 10_000_000;

/** Default number of cases per block. */
export const DEFAULT_BLOCK_SIZE = 32;

/** Number of cases: the product of the input lengths (grid) or their common length (zip). */
export function caseCount(study: Pick<PreparedStudy, "inputs" | "combine">): number {
  if (study.inputs.length === 0) return 0;
  if (study.combine === "zip") return (study.inputs[0]?.values.length ?? 0) as number;
  return study.inputs.reduce((product, input) => product * input.values.length, 1);
}

/** The case at a position in case order. */
export function caseAt(study: Pick<PreparedStudy, "inputs" | "combine">, index: number): StudyCase {
  const positions: number[] = new Array(study.inputs.length).fill(0);
  if (study.combine === "zip") {
    positions.fill(index);
  } else {
    let rest = index;
    for (let i = study.inputs.length - 1; i >= 0; i--) {
      const length = (study.inputs[i]?.values.length ?? 1) as number;
      positions[i] = rest % length;
      rest = Math.floor(rest / length);
    }
  }
  const values = positions.map((position, i) => study.inputs[i]?.values[position] as number);
  return { index, positions, values };
}

/** The position in case order of the case with these value positions; undefined if none. */
export function caseIndexAt(
  study: Pick<PreparedStudy, "inputs" | "combine">,
  positions: readonly number[],
): number | undefined {
  if (
    positions.some(
      (position, i) => position < 0 || position >= (study.inputs[i]?.values.length ?? 0),
    )
  ) {
    return undefined;
  }
  if (study.combine === "zip") {
    const first = positions[0] as number;
    return positions.every((position) => position === first) ? first : undefined;
  }
  let index = 0;
  positions.forEach((position, i) => {
    index = index * (study.inputs[i]?.values.length ?? 1) + position;
  });
  return index;
}

/** Number of grid steps between two cases (zip: how many cases apart). */
export function caseDistance(a: StudyCase, b: StudyCase): number {
  let steps = 0;
  for (let i = 0; i < a.positions.length; i++) {
    steps += Math.abs((a.positions[i] as number) - (b.positions[i] as number));
  }
  return a.positions.length === 0 ? 0 : steps;
}

/** Number of blocks of a study. */
export function blockCount(study: Pick<PreparedStudy, "inputs" | "combine" | "blockSize">): number {
  return Math.ceil(caseCount(study) / study.blockSize);
}

/** The cases of a block: [first, end) in case order. */
export function blockRange(
  study: Pick<PreparedStudy, "inputs" | "combine" | "blockSize">,
  block: number,
): [number, number] {
  const first = block * study.blockSize;
  return [first, Math.min(caseCount(study), first + study.blockSize)];
}

/** A slice of a study for one of several machines: shard `index` (1-based) of `count`. */
export interface Shard {
  index: number;
  count: number;
}

/**
 * The blocks shard K of N runs: [first, end). Blocks are dealt out in contiguous runs,
 * floor((K - 1) B / N) to floor(K B / N) for B blocks, so the shards together run every block
 * once and, joined in shard order, give the cases in case order.
 */
export function shardBlockRange(blocks: number, shard: Shard): [number, number] {
  if (
    !Number.isInteger(shard.count) ||
    !Number.isInteger(shard.index) ||
    shard.count < 1 ||
    shard.index < 1 ||
    shard.index > shard.count
  ) {
    throw new RangeError(
      `a shard is K/N with whole numbers 1 <= K <= N (got ${shard.index}/${shard.count})`,
    );
  }
  return [
    Math.floor(((shard.index - 1) * blocks) / shard.count),
    Math.floor((shard.index * blocks) / shard.count),
  ];
}

/** The cases shard K of N runs: [first, end) in case order. */
export function shardCaseRange(
  study: Pick<PreparedStudy, "inputs" | "combine" | "blockSize">,
  shard: Shard,
): [number, number] {
  const [firstBlock, endBlock] = shardBlockRange(blockCount(study), shard);
  const total = caseCount(study);
  return [
    Math.min(total, firstBlock * study.blockSize),
    Math.min(total, endBlock * study.blockSize),
  ];
}

/**
 * The nearest of the solved cases to a case (fewest grid steps; ties to the later case), or
 * undefined when there is none.
 */
export function nearestCase(
  target: StudyCase,
  solved: readonly StudyCase[],
): StudyCase | undefined {
  let best: StudyCase | undefined;
  let bestDistance = Number.POSITIVE_INFINITY;
  for (const candidate of solved) {
    const distance = caseDistance(target, candidate);
    if (
      distance < bestDistance ||
      (distance === bestDistance && best !== undefined && candidate.index > best.index)
    ) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}
