/**
 * The answer to a study's design question (target, capacity, sensitivities, sizing): computed
 * from a prepared study, and written as text lines in the study's unit set or as a JSON value in
 * SI. Browser-safe.
 */

import { type DisplayKind, displayUnit, type UnitSetName } from "../output/display-units.js";
import { answerCapacity, type CapacityAnswer, type CapacityLimit } from "./capacity.js";
import { answerTarget, type TargetAnswer } from "./find-target.js";
import { answerSensitivities, type SensitivityAnswer } from "./sensitivities.js";
import { answerSizing, type SizingAnswer } from "./size-pipes.js";
import { outputUnit } from "./study-format.js";
import type { PreparedStudy, ResolvedOutput } from "./study-types.js";

/** The answer to a design question, tagged by the question. */
export type StudyAnswer =
  | { question: "target"; answer: TargetAnswer }
  | { question: "capacity"; answer: CapacityAnswer }
  | { question: "sensitivities"; answer: SensitivityAnswer }
  | { question: "sizing"; answer: SizingAnswer };

/**
 * Answer the design question of a prepared study (any question but `sweep`).
 *
 * @throws RangeError for a sweep (run it with {@link studyRows}); Error from
 *   {@link sensitivities} when the base network does not converge
 */
export function answerStudy(study: PreparedStudy): StudyAnswer {
  switch (study.question) {
    case "target":
      return { question: "target", answer: answerTarget(study) };
    case "capacity":
      return { question: "capacity", answer: answerCapacity(study) };
    case "sensitivities":
      return { question: "sensitivities", answer: answerSensitivities(study) };
    case "sizing":
      return { question: "sizing", answer: answerSizing(study) };
    default:
      throw new RangeError("a sweep has rows, not one answer: run it with studyRows");
  }
}

/** An answer as text: lines for a terminal, and whether it is a positive answer. */
export interface AnswerText {
  lines: string[];
  /** False when no value was found, the limits cannot be met, or a search ran out. */
  answered: boolean;
}

/** A value in a display unit, with the unit. */
function shown(units: UnitSetName, kind: DisplayKind, value: number, digits = 6): string {
  const unit = displayUnit(units, kind);
  const number = Number(unit.fromSI(value).toPrecision(digits)).toString();
  return unit.label === "-" ? number : `${number} ${unit.label}`;
}

function shownOutput(study: PreparedStudy, output: ResolvedOutput, value: number): string {
  const unit = outputUnit(study.units, output, study.network.ambientPressure);
  const number = Number(unit.fromSI(value).toPrecision(6)).toString();
  return unit.label === "-" ? number : `${number} ${unit.label}`;
}

/** A capacity limit in words, in display units. */
function limitText(units: UnitSetName, limit: CapacityLimit): string {
  // The value at the limit, with enough digits to tell it from the limit.
  const value = (kind: DisplayKind) => shown(units, kind, limit.value, 9);
  switch (limit.kind) {
    case "choke":
      return limit.value >= 1
        ? `edge ${limit.id} chokes`
        : `edge ${limit.id} reaches its choke (choke ratio ${Number(limit.value.toPrecision(6))})`;
    case "min-pressure":
      return `node ${limit.id} reaches the smallest pressure, ${shown(units, "pressure", limit.limit)} (${value("pressure")})`;
    case "max-pressure":
      return `node ${limit.id} reaches the largest pressure, ${shown(units, "pressure", limit.limit)} (${value("pressure")})`;
    case "max-mach":
      return `edge ${limit.id} reaches Mach ${limit.limit} (${Number(limit.value.toPrecision(6))})`;
    case "max-velocity":
      return `edge ${limit.id} reaches ${shown(units, "velocity", limit.limit)} (${value("velocity")})`;
  }
}

/** The answer as text lines in the study's unit set. */
export function answerText(study: PreparedStudy, answer: StudyAnswer): AnswerText {
  const units = study.units;
  switch (answer.question) {
    case "target": {
      const target = study.target as NonNullable<PreparedStudy["target"]>;
      const a = answer.answer;
      const input = target.input;
      const goal = `${target.output.label} = ${shownOutput(study, target.output, a.target)}`;
      if (!a.found) {
        return {
          answered: false,
          lines: [`target ${goal}: not found (${a.reason})`, a.message, `${a.solves} solves`],
        };
      }
      return {
        answered: true,
        lines: [
          `target ${goal}`,
          `found: ${input.label} = ${shown(units, input.kind, a.input)} gives ${target.output.label} = ${shownOutput(study, target.output, a.output)}`,
          `${a.solves} solves, ${a.iterations} Newton iterations`,
        ],
      };
    }
    case "capacity": {
      const a = answer.answer;
      const group = (study.capacity as NonNullable<PreparedStudy["capacity"]>).group.label;
      if (!a.found) {
        return {
          answered: false,
          lines: [`capacity (${group}): not found (${a.reason})`, a.message],
        };
      }
      return {
        answered: true,
        lines: [
          `capacity: ${Number(a.scale.toPrecision(7))} times the network's values (${group})`,
          `limited by: ${limitText(units, a.limitedBy)}`,
          `beyond: at ${Number(a.beyond.scale.toPrecision(8))} times (${Number(a.scale.toPrecision(8))} solved), ${a.beyond.limit ? limitText(units, a.beyond.limit).replace(" reaches ", " passes ") : a.beyond.reason}`,
          `${a.solves} solves, ${a.iterations} Newton iterations`,
        ],
      };
    }
    case "sensitivities": {
      const a = answer.answer;
      const block = study.sensitivities as NonNullable<PreparedStudy["sensitivities"]>;
      const lines = [
        "derivatives at the network's solution (SI units: output unit per input unit)",
        "",
      ];
      const header = ["output", "value", ...a.inputs.map((input) => `d/d ${input.label}`)];
      lines.push(header.join("\t"));
      a.outputs.forEach((output, i) => {
        const resolved = block.outputs[i] as ResolvedOutput;
        lines.push(
          [
            output.label,
            shownOutput(study, resolved, output.value),
            ...(a.derivatives[i] as number[]).map((d) => d.toPrecision(6)),
          ].join("\t"),
        );
      });
      lines.push("", "relative: (input / output) x derivative");
      lines.push(["output", ...a.inputs.map((input) => input.label)].join("\t"));
      a.outputs.forEach((output, i) => {
        lines.push(
          [
            output.label,
            ...(a.relative[i] as number[]).map((r) =>
              Number.isFinite(r) ? r.toPrecision(4) : "n/a",
            ),
          ].join("\t"),
        );
      });
      return { answered: true, lines };
    }
    case "sizing": {
      const a = answer.answer;
      const lines = [
        a.feasible ? "sizing: every limit is met" : "sizing: the limits cannot all be met",
      ];
      lines.push(a.message, "");
      lines.push(
        [
          "edge",
          "size",
          "inside diameter",
          "was",
          "Mach",
          "velocity",
          "pressure drop",
          "binding limit",
        ].join("\t"),
      );
      for (const pipe of a.pipes) {
        lines.push(
          [
            pipe.id,
            pipe.label,
            shown(units, "diameter", pipe.diameter),
            shown(units, "diameter", pipe.previousDiameter),
            Number.isFinite(pipe.mach) ? pipe.mach.toPrecision(3) : "n/a",
            Number.isFinite(pipe.velocity) ? shown(units, "velocity", pipe.velocity) : "n/a",
            Number.isFinite(pipe.pressureDrop)
              ? shown(units, "pressureDifference", pipe.pressureDrop)
              : "n/a",
            pipe.binding
              ? `${pipe.binding.limit}${pipe.binding.id ? ` at ${pipe.binding.id}` : ""} one size smaller`
              : "smallest allowed size",
          ].join("\t"),
        );
      }
      lines.push("", `${a.solves} solves, ${a.iterations} Newton iterations`);
      return { answered: a.feasible, lines };
    }
  }
}

/** The answer as a JSON value (SI), without the full network results. */
export function answerJson(answer: StudyAnswer): unknown {
  switch (answer.question) {
    case "target": {
      const { ...rest } = answer.answer as TargetAnswer & { result?: unknown };
      delete rest.result;
      return { question: "target", ...rest };
    }
    case "capacity": {
      const { ...rest } = answer.answer as CapacityAnswer & { result?: unknown };
      delete rest.result;
      return { question: "capacity", ...rest };
    }
    case "sensitivities": {
      const { result: _result, ...rest } = answer.answer;
      return { question: "sensitivities", ...rest };
    }
    case "sizing": {
      const { result: _result, network, ...rest } = answer.answer;
      return {
        question: "sizing",
        ...rest,
        diameters: Object.fromEntries(network.edges.map((edge) => [edge.id, edge.diameter])),
      };
    }
  }
}
