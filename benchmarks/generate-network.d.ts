/** Seeded generator of invented test networks (see generate-network.js). */
export function generateNetwork(options: {
  edges: number;
  seed?: number;
  topology?: "mixed" | "tree" | "grid";
}): import("../src/input/document-types.js").NetworkDocument;
