/**
 * The stack-safe locator of JSON syntax errors (src/input/json-syntax-error.ts) against
 * jsonc-parser's recursive `parse`, an independent implementation of the same grammar (npm
 * package jsonc-parser, comments and trailing commas refused): on mutated JSON texts of modest
 * depth both must name the same first error at the same offset. Then the depths where `parse`
 * overflows the call stack (hardening defect I).
 */
import fc from "fast-check";
import { type ParseError, parse as parseTolerant } from "jsonc-parser";
import { describe, expect, it } from "vitest";
import { firstJsonSyntaxError } from "../../src/input/json-syntax-error.js";

function reference(text: string): { offset: number; error: number } | undefined {
  const errors: ParseError[] = [];
  parseTolerant(text, errors, { allowTrailingComma: false, disallowComments: true });
  const first = errors[0];
  return first ? { offset: first.offset, error: first.error } : undefined;
}

const SAMPLES = [
  '{"nodes": [{"id": "A", "kind": "reservoir", "pressure": "7 bar(g)"}], "edges": []}',
  '[1, -2.5e3, true, false, null, "a\\"b\\u00e9", {"x": [[]], "y": {}}]',
  '{"a": {"b": {"c": [1, [2, [3, {"d": "e"}]]]}}}',
  '"just a string"',
  "  42  ",
];
const JUNK = [
  "{",
  "}",
  "[",
  "]",
  ",",
  ":",
  '"',
  "\\",
  "/",
  "*",
  "-",
  ".",
  "e",
  "1",
  "x",
  "\u0001",
  "\n",
  " ",
  "//c\n",
  "/*",
  "tru",
  "nul",
  "0x1",
  "01",
  '"\\q"',
  '"\\u12"',
];

describe("firstJsonSyntaxError", () => {
  it("agrees with jsonc-parser's first error on 5 000 mutated texts (seeded)", () => {
    const mutated = fc
      .tuple(
        fc.constantFrom(...SAMPLES),
        fc.array(fc.tuple(fc.nat(), fc.nat({ max: 2 }), fc.constantFrom(...JUNK)), {
          minLength: 1,
          maxLength: 3,
        }),
      )
      .map(([sample, edits]) => {
        let text = sample;
        for (const [at, kind, junk] of edits) {
          const i = at % (text.length + 1);
          if (kind === 0) text = text.slice(0, i) + junk + text.slice(i);
          else if (kind === 1) text = text.slice(0, i) + text.slice(i + 1);
          else text = text.slice(0, i);
        }
        return text;
      });
    fc.assert(
      fc.property(mutated, (text) => {
        expect(firstJsonSyntaxError(text), JSON.stringify(text)).toEqual(reference(text));
      }),
      { numRuns: 5000, seed: 9009 },
    );
  });

  it("finds nothing wrong in valid JSON", () => {
    for (const sample of SAMPLES) expect(firstJsonSyntaxError(sample)).toBeUndefined();
    expect(firstJsonSyntaxError(JSON.stringify({ a: [1, { b: [] }], c: "d" }))).toBeUndefined();
  });

  it("locates the error under 100 000 open brackets without overflowing the stack (defect I)", () => {
    // The first "}" closes nothing that is open: a value is expected there.
    const depth = 100_000;
    const text = `{"nodes": ${"[".repeat(depth)}}`;
    expect(() => reference(text)).toThrow(RangeError); // why this module exists
    const found = firstJsonSyntaxError(text);
    expect(found?.offset).toBe(10 + depth);
    expect(found?.error).toBe(4); // ParseErrorCode.ValueExpected
    const closed = `${"[".repeat(depth)}${"]".repeat(depth)}`;
    expect(firstJsonSyntaxError(closed)).toBeUndefined();
    expect(firstJsonSyntaxError(`${closed}]`)?.offset).toBe(2 * depth);
  });
});
