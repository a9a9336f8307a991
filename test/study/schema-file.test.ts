import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { studySchema } from "../../src/input/study-schema.js";

describe("schemas/study.schema.json", () => {
  it("is the schema the library validates studies with (regenerate with npm run schemas)", () => {
    const file = JSON.parse(
      readFileSync(new URL("../../schemas/study.schema.json", import.meta.url), "utf8"),
    );
    expect(file).toEqual(JSON.parse(JSON.stringify(studySchema)));
  });

  it("declares JSON Schema draft 2020-12 and requires the network", () => {
    expect(studySchema.$schema).toBe("https://json-schema.org/draft/2020-12/schema");
    expect(studySchema.required).toEqual(["network"]);
  });
});
