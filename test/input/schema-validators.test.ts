import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { standaloneValidatorSource } from "../../schemas/validator-source.js";
import { networkSchema } from "../../src/input/network-schema.js";
import { studySchema } from "../../src/input/study-schema.js";

describe("src/input/schema-validators.generated.ts", () => {
  it("is ajv's standalone code of the current schemas (regenerate with npm run schemas)", () => {
    const committed = readFileSync(
      new URL("../../src/input/schema-validators.generated.ts", import.meta.url),
      "utf8",
    );
    expect(committed).toBe(standaloneValidatorSource(networkSchema, studySchema));
  });

  it("generates no code at run time (no Function constructor, no eval) and imports nothing", () => {
    const committed = readFileSync(
      new URL("../../src/input/schema-validators.generated.ts", import.meta.url),
      "utf8",
    );
    expect(committed).not.toMatch(/\bnew Function\b|\beval\(|\brequire\(|^import /m);
  });
});
