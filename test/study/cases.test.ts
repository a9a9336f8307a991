import { describe, expect, it } from "vitest";
import { caseAt, caseCount, shardBlockRange, shardCaseRange } from "../../src/study/index.js";

const grid = {
  combine: "grid" as const,
  blockSize: 4,
  inputs: [{ values: [10, 20, 30] }, { values: [1, 2] }, { values: [0.1, 0.2, 0.3, 0.4] }],
} as unknown as Parameters<typeof caseAt>[0] & { blockSize: number };

describe("study cases", () => {
  it("count a grid as the product of the input lengths and order it like nested loops", () => {
    expect(caseCount(grid)).toBe(24);
    expect(caseAt(grid, 0).values).toEqual([10, 1, 0.1]);
    expect(caseAt(grid, 1).values).toEqual([10, 1, 0.2]);
    expect(caseAt(grid, 4).values).toEqual([10, 2, 0.1]);
    expect(caseAt(grid, 23).values).toEqual([30, 2, 0.4]);
  });

  it("deal the blocks out to shards so that every block runs once, in order", () => {
    for (const blocks of [0, 1, 5, 6, 7, 100]) {
      for (const count of [1, 2, 3, 8]) {
        const seen: number[] = [];
        let previousEnd = 0;
        for (let index = 1; index <= count; index++) {
          const [first, end] = shardBlockRange(blocks, { index, count });
          expect(first).toBe(previousEnd);
          previousEnd = end;
          for (let block = first; block < end; block++) seen.push(block);
        }
        expect(seen).toEqual(Array.from({ length: blocks }, (_, i) => i));
      }
    }
  });

  it("give each shard whole blocks of cases", () => {
    // 24 cases in blocks of 4: 6 blocks; shard 2 of 4 holds blocks 1 and 2 (floor(6/4) to floor(12/4)).
    expect(shardCaseRange(grid, { index: 2, count: 4 })).toEqual([4, 12]);
    expect(shardCaseRange(grid, { index: 4, count: 4 })).toEqual([16, 24]);
  });

  it("refuse a shard that is not K/N with 1 <= K <= N", () => {
    expect(() => shardBlockRange(4, { index: 0, count: 2 })).toThrow(RangeError);
    expect(() => shardBlockRange(4, { index: 3, count: 2 })).toThrow(/1 <= K <= N/);
  });
});
