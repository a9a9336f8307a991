/**
 * Target solving: the value of one input (a reservoir pressure, a demand scale, a diameter) at
 * which a chosen result takes a target value (smallest junction pressure = 6.5 bar(g), largest
 * Mach number = 0.5), by bracketed root finding on warm-started network solves. Browser-safe.
 */

import type { QuantityInput } from "../input/document-types.js";
import type { NetworkResult } from "../results/result-types.js";
import { bracketedRoot } from "./bracketed-root.js";
import { outputNumber } from "./outputs.js";
import { parameterSolver, prepareQuestion } from "./question-setup.js";
import type { PreparedStudy, StudyParameterInput } from "./study-types.js";

/** Options of {@link findTarget}. */
export interface TargetOptions {
  /** The input to adjust: `{ path }` or `{ group }`, with an optional `bracket` of two values. */
  input: StudyParameterInput;
  /** The result to bring to the target: `network/minPressure`, `edges/FEED/mach`... */
  output: string;
  /** The target value (a quantity of the output's kind: "6.5 bar(g)", 0.5). */
  value: QuantityInput;
  /** Accept |output - value| <= this x |value|. @defaultValue 1e-6 */
  relativeTolerance?: number;
  /** Largest number of network solves. @defaultValue 60 */
  maxSolves?: number;
}

/** One solve of the search. */
export interface TargetSample {
  /** Input value [SI, or a scale factor]. */
  input: number;
  /** Output value [SI]; undefined when the solve did not converge. */
  output: number | undefined;
  status: NetworkResult["status"] | "invalid-input" | "failed";
}

/** What {@link findTarget} found. */
export type TargetAnswer =
  | {
      found: true;
      /** The input value [SI, or a scale factor] at which the output meets the target. */
      input: number;
      /** The output there [SI]. */
      output: number;
      /** The target [SI]. */
      target: number;
      /** The solve at the found value. */
      result: NetworkResult;
      /** The final bracket of the input. */
      bracket: [number, number];
      samples: TargetSample[];
      solves: number;
      iterations: number;
    }
  | {
      found: false;
      /**
       * `not-bracketed`: the output does not cross the target over the values tried;
       * `no-solution`: a needed solve failed; `budget`: the solve budget ran out.
       */
      reason: "not-bracketed" | "no-solution" | "budget";
      message: string;
      target: number;
      samples: TargetSample[];
      solves: number;
      iterations: number;
    };

/** Factors tried on the base value, in order, when no bracket is given. */
const SEARCH_FACTORS = [2, 0.5, 4, 0.25, 8, 0.125, 16, 0.0625];

/** A number for a message. */
function show(value: number): string {
  return Number(value.toPrecision(8)).toString();
}

/**
 * Find the value of one input at which a result meets a target.
 *
 * With a `bracket`, the output must lie on opposite sides of the target at its two ends. Without
 * one, the search starts at the input's value in the network and tries 2, 1/2, 4, 1/4 ... 16, 1/16
 * times it until the output crosses the target. Then the bracket is narrowed by the Illinois
 * method, each solve warm-started from the nearest value solved before, until the output is
 * within `relativeTolerance` of the target.
 *
 * @param network - the network document (parsed JSON, an object, or JSON text)
 * @param options - input, output, target value, tolerance
 * @returns the value found with the solve there, or why none was found: `not-bracketed` says
 *   over which range of the input the output stayed above or below the target
 * @throws InputError for an invalid network; StudyError for options that cannot be used (paths
 *   into the options: `/input/path`)
 * @example
 * const answer = findTarget(network, {
 *   input: { path: "/nodes/0/pressure", bracket: ["6 bar(g)", "9 bar(g)"] },
 *   output: "network/minPressure",
 *   value: "6.5 bar(g)",
 * });
 * if (answer.found) answer.input; // supply pressure [Pa] that keeps every junction at 6.5 bar(g)
 * // (checked in test/study/examples.test.ts)
 */
export function findTarget(network: unknown, options: TargetOptions): TargetAnswer {
  return answerTarget(prepareQuestion(network, "target", options));
}

/** {@link findTarget} on a prepared study with a `target` block. */
export function answerTarget(study: PreparedStudy): TargetAnswer {
  const target = study.target;
  if (target === undefined) throw new RangeError("the study has no target block");
  const solver = parameterSolver(study, target.input);
  const samples: TargetSample[] = [];
  const results = new Map<number, NetworkResult>();
  const outputs = new Map<number, number>();
  const goal = target.value;
  const tolerance = target.relativeTolerance * (goal === 0 ? 1 : Math.abs(goal));
  const evaluate = (input: number): number | undefined => {
    const outcome = solver.solve(input);
    if (outcome.status !== "converged" || !outcome.result) {
      samples.push({ input, output: undefined, status: outcome.status });
      return undefined;
    }
    const output = outputNumber(outcome.result, target.output);
    results.set(input, outcome.result);
    outputs.set(input, output);
    samples.push({ input, output, status: "converged" });
    return output - goal;
  };
  const name = target.input.label;
  const outputName = target.output.label;
  const finish = (
    reason: "not-bracketed" | "no-solution" | "budget",
    message: string,
  ): TargetAnswer => ({
    found: false,
    reason,
    message,
    target: goal,
    samples,
    solves: solver.solves,
    iterations: solver.iterations,
  });

  let low: { x: number; value: number } | undefined;
  let high: { x: number; value: number } | undefined;
  if (target.bracket) {
    const [a, b] = target.bracket;
    const fa = evaluate(a);
    const fb = evaluate(b);
    for (const [x, f] of [
      [a, fa],
      [b, fb],
    ] as const) {
      if (f === undefined) {
        const failed = samples.find((sample) => sample.input === x);
        return finish(
          "no-solution",
          `the network does not solve at ${name} = ${show(x)} (an end of the bracket; status ${failed?.status}); give a bracket where both ends solve`,
        );
      }
    }
    if (Math.sign(fa as number) === Math.sign(fb as number) && fa !== 0 && fb !== 0) {
      const side = (fa as number) > 0 ? "above" : "below";
      return finish(
        "not-bracketed",
        `the target cannot be bracketed: ${outputName} is ${show((fa as number) + goal)} at ${name} = ${show(a)} and ${show((fb as number) + goal)} at ${name} = ${show(b)}, both ${side} the target ${show(goal)} (SI); widen the bracket or check the target`,
      );
    }
    low = { x: a, value: fa as number };
    high = { x: b, value: fb as number };
  } else {
    const base = target.input.base;
    if (base === 0) {
      return finish(
        "not-bracketed",
        `${name} is 0 in the network, so there is no base value to search from; give a "bracket"`,
      );
    }
    const f0 = evaluate(base);
    if (f0 === undefined) {
      return finish(
        "no-solution",
        `the network does not solve at its own ${name} = ${show(base)}; give a "bracket" where both ends solve`,
      );
    }
    if (f0 === 0) {
      low = { x: base, value: 0 };
      high = { x: base, value: 0 };
    }
    let lastUp = { x: base, value: f0 };
    let lastDown = { x: base, value: f0 };
    let upOpen = true;
    let downOpen = true;
    for (const factor of SEARCH_FACTORS) {
      if (low) break;
      const up = factor > 1;
      if ((up && !upOpen) || (!up && !downOpen)) continue;
      const x = base * factor;
      const f = evaluate(x);
      if (f === undefined) {
        if (up) upOpen = false;
        else downOpen = false;
        continue;
      }
      const previous = up ? lastUp : lastDown;
      if (Math.sign(f) !== Math.sign(previous.value) || f === 0) {
        low = previous;
        high = { x, value: f };
        break;
      }
      if (up) lastUp = { x, value: f };
      else lastDown = { x, value: f };
    }
    if (!low || !high) {
      const solved = samples.filter((sample) => sample.output !== undefined);
      const inputs = solved.map((sample) => sample.input);
      const outputs = solved.map((sample) => sample.output as number);
      return finish(
        "not-bracketed",
        `the target cannot be bracketed: over ${name} from ${show(Math.min(...inputs))} to ${show(Math.max(...inputs))} (${solved.length} solves from 1/16 to 16 times the network's value) ${outputName} stays between ${show(Math.min(...outputs))} and ${show(Math.max(...outputs))}, never reaching the target ${show(goal)} (SI); give a "bracket" or check the target`,
      );
    }
  }

  const found = bracketedRoot({
    evaluate,
    inside: low,
    beyond: high,
    xTolerance: 1e-12 * Math.max(Math.abs(low.x), Math.abs(high.x)),
    valueTolerance: tolerance,
    maxEvaluations: Math.max(0, target.maxSolves - solver.solves),
  });
  // The better end of the final bracket.
  const candidates = [found.inside, found.beyond].filter(
    (point): point is { x: number; value: number } => point.value !== undefined,
  );
  candidates.sort((a, b) => Math.abs(a.value) - Math.abs(b.value));
  const best = candidates[0] as { x: number; value: number };
  const result = results.get(best.x);
  if (Math.abs(best.value) > tolerance || result === undefined) {
    if (found.beyond.value === undefined) {
      return finish(
        "no-solution",
        `the network does not solve at ${name} = ${show(found.beyond.x)} inside the bracket, so the search cannot go on; the closest solved value ${name} = ${show(best.x)} gives ${outputName} = ${show(best.value + goal)}`,
      );
    }
    return finish(
      "budget",
      `no value within the tolerance after ${solver.solves} solves; the closest, ${name} = ${show(best.x)}, gives ${outputName} = ${show(best.value + goal)} for a target of ${show(goal)} (SI); raise "maxSolves" or the tolerance`,
    );
  }
  return {
    found: true,
    input: best.x,
    output: outputs.get(best.x) as number,
    target: goal,
    result,
    bracket: [Math.min(found.inside.x, found.beyond.x), Math.max(found.inside.x, found.beyond.x)],
    samples,
    solves: solver.solves,
    iterations: solver.iterations,
  };
}
