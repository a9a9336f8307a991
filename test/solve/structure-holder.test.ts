import { describe, expect, it } from "vitest";
import { generateNetwork } from "../../benchmarks/generate-network.js";
import type { CheckedDocument } from "../../src/input/document-types.js";
import { checkedDocumentOrThrow } from "../../src/input/read-document.js";
import type { StructureHolder } from "../../src/solve/network-system.js";
import { solveCheckedDocument } from "../../src/solve/solve-network.js";

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
  });
});
