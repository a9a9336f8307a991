import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { networkSchema } from "../../src/input/network-schema.js";

describe("schemas/network.schema.json", () => {
  it("is the schema the library validates with (regenerate with npm run schemas)", () => {
    const file = JSON.parse(
      readFileSync(new URL("../../schemas/network.schema.json", import.meta.url), "utf8"),
    );
    expect(file).toEqual(JSON.parse(JSON.stringify(networkSchema)));
  });

  it("declares JSON Schema draft 2020-12", () => {
    expect(networkSchema.$schema).toBe("https://json-schema.org/draft/2020-12/schema");
  });
});
