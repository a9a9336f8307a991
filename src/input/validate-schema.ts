/**
 * JSON Schema validation shared by every document machnet reads (networks, studies): the
 * validating functions that ajv's standalone code generation wrote at build time
 * (src/input/schema-validators.generated.ts, from schemas/validator-source.js; nothing is
 * compiled at run time), and ajv's errors reworded as user-facing issues with their JSON
 * Pointers, each problem once.
 */
import type { ErrorObject } from "ajv/dist/2020.js";
import { type InputIssue, pointerSegment } from "./issues.js";
import {
  validateNetwork as generatedNetworkValidator,
  validateStudy as generatedStudyValidator,
} from "./schema-validators.generated.js";

/** An ajv validating function: true when the value conforms, else its errors on `errors`. */
interface GeneratedValidator {
  (value: unknown): boolean;
  errors?: ErrorObject[] | null;
}

/** Issues of a value against schemas/network.schema.json (unsorted, each place and message once). */
export const validateNetworkSchema = issuesOf(generatedNetworkValidator as GeneratedValidator);

/** Issues of a value against schemas/study.schema.json (unsorted, each place and message once). */
export const validateStudyDocumentSchema = issuesOf(generatedStudyValidator as GeneratedValidator);

function issuesOf(validate: GeneratedValidator): (value: unknown) => InputIssue[] {
  return (value) => {
    if (validate(value)) return [];
    // Copy at once: ajv keeps only the last call's errors on the validator.
    return issuesFromAjv([...(validate.errors ?? [])]);
  };
}

/** ajv's errors as issues, the summaries left out and each path and message once. */
export function issuesFromAjv(errors: readonly ErrorObject[]): InputIssue[] {
  const seen = new Set<string>();
  const issues: InputIssue[] = [];
  for (const error of errors) {
    const issue = schemaIssue(error);
    if (issue === undefined) continue;
    const key = `${issue.path}\u0000${issue.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    issues.push(issue);
  }
  return issues;
}

/**
 * Reword one ajv error as a user-facing line, keeping ajv's path; undefined for the summary
 * errors (`if`, `anyOf`, `allOf`) whose branches report the real problem. Shared by every
 * document machnet validates (networks, studies).
 */
export function schemaIssue(error: ErrorObject): InputIssue | undefined {
  const path = error.instancePath;
  const params = error.params as Record<string, unknown>;
  switch (error.keyword) {
    case "required":
      return {
        code: "schema",
        path,
        message: `missing required field "${String(params.missingProperty)}"`,
      };
    case "additionalProperties": {
      const allowed = allowedFields(error.parentSchema);
      return {
        code: "schema",
        path: `${path}/${pointerSegment(String(params.additionalProperty))}`,
        message: `unknown field "${String(params.additionalProperty)}"${allowed ? `; allowed fields here: ${allowed}` : ""}`,
      };
    }
    case "type": {
      const expected = String(params.type);
      const wanted =
        expected === "number,string"
          ? 'a number in SI units or a quantity string such as "80 mm"'
          : `of type ${expected.replace(",", " or ")}`;
      return { code: "schema", path, message: `must be ${wanted}` };
    }
    case "enum":
      return {
        code: "schema",
        path,
        message: `must be one of ${(params.allowedValues as unknown[]).map((v) => JSON.stringify(v)).join(", ")}`,
      };
    case "minItems":
      return {
        code: "schema",
        path,
        message: `must have at least ${String(params.limit)} item(s)`,
      };
    case "maxItems":
      return { code: "schema", path, message: `must have at most ${String(params.limit)} items` };
    case "minLength":
      return { code: "schema", path, message: "must not be empty" };
    case "maxLength":
      return {
        code: "schema",
        path,
        message: `must be at most ${String(params.limit)} characters long`,
      };
    case "minimum":
    case "maximum":
    case "exclusiveMinimum":
    case "exclusiveMaximum":
      return {
        code: "schema",
        path,
        message: `must be ${String(params.comparison)} ${String(params.limit)}`,
      };
    case "not":
      return notIssue(path, error.schema);
    case "if":
    case "anyOf":
    case "allOf":
      // The failing branch's own errors say what is wrong; these summaries add nothing.
      return undefined;
    case "integer":
      return { code: "schema", path, message: "must be a whole number" };
    default:
      return { code: "schema", path, message: error.message ?? "is not valid here" };
  }
}

function allowedFields(parentSchema: unknown): string {
  const properties = (parentSchema as { properties?: Record<string, unknown> } | undefined)
    ?.properties;
  return properties ? Object.keys(properties).join(", ") : "";
}

function notIssue(path: string, schema: unknown): InputIssue {
  const required = (schema as { required?: string[] } | undefined)?.required ?? [];
  if (required.includes("roughness") && required.includes("frictionFactor")) {
    return {
      code: "schema",
      path,
      message: 'give either "roughness" or "frictionFactor", not both',
    };
  }
  if (required.includes("heatTransferCoefficient") && required.includes("heatTransferPerLength")) {
    return {
      code: "schema",
      path,
      message:
        'give either "heatTransferCoefficient" (per wall area) or "heatTransferPerLength", not both',
    };
  }
  if (required.includes("demand")) {
    return {
      code: "schema",
      path: `${path}/demand`,
      message: "a reservoir takes no demand: its flow follows from the network",
    };
  }
  if (required.includes("pressure")) {
    return {
      code: "schema",
      path: `${path}/pressure`,
      message: "a junction's pressure is solved for; only a reservoir has a fixed pressure",
    };
  }
  return { code: "schema", path, message: "is not allowed here" };
}
