/**
 * The results a study records: `nodes/<id>/<field>`, `edges/<id>/<field>` and `network/<field>`,
 * resolved against the network once and read from each case's result. Browser-safe.
 */

import type { CheckedDocument } from "../input/document-types.js";
import type { DisplayKind } from "../output/display-units.js";
import type { EdgeResult, NetworkResult, NodeResult } from "../results/result-types.js";
import { idList } from "./parameters.js";
import type { StudyIssue } from "./study-issues.js";
import type { ResolvedOutput } from "./study-types.js";

/** One field a study can record: what it measures and how to read it. */
interface FieldSpec<Row> {
  kind: DisplayKind;
  read: (row: Row) => number | boolean;
  boolean?: boolean;
  gauge?: boolean;
}

const END_FIELDS = [
  ["pressure", "pressure"],
  ["stagnationPressure", "pressure"],
  ["temperature", "temperature"],
  ["stagnationTemperature", "temperature"],
  ["density", "density"],
  ["velocity", "velocity"],
  ["mach", "dimensionless"],
] as const;

/** Node fields: `pressure` [Pa abs], `gaugePressure` [Pa], `temperature` [K], `demand` [kg/s]. */
export const NODE_OUTPUT_FIELDS: Readonly<Record<string, FieldSpec<NodeResult>>> = {
  pressure: { kind: "pressure", read: (node) => node.pressure },
  gaugePressure: { kind: "pressure", read: (node) => node.pressure, gauge: true },
  temperature: { kind: "temperature", read: (node) => node.temperature },
  demand: { kind: "massFlow", read: (node) => node.demand },
};

/** Largest of a quantity at the two ends of an edge. */
function largestAtEnds(edge: EdgeResult, field: "mach" | "velocity"): number {
  return Math.max(edge.inlet[field], edge.outlet[field]);
}

/** Edge fields; `mach`, `velocity`, `momentumFlux` are the larger of the two ends. */
export const EDGE_OUTPUT_FIELDS: Readonly<Record<string, FieldSpec<EdgeResult>>> = {
  massFlow: { kind: "massFlow", read: (edge) => edge.massFlow },
  choked: { kind: "dimensionless", read: (edge) => edge.choked, boolean: true },
  chokeRatio: { kind: "dimensionless", read: (edge) => edge.chokeRatio },
  capacity: { kind: "massFlow", read: (edge) => edge.capacity },
  reynolds: { kind: "dimensionless", read: (edge) => edge.reynolds },
  frictionFactor: { kind: "dimensionless", read: (edge) => edge.frictionFactor },
  pressureDrop: { kind: "pressureDifference", read: (edge) => edge.pressureDrop },
  mach: { kind: "dimensionless", read: (edge) => largestAtEnds(edge, "mach") },
  velocity: { kind: "velocity", read: (edge) => largestAtEnds(edge, "velocity") },
  momentumFlux: {
    kind: "momentumFlux",
    read: (edge) =>
      Math.max(
        edge.inlet.density * edge.inlet.velocity ** 2,
        edge.outlet.density * edge.outlet.velocity ** 2,
      ),
  },
  ...Object.fromEntries(
    END_FIELDS.flatMap(([field, kind]) =>
      (["inlet", "outlet"] as const).map((end) => [
        `${end}/${field}`,
        { kind, read: (edge: EdgeResult) => edge[end][field] },
      ]),
    ),
  ),
};

/** Junction pressures (not reservoirs) of a result, with a filter on the node. */
function junctionPressures(result: NetworkResult, keep: (node: NodeResult) => boolean): number[] {
  return result.nodes
    .filter((node) => node.kind === "junction" && keep(node))
    .map((node) => node.pressure);
}

function smallest(values: number[]): number {
  return values.length === 0 ? Number.NaN : Math.min(...values);
}

function largest(values: number[]): number {
  return values.length === 0 ? Number.NaN : Math.max(...values);
}

/** Network fields: extremes over all junctions or all edges, and totals. */
export const NETWORK_OUTPUT_FIELDS: Readonly<Record<string, FieldSpec<NetworkResult>>> = {
  /** Smallest junction pressure [Pa abs]. */
  minPressure: { kind: "pressure", read: (r) => smallest(junctionPressures(r, () => true)) },
  /** Smallest pressure at a junction with a positive demand [Pa abs]. */
  minDeliveryPressure: {
    kind: "pressure",
    read: (r) => smallest(junctionPressures(r, (node) => node.demand > 0)),
  },
  /** Largest junction pressure [Pa abs]. */
  maxPressure: { kind: "pressure", read: (r) => largest(junctionPressures(r, () => true)) },
  maxMach: {
    kind: "dimensionless",
    read: (r) => largest(r.edges.map((e) => largestAtEnds(e, "mach"))),
  },
  maxVelocity: {
    kind: "velocity",
    read: (r) => largest(r.edges.map((e) => largestAtEnds(e, "velocity"))),
  },
  maxChokeRatio: { kind: "dimensionless", read: (r) => largest(r.edges.map((e) => e.chokeRatio)) },
  chokedEdges: { kind: "dimensionless", read: (r) => r.edges.filter((e) => e.choked).length },
  /** Throughput W: half the sum of the absolute external flows [kg/s]. */
  throughput: { kind: "massFlow", read: (r) => r.balance.throughput },
  /** Mass flow supplied by reservoirs and injections [kg/s]. */
  supply: { kind: "massFlow", read: (r) => r.balance.massIn },
};

/** Node and edge fields recorded for `"outputs": "all"`. */
const ALL_NODE_FIELDS = ["pressure", "temperature", "demand"];
const ALL_EDGE_FIELDS = ["massFlow", "pressureDrop", "mach", "velocity", "chokeRatio"];

/** The outputs that `"all"` stands for: every node's and every edge's main fields. */
export function allOutputs(network: CheckedDocument): ResolvedOutput[] {
  const outputs: ResolvedOutput[] = [];
  network.nodes.forEach((node, index) => {
    for (const field of ALL_NODE_FIELDS) {
      outputs.push(outputOf("nodes", index, node.id, field));
    }
  });
  network.edges.forEach((edge, index) => {
    for (const field of ALL_EDGE_FIELDS) {
      outputs.push(outputOf("edges", index, edge.id, field));
    }
  });
  return outputs;
}

function outputOf(
  scope: "nodes" | "edges",
  index: number,
  id: string,
  field: string,
): ResolvedOutput {
  const spec = (scope === "nodes" ? NODE_OUTPUT_FIELDS : EDGE_OUTPUT_FIELDS)[
    field
  ] as FieldSpec<unknown>;
  const output: ResolvedOutput = {
    label: `${scope}/${id}/${field}`,
    scope,
    index,
    field,
    kind: spec.kind,
  };
  if (spec.gauge) output.gauge = true;
  if (spec.boolean) output.boolean = true;
  return output;
}

/**
 * Resolve one output as written (`edges/FEED/mach`, `nodes/RD/pressure`, `network/maxMach`).
 * An id is matched first; a number that is no id is taken as an index. `path` is the output's
 * place in the study document, for messages.
 */
export function resolveOutput(
  network: CheckedDocument,
  text: string,
  path: string,
): { output: ResolvedOutput } | { issue: StudyIssue } {
  const written = text.startsWith("/") ? text.slice(1) : text;
  const slash = written.indexOf("/");
  const scope = slash < 0 ? written : written.slice(0, slash);
  const rest = slash < 0 ? "" : written.slice(slash + 1);
  const unknownReference = (reference: string, message: string): { issue: StudyIssue } => ({
    issue: { code: "unknown-reference", path, reference, message },
  });
  if (scope === "network") {
    const spec = NETWORK_OUTPUT_FIELDS[rest];
    if (spec === undefined) {
      return unknownReference(
        rest,
        `unknown network field ${JSON.stringify(rest)}; network fields are ${Object.keys(NETWORK_OUTPUT_FIELDS).join(", ")}`,
      );
    }
    return { output: { label: text, scope: "network", index: -1, field: rest, kind: spec.kind } };
  }
  if (scope !== "nodes" && scope !== "edges") {
    return {
      issue: {
        code: "value",
        path,
        value: text,
        message: `must be "nodes/<id>/<field>", "edges/<id>/<field>" or "network/<field>" (got ${JSON.stringify(text)})`,
      },
    };
  }
  const fields = scope === "nodes" ? NODE_OUTPUT_FIELDS : EDGE_OUTPUT_FIELDS;
  // Longest field first, so "inlet/pressure" wins over "pressure"; the id is what precedes it.
  const names = Object.keys(fields).sort((a, b) => b.length - a.length);
  const field = names.find((name) => rest.endsWith(`/${name}`) && rest.length > name.length + 1);
  if (field === undefined) {
    return unknownReference(
      rest,
      `${JSON.stringify(text)} names no ${scope === "nodes" ? "node" : "edge"} field; fields are ${Object.keys(fields).join(", ")}`,
    );
  }
  const id = rest.slice(0, rest.length - field.length - 1);
  const items: readonly { id: string }[] = scope === "nodes" ? network.nodes : network.edges;
  let index = items.findIndex((item) => item.id === id);
  if (index < 0 && /^\d+$/.test(id) && Number(id) < items.length) index = Number(id);
  if (index < 0) {
    const what = scope === "nodes" ? "node" : "edge";
    return unknownReference(
      id,
      `no ${what} "${id}" in the network; ${what}s are ${idList(items.map((item) => item.id))}`,
    );
  }
  const output = outputOf(scope, index, (items[index] as { id: string }).id, field);
  return { output: { ...output, label: text } };
}

/** Resolve `"all"` or a list of outputs; every problem with its path. */
export function resolveOutputs(
  network: CheckedDocument,
  written: string | readonly string[] | undefined,
  path: string,
): { outputs: ResolvedOutput[] } | { issues: StudyIssue[] } {
  if (written === undefined || written === "all") return { outputs: allOutputs(network) };
  if (typeof written === "string") {
    return {
      issues: [
        {
          code: "value",
          path,
          value: written,
          message: `must be "all" or a list of outputs such as "edges/<id>/mach" (got ${JSON.stringify(written)})`,
        },
      ],
    };
  }
  const outputs: ResolvedOutput[] = [];
  const issues: StudyIssue[] = [];
  written.forEach((text, position) => {
    const resolved = resolveOutput(network, text, `${path}/${position}`);
    if ("issue" in resolved) issues.push(resolved.issue);
    else outputs.push(resolved.output);
  });
  return issues.length > 0 ? { issues } : { outputs };
}

/** The value of an output in a result [SI], or a boolean for a true/false field. */
export function outputValue(result: NetworkResult, output: ResolvedOutput): number | boolean {
  if (output.scope === "network") {
    return (NETWORK_OUTPUT_FIELDS[output.field] as FieldSpec<NetworkResult>).read(result);
  }
  if (output.scope === "nodes") {
    const node = result.nodes[output.index] as NodeResult;
    return (NODE_OUTPUT_FIELDS[output.field] as FieldSpec<NodeResult>).read(node);
  }
  const edge = result.edges[output.index] as EdgeResult;
  return (EDGE_OUTPUT_FIELDS[output.field] as FieldSpec<EdgeResult>).read(edge);
}

/** The value of a numeric output (a true/false one as 1 or 0). */
export function outputNumber(result: NetworkResult, output: ResolvedOutput): number {
  const value = outputValue(result, output);
  return typeof value === "boolean" ? (value ? 1 : 0) : value;
}
