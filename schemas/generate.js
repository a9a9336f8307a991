// Writes the JSON Schema files in this folder from their TypeScript sources in src/input/, and
// the validating functions of both schemas (ajv's standalone code, schemas/validator-source.js)
// into src/input/schema-validators.generated.ts. Run with `npm run schemas` (builds before and
// after); test/input/schema-file.test.ts, test/study/schema-file.test.ts and
// test/input/schema-validators.test.ts check they agree.
import { writeFileSync } from "node:fs";
import { networkSchema } from "../dist/src/input/network-schema.js";
import { studySchema } from "../dist/src/input/study-schema.js";
import { standaloneValidatorSource } from "./validator-source.js";

for (const [name, schema] of [
  ["network", networkSchema],
  ["study", studySchema],
]) {
  const target = new URL(`./${name}.schema.json`, import.meta.url);
  writeFileSync(target, `${JSON.stringify(schema, null, 2)}\n`);
  console.log(`wrote ${target.pathname}`);
}
const validators = new URL("../src/input/schema-validators.generated.ts", import.meta.url);
writeFileSync(validators, standaloneValidatorSource(networkSchema, studySchema));
console.log(`wrote ${validators.pathname}`);
