/**
 * Inputs of a study resolved against the network: a JSON Pointer (`/nodes/3/demand`,
 * `/edges/FEED/diameter`) or a named group ("demands", every diameter...) becomes a list of
 * fields of the checked network, and a value (SI) is applied to a copy of it. Browser-safe.
 */

import type { CheckedDocument, CheckedEdge, CheckedNode } from "../input/document-types.js";
import type { QuantityKind } from "../input/quantity.js";
import type { DisplayKind } from "../output/display-units.js";
import type { StudyIssue } from "./study-issues.js";
import type {
  ParameterTarget,
  ResolvedParameter,
  StudyGroupInput,
  StudyParameterInput,
} from "./study-types.js";

/** Numeric parameters of components (edges other than pipes) that a study can vary. */
export const COMPONENT_FIELDS: Readonly<
  Record<string, { quantity: QuantityKind; display: DisplayKind }>
> = {
  /** Valve opening [-], 0 to 1. */
  opening: { quantity: "dimensionless", display: "dimensionless" },
  /** Regulator set pressure [Pa absolute]. */
  setpoint: { quantity: "pressure", display: "pressure" },
  /** Orifice or nozzle bore [m]. */
  boreDiameter: { quantity: "length", display: "diameter" },
  /** Orifice or nozzle discharge coefficient [-]. */
  dischargeCoefficient: { quantity: "dimensionless", display: "dimensionless" },
  /** Valve flow coefficient Kv at full opening [m3/h], a plain number. */
  flowCoefficient: { quantity: "dimensionless", display: "dimensionless" },
};

/** What a target measures. */
export function targetKinds(target: ParameterTarget): {
  quantity: QuantityKind;
  display: DisplayKind;
} {
  if (target.component) {
    return COMPONENT_FIELDS[target.field] as { quantity: QuantityKind; display: DisplayKind };
  }
  return FIELD_KINDS[target.field as NetworkField];
}

/** The component record of an edge, if it is a component. */
function componentOf(edge: CheckedEdge): Record<string, unknown> | undefined {
  if (edge.kind === "pipe") return undefined;
  return (edge as { component?: Record<string, unknown> }).component;
}

/** Fields of nodes, edges and the ambient that a study can vary. */
type NetworkField =
  | "pressure"
  | "temperature"
  | "demand"
  | "length"
  | "diameter"
  | "roughness"
  | "minorLoss"
  | "frictionFactor";

/** What a field measures: how its values are read and how they are shown. */
export const FIELD_KINDS: Readonly<
  Record<NetworkField, { quantity: QuantityKind; display: DisplayKind }>
> = {
  pressure: { quantity: "pressure", display: "pressure" },
  temperature: { quantity: "temperature", display: "temperature" },
  demand: { quantity: "massFlow", display: "massFlow" },
  length: { quantity: "length", display: "length" },
  diameter: { quantity: "length", display: "diameter" },
  roughness: { quantity: "length", display: "diameter" },
  minorLoss: { quantity: "dimensionless", display: "dimensionless" },
  frictionFactor: { quantity: "dimensionless", display: "dimensionless" },
};

const NODE_FIELDS = ["pressure", "temperature", "demand"] as const;
const EDGE_FIELDS = ["length", "diameter", "roughness", "minorLoss", "frictionFactor"] as const;

/** Split a JSON Pointer into its unescaped segments (RFC 6901); undefined if it is not one. */
export function pointerSegments(pointer: string): string[] | undefined {
  if (!pointer.startsWith("/")) return undefined;
  return pointer
    .slice(1)
    .split("/")
    .map((segment) => segment.replace(/~1/g, "/").replace(/~0/g, "~"));
}

/** "a" or "an" before a word (an orifice, a valve). */
export function article(word: string): string {
  return /^[aeiou]/i.test(word) ? "an" : "a";
}

/** A short list of ids for a message: the first few, then how many more. */
export function idList(ids: readonly string[], most = 8): string {
  if (ids.length <= most) return ids.join(", ");
  return `${ids.slice(0, most).join(", ")} and ${ids.length - most} more`;
}

/** Find a node or edge by index ("3") or id; an issue when there is none. */
export function findElement(
  items: readonly { id: string }[],
  what: "node" | "edge",
  segment: string,
  path: string,
): { index: number } | { issue: StudyIssue } {
  if (/^\d+$/.test(segment)) {
    const index = Number(segment);
    if (index < items.length) return { index };
    return {
      issue: {
        code: "unknown-reference",
        path,
        reference: segment,
        message: `the network has ${items.length} ${what}s (indices 0 to ${items.length - 1}); there is no ${what} ${index}`,
      },
    };
  }
  const index = items.findIndex((item) => item.id === segment);
  if (index >= 0) return { index };
  return {
    issue: {
      code: "unknown-reference",
      path,
      reference: segment,
      message: `no ${what} "${segment}" in the network; ${what}s are ${idList(items.map((item) => item.id))}`,
    },
  };
}

/** The target of a JSON Pointer into the network, or why it cannot be varied. */
export function resolvePointer(
  network: CheckedDocument,
  pointer: string,
  path: string,
): { target: ParameterTarget } | { issue: StudyIssue } {
  const segments = pointerSegments(pointer);
  const invalid = (message: string): { issue: StudyIssue } => ({
    issue: { code: "value", path, value: pointer, message },
  });
  if (segments === undefined || segments.length === 0) {
    return invalid(
      `must be a JSON Pointer starting with "/", such as "/nodes/3/demand" or "/edges/0/diameter" (got ${JSON.stringify(pointer)})`,
    );
  }
  const [collection, key, field, ...rest] = segments;
  if (collection === "ambient" && key === "temperature" && field === undefined) {
    return {
      target: {
        collection: "ambient",
        index: 0,
        field: "temperature",
        base: network.ambientTemperature,
      },
    };
  }
  if ((collection !== "nodes" && collection !== "edges") || key === undefined) {
    return invalid(
      `${JSON.stringify(pointer)} cannot be varied; vary /nodes/<index or id>/<field>, /edges/<index or id>/<field> or /ambient/temperature`,
    );
  }
  const items = collection === "nodes" ? network.nodes : network.edges;
  const found = findElement(items, collection === "nodes" ? "node" : "edge", key, path);
  if ("issue" in found) return found;
  const index = found.index;
  const fields: readonly string[] = collection === "nodes" ? NODE_FIELDS : EDGE_FIELDS;
  if (collection === "nodes") {
    if (field === undefined || rest.length > 0 || !fields.includes(field)) {
      return invalid(
        `${JSON.stringify(pointer)} cannot be varied; the fields a study can vary on a node are ${fields.join(", ")}`,
      );
    }
    const node = network.nodes[index] as CheckedNode;
    const base = nodeFieldValue(node, field as (typeof NODE_FIELDS)[number]);
    if (typeof base === "string") return invalid(`node "${node.id}": ${base}`);
    return { target: { collection, index, field, base } };
  }
  const edge = network.edges[index] as CheckedEdge;
  const component = componentOf(edge);
  if (component !== undefined) {
    const value = field === undefined || rest.length > 0 ? undefined : component[field];
    if (field === undefined || COMPONENT_FIELDS[field] === undefined || typeof value !== "number") {
      const offered = Object.keys(COMPONENT_FIELDS).filter(
        (name) => typeof component[name] === "number",
      );
      return invalid(
        `${JSON.stringify(pointer)} cannot be varied; edge "${edge.id}" is ${article(edge.kind)} ${edge.kind}, whose fields a study can vary are ${offered.join(", ") || "none"}`,
      );
    }
    return { target: { collection, index, field, base: value, component: true } };
  }
  if (field === undefined || rest.length > 0 || !fields.includes(field)) {
    return invalid(
      `${JSON.stringify(pointer)} cannot be varied; the fields a study can vary on a pipe are ${fields.join(", ")}`,
    );
  }
  const base = edgeFieldValue(edge, field as (typeof EDGE_FIELDS)[number]);
  if (typeof base === "string") return invalid(`edge "${edge.id}": ${base}`);
  return { target: { collection, index, field, base } };
}

/** A node field's base value, or why that node's field cannot be varied. */
function nodeFieldValue(node: CheckedNode, field: (typeof NODE_FIELDS)[number]): number | string {
  if (node.kind === "reservoir") {
    if (field === "demand") return "a reservoir takes no demand: its flow follows from the network";
    return node[field] as number;
  }
  if (field === "pressure") {
    return "a junction's pressure is solved for; vary a reservoir's pressure instead";
  }
  if (field === "temperature") {
    if (node.temperature === undefined) {
      return "a junction's temperature is solved for; only an injection (negative demand) has a temperature to vary";
    }
    return node.temperature;
  }
  return node.demand;
}

/** An edge field's base value, or why that edge's field cannot be varied. */
function edgeFieldValue(edge: CheckedEdge, field: (typeof EDGE_FIELDS)[number]): number | string {
  if (field === "roughness") {
    if (edge.frictionFactor !== undefined) {
      return "has a fixed friction factor, so its roughness is not used; vary frictionFactor instead";
    }
    return edge.roughness ?? 0;
  }
  if (field === "frictionFactor") {
    if (edge.frictionFactor === undefined) {
      return "has no fixed friction factor (its friction follows from its roughness); vary roughness instead";
    }
    return edge.frictionFactor;
  }
  return edge[field];
}

/** Resolve a group to the fields it scales, or the issues that stop it. */
export function resolveGroup(
  network: CheckedDocument,
  group: StudyGroupInput,
  path: string,
): { targets: ParameterTarget[]; label: string } | { issues: StudyIssue[] } {
  if (typeof group === "string") {
    if (group !== "demands" && group !== "injections") {
      return {
        issues: [
          {
            code: "value",
            path,
            value: group,
            message: `unknown group ${JSON.stringify(group)}; groups are "demands", "injections", { "nodes": [...] } and { "edges": [...] or "all", "field": ... }`,
          },
        ],
      };
    }
    const wanted = group === "demands" ? (d: number) => d > 0 : (d: number) => d < 0;
    const targets: ParameterTarget[] = [];
    network.nodes.forEach((node, index) => {
      if (node.kind === "junction" && wanted(node.demand)) {
        targets.push({ collection: "nodes", index, field: "demand", base: node.demand });
      }
    });
    if (targets.length === 0) {
      return {
        issues: [
          {
            code: "value",
            path,
            value: group,
            message: `the network has no ${group === "demands" ? "positive demand" : "injection (negative demand)"} to scale`,
          },
        ],
      };
    }
    return { targets, label: group === "demands" ? "demand scale" : "injection scale" };
  }
  const issues: StudyIssue[] = [];
  const targets: ParameterTarget[] = [];
  const record = group as { nodes?: string[]; edges?: string[] | "all"; field?: string };
  if (record.nodes !== undefined && record.edges !== undefined) {
    return {
      issues: [{ code: "schema", path, message: 'give "nodes" or "edges", not both' }],
    };
  }
  if (record.nodes !== undefined) {
    if (record.field !== undefined && record.field !== "demand") {
      issues.push({
        code: "value",
        path: `${path}/field`,
        value: record.field,
        message: 'a group of nodes scales their demands: "field" must be "demand" or left out',
      });
    }
    record.nodes.forEach((id, position) => {
      const at = `${path}/nodes/${position}`;
      const found = findElement(network.nodes, "node", id, at);
      if ("issue" in found) {
        issues.push(found.issue);
        return;
      }
      const node = network.nodes[found.index] as CheckedNode;
      if (node.kind === "reservoir" || node.demand === 0) {
        issues.push({
          code: "value",
          path: at,
          value: id,
          message: `node "${node.id}" has no demand to scale`,
        });
        return;
      }
      targets.push({ collection: "nodes", index: found.index, field: "demand", base: node.demand });
    });
    if (issues.length > 0) return { issues };
    return { targets, label: `demand scale (${idList(record.nodes, 3)})` };
  }
  if (record.edges !== undefined) {
    const field = record.field;
    if (
      field !== "diameter" &&
      field !== "length" &&
      field !== "roughness" &&
      field !== "minorLoss"
    ) {
      return {
        issues: [
          {
            code: "schema",
            path: `${path}/field`,
            message:
              'a group of edges needs "field": "diameter", "length", "roughness" or "minorLoss"',
          },
        ],
      };
    }
    const all = record.edges === "all";
    if (typeof record.edges === "string" && !all) {
      return {
        issues: [
          {
            code: "value",
            path: `${path}/edges`,
            value: record.edges,
            message: `must be "all" or a list of edge ids (got ${JSON.stringify(record.edges)})`,
          },
        ],
      };
    }
    const indices: { index: number; at: string }[] = [];
    if (all) {
      network.edges.forEach((edge, index) => {
        if (edge.kind === "pipe") indices.push({ index, at: `${path}/edges` });
      });
    }
    if (!all) {
      (record.edges as string[]).forEach((id, position) => {
        const at = `${path}/edges/${position}`;
        const found = findElement(network.edges, "edge", id, at);
        if ("issue" in found) issues.push(found.issue);
        else indices.push({ index: found.index, at });
      });
    }
    for (const { index, at } of indices) {
      const edge = network.edges[index] as CheckedEdge;
      if (edge.kind !== "pipe") {
        issues.push({
          code: "value",
          path: at,
          value: edge.id,
          message: `edge "${edge.id}" is ${article(edge.kind)} ${edge.kind}, not a pipe; a group of edges scales pipe ${field}s`,
        });
        continue;
      }
      if (field === "roughness" && edge.frictionFactor !== undefined) {
        if (all) continue;
        issues.push({
          code: "value",
          path: at,
          value: edge.id,
          message: `edge "${edge.id}" has a fixed friction factor, so its roughness is not used`,
        });
        continue;
      }
      targets.push({
        collection: "edges",
        index,
        field,
        base: field === "roughness" ? (edge.roughness ?? 0) : edge[field],
      });
    }
    if (issues.length > 0) return { issues };
    if (targets.length === 0) {
      return {
        issues: [{ code: "value", path, value: field, message: `no edge has a ${field} to scale` }],
      };
    }
    const which = all ? "all edges" : idList(record.edges as string[], 3);
    return { targets, label: `${field} scale (${which})` };
  }
  return {
    issues: [
      {
        code: "schema",
        path,
        message:
          'a group is "demands", "injections", { "nodes": [...] } or { "edges": ..., "field": ... }',
      },
    ],
  };
}

/**
 * Resolve one input (`path` or `group`) against the network. `path` is the input's own place in
 * the study document, for messages.
 */
export function resolveParameter(
  network: CheckedDocument,
  input: StudyParameterInput,
  path: string,
): { parameter: ResolvedParameter } | { issues: StudyIssue[] } {
  if ((input.path === undefined) === (input.group === undefined)) {
    return {
      issues: [
        {
          code: "schema",
          path,
          message:
            'give either "path" (a JSON Pointer into the network) or "group" (values scaled together), not both or neither',
        },
      ],
    };
  }
  if (input.path !== undefined) {
    const resolved = resolvePointer(network, input.path, `${path}/path`);
    if ("issue" in resolved) return { issues: [resolved.issue] };
    const target = resolved.target;
    return {
      parameter: {
        label: input.name ?? input.path,
        mode: "set",
        kind: targetKinds(target).display,
        targets: [target],
        base: target.base,
      },
    };
  }
  const group = resolveGroup(network, input.group as StudyGroupInput, `${path}/group`);
  if ("issues" in group) return group;
  return {
    parameter: {
      label: input.name ?? group.label,
      mode: "scale",
      kind: "dimensionless",
      targets: group.targets,
      base: 1,
    },
  };
}

/** How a parameter's values are read: the quantity kind (a scale factor is a plain number). */
export function parameterQuantityKind(parameter: ResolvedParameter): QuantityKind {
  if (parameter.mode === "scale") return "dimensionless";
  return targetKinds(parameter.targets[0] as ParameterTarget).quantity;
}

/**
 * A copy of the network with the parameters set to the values (SI; a scale multiplies each
 * target's base value). The given network is not changed; parts that do not change are shared.
 */
export function applyParameters(
  network: CheckedDocument,
  parameters: readonly ResolvedParameter[],
  values: readonly number[],
): CheckedDocument {
  let nodes: CheckedNode[] | undefined;
  let edges: CheckedEdge[] | undefined;
  let ambientTemperature = network.ambientTemperature;
  parameters.forEach((parameter, position) => {
    const value = values[position] as number;
    for (const target of parameter.targets) {
      const next = parameter.mode === "scale" ? target.base * value : value;
      if (target.collection === "ambient") {
        ambientTemperature = next;
      } else if (target.collection === "nodes") {
        nodes ??= [...network.nodes];
        nodes[target.index] = { ...(nodes[target.index] as CheckedNode), [target.field]: next };
      } else if (target.component) {
        edges ??= [...network.edges];
        const edge = edges[target.index] as CheckedEdge & { component: Record<string, unknown> };
        edges[target.index] = {
          ...edge,
          component: { ...edge.component, [target.field]: next },
        } as CheckedEdge;
      } else {
        edges ??= [...network.edges];
        edges[target.index] = { ...(edges[target.index] as CheckedEdge), [target.field]: next };
      }
    }
  });
  return {
    ...network,
    ambientTemperature,
    nodes: nodes ?? network.nodes,
    edges: edges ?? network.edges,
  };
}

/**
 * Physical checks of a network after inputs were applied (the checks the document reader makes
 * on these fields): one message per problem, empty when the case can be solved.
 */
export function caseProblems(
  network: CheckedDocument,
  parameters: readonly ResolvedParameter[],
): string[] {
  const problems: string[] = [];
  const seen = new Set<string>();
  for (const parameter of parameters) {
    for (const target of parameter.targets) {
      const key = `${target.collection}/${target.index}/${target.field}`;
      if (seen.has(key)) continue;
      seen.add(key);
      const problem = targetProblem(network, target);
      if (problem !== undefined) problems.push(problem);
    }
  }
  return problems;
}

function targetProblem(network: CheckedDocument, target: ParameterTarget): string | undefined {
  if (target.collection === "ambient") {
    const value = network.ambientTemperature;
    return value > 0 && Number.isFinite(value)
      ? undefined
      : `ambient temperature ${value} K must be greater than 0`;
  }
  if (target.collection === "nodes") {
    const node = network.nodes[target.index] as CheckedNode;
    const value = node[target.field as "pressure" | "temperature" | "demand"] as number;
    if (!Number.isFinite(value)) return `node ${node.id}: ${target.field} is not a finite number`;
    if (target.field === "demand") {
      if (value < 0 && node.temperature === undefined) {
        return `node ${node.id}: demand ${value} kg/s is an injection, which needs the temperature of the injected gas; the network gives none`;
      }
      return undefined;
    }
    const unit = target.field === "pressure" ? "Pa" : "K";
    return value > 0
      ? undefined
      : `node ${node.id}: ${target.field} ${value} ${unit} must be greater than 0`;
  }
  const edge = network.edges[target.index] as CheckedEdge;
  if (target.component) return componentProblem(edge, target.field);
  const value = edge[
    target.field as "length" | "diameter" | "roughness" | "minorLoss" | "frictionFactor"
  ] as number;
  if (!Number.isFinite(value)) return `edge ${edge.id}: ${target.field} is not a finite number`;
  switch (target.field) {
    case "length":
    case "diameter":
    case "frictionFactor":
      if (!(value > 0)) return `edge ${edge.id}: ${target.field} ${value} must be greater than 0`;
      break;
    case "minorLoss":
    case "roughness":
      if (value < 0) return `edge ${edge.id}: ${target.field} ${value} must be 0 or more`;
      break;
  }
  if (edge.roughness !== undefined && edge.roughness / edge.diameter > 0.1) {
    return `edge ${edge.id}: relative roughness ${(edge.roughness / edge.diameter).toPrecision(3)} is beyond the range of the friction correlations (at most 0.1)`;
  }
  if (edge.diameter > edge.length * 1e3) {
    return `edge ${edge.id}: a diameter of ${edge.diameter} m on a pipe ${edge.length} m long is not a pipe`;
  }
  return undefined;
}

function componentProblem(edge: CheckedEdge, field: string): string | undefined {
  const component = componentOf(edge) ?? {};
  const value = component[field] as number;
  if (!Number.isFinite(value)) return `edge ${edge.id}: ${field} is not a finite number`;
  if (field === "opening") {
    return value >= 0 && value <= 1
      ? undefined
      : `edge ${edge.id}: opening ${value} must lie between 0 and 1`;
  }
  if (field === "dischargeCoefficient") {
    return value > 0 && value <= 1
      ? undefined
      : `edge ${edge.id}: discharge coefficient ${value} must lie above 0 and at most 1`;
  }
  if (!(value > 0)) return `edge ${edge.id}: ${field} ${value} must be greater than 0`;
  const pipeDiameter = component.pipeDiameter;
  if (field === "boreDiameter" && typeof pipeDiameter === "number" && value >= pipeDiameter) {
    return `edge ${edge.id}: bore ${value} m must be smaller than the pipe's ${pipeDiameter} m`;
  }
  return undefined;
}
