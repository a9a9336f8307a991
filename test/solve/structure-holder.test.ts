import { describe, expect, it } from "vitest";
import { generateNetwork } from "../../benchmarks/generate-network.js";
import { SolveReuse, solveNetwork } from "../../src/index.js";
import type { CheckedDocument } from "../../src/input/document-types.js";
import { checkedDocumentOrThrow } from "../../src/input/read-document.js";
import { reuseOfStartFactorsPays } from "../../src/solve/frozen-factor-gmres.js";
import type { StructureHolder } from "../../src/solve/network-system.js";
import { heldBy, solveCheckedDocument } from "../../src/solve/solve-network.js";

/** The checked document with every demand scaled, as a study's demand group does. */
function withDemands(checked: CheckedDocument, scale: number): CheckedDocument {
  return {
    ...checked,
    nodes: checked.nodes.map((node) => ({ ...node, demand: node.demand * scale })),
  };
}

describe("a sparse structure shared by solves of one layout (StructureHolder)", () => {
  const base = checkedDocumentOrThrow(generateNetwork({ edges: 300, seed: 4, topology: "mixed" }));

  it("is taken by the next solve of the same layout, with the same result to the bit", () => {
    const holder: StructureHolder = {};
    solveCheckedDocument(base, { structureHolder: holder });
    const first = holder.structure;
    expect(first).toBeDefined();
    const changed = withDemands(base, 1.05);
    const shared = solveCheckedDocument(changed, { structureHolder: holder });
    expect(holder.structure).toBe(first);
    expect(shared.converged).toBe(true);
    expect(shared).toEqual(solveCheckedDocument(changed));
  });

  it("is not taken by a network of another layout, which solves as without it", () => {
    const holder: StructureHolder = {};
    solveCheckedDocument(base, { structureHolder: holder });
    const first = holder.structure;
    // One more pipe between two junctions that no edge joins yet: another pattern, same size.
    const junctions = base.nodes.filter((node) => node.kind === "junction").map((node) => node.id);
    const joined = new Set(base.edges.map((edge) => `${edge.from} ${edge.to}`));
    const [a, b] = (() => {
      for (const x of junctions)
        for (const y of junctions)
          if (x !== y && !joined.has(`${x} ${y}`) && !joined.has(`${y} ${x}`)) return [x, y];
      throw new Error("no free pair");
    })() as [string, string];
    const template = base.edges.find((edge) => edge.kind === "pipe");
    if (template === undefined) throw new Error("no pipe");
    const other: CheckedDocument = {
      ...base,
      edges: [...base.edges, { ...template, id: "EXTRA", from: a, to: b }],
    };
    const result = solveCheckedDocument(other, { structureHolder: holder });
    expect(holder.structure).not.toBe(first);
    expect(result).toEqual(solveCheckedDocument(other));
    // Warm-started from the first layout's result (the same nodes), it takes nothing either.
    const fresh: StructureHolder = {};
    const before = solveCheckedDocument(base, { structureHolder: fresh });
    expect(solveCheckedDocument(other, { initialResult: before, structureHolder: fresh })).toEqual(
      solveCheckedDocument(other, { initialResult: before }),
    );
  });

  it("hands a warm start the last case's edge warm starts, and a cold solve fresh ones", () => {
    const holder: StructureHolder = {};
    const before = solveCheckedDocument(base, { structureHolder: holder });
    const handed = holder.edgeStarts?.warmStarts;
    expect(handed?.inletMach).toHaveLength(base.edges.length);
    const changed = withDemands(base, 1.01);
    const warm = solveCheckedDocument(changed, { initialResult: before, structureHolder: holder });
    expect(holder.edgeStarts?.warmStarts === handed).toBe(true);
    // The same warm start without the holder (fresh warm starts): the same state to the
    // solver's tolerance (1e-9 of the throughput), far below what a result shows.
    const alone = solveCheckedDocument(changed, { initialResult: before });
    expect(warm.converged && alone.converged).toBe(true);
    warm.nodes.forEach((node, i) => {
      expect(node.pressure).toBeCloseTo(alone.nodes[i]?.pressure as number, 3);
      expect(node.temperature).toBeCloseTo(alone.nodes[i]?.temperature as number, 6);
    });
    solveCheckedDocument(changed, { structureHolder: holder });
    expect(holder.edgeStarts?.warmStarts === handed).toBe(false);
  });

  it("gives nothing to a warm start whose previous result does not fit the network", () => {
    const holder: StructureHolder = {};
    const before = solveCheckedDocument(base, { structureHolder: holder });
    const changed = withDemands(base, 1.01);
    // A result of other nodes: the solve starts from the first guess, as a cold one.
    const stranger = { nodes: before.nodes.map((node) => ({ ...node, id: `X${node.id}` })) };
    const result = solveCheckedDocument(changed, {
      initialResult: stranger,
      structureHolder: holder,
    });
    expect(result).toEqual(solveCheckedDocument(changed));
  });

  it("gives no edge warm starts to a network whose pipes are of another model", () => {
    const holder: StructureHolder = {};
    const before = solveCheckedDocument(base, { structureHolder: holder });
    const handed = holder.edgeStarts?.warmStarts;
    const isothermal: CheckedDocument = {
      ...base,
      edges: base.edges.map((edge) =>
        edge.kind === "pipe" ? { ...edge, model: "isothermal" as const } : edge,
      ),
    };
    const result = solveCheckedDocument(isothermal, {
      initialResult: before,
      structureHolder: holder,
    });
    expect(holder.edgeStarts?.warmStarts === handed).toBe(false);
    expect(result).toEqual(solveCheckedDocument(isothermal, { initialResult: before }));
  });

  it("solves a warm start on a large meshed network with the factors the case before left", () => {
    // A grid of 8,000 edges: the smallest generated kind on which the start factors pay.
    const grid = checkedDocumentOrThrow(
      generateNetwork({ edges: 8000, seed: 2, topology: "grid" }),
    );
    const holder: StructureHolder = {};
    const before = solveCheckedDocument(grid, { structureHolder: holder });
    const factors = holder.factors;
    expect(factors).toBeDefined();
    expect(
      reuseOfStartFactorsPays(holder.structure as NonNullable<StructureHolder["structure"]>),
    ).toBe(true);
    const changed = withDemands(grid, 1.01);
    const warm = solveCheckedDocument(changed, { initialResult: before, structureHolder: holder });
    expect(warm.converged).toBe(true);
    // Every step was solved by GMRES with them: no new factorization replaced them.
    // (compared as a boolean: a failing toBe would diff megabytes of factors)
    expect(holder.factors === factors).toBe(true);
    const alone = solveCheckedDocument(changed, { initialResult: before });
    let largest = 0;
    warm.nodes.forEach((node, i) => {
      const other = alone.nodes[i]?.pressure as number;
      largest = Math.max(largest, Math.abs(node.pressure - other) / other);
    });
    expect(largest).toBeLessThan(1e-8);
    expect(warm.balance.largestMassImbalance).toBeLessThan(1e-8);
    // A cold solve after the warm one takes nothing of it: the same as without the holder.
    expect(solveCheckedDocument(changed, { structureHolder: holder })).toEqual(
      solveCheckedDocument(changed),
    );
    // A warm start that does not converge (one iteration allowed) leaves no factors behind.
    expect(holder.factors).toBeDefined();
    const cut = solveCheckedDocument(
      { ...withDemands(grid, 1.02), settings: { ...grid.settings, maxIterations: 1 } },
      { initialResult: warm, structureHolder: holder },
    );
    expect(cut.converged).toBe(false);
    expect(holder.factors).toBeUndefined();
  });
});

describe("SolveReuse: the same sharing through the public solveNetwork", () => {
  const document = generateNetwork({ edges: 300, seed: 6, topology: "grid" });
  const changed = {
    ...document,
    nodes: document.nodes.map((node) =>
      typeof node.demand === "number" ? { ...node, demand: node.demand * 1.01 } : node,
    ),
  };

  it("leaves a cold solve bit for bit as without it, and a warm one within the tolerance", () => {
    const reuse = new SolveReuse();
    const cold = solveNetwork(document, { reuse });
    expect(cold).toEqual(solveNetwork(document));
    expect(heldBy(reuse).structure).toBeDefined();
    const warm = solveNetwork(changed, { reuse, initialResult: cold });
    const alone = solveNetwork(changed, { initialResult: cold });
    expect(warm.converged && alone.converged).toBe(true);
    warm.nodes.forEach((node, i) => {
      const other = alone.nodes[i]?.pressure as number;
      expect(Math.abs(node.pressure - other) / other).toBeLessThan(1e-8);
    });
  });

  it("refuses anything but a SolveReuse, saying what it expects", () => {
    expect(() => solveNetwork(document, { reuse: {} as SolveReuse })).toThrow(
      /options\.reuse: expected a SolveReuse \(made by new SolveReuse\(\)\), got another object/,
    );
  });
});
