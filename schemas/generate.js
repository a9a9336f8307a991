// Writes the JSON Schema files in this folder from their TypeScript sources in src/input/.
// Run with `npm run schemas` (builds first); test/input/schema-file.test.ts and
// test/study/schema-file.test.ts check they agree.
import { writeFileSync } from "node:fs";
import { networkSchema } from "../dist/src/input/network-schema.js";
import { studySchema } from "../dist/src/input/study-schema.js";

for (const [name, schema] of [
  ["network", networkSchema],
  ["study", studySchema],
]) {
  const target = new URL(`./${name}.schema.json`, import.meta.url);
  writeFileSync(target, `${JSON.stringify(schema, null, 2)}\n`);
  console.log(`wrote ${target.pathname}`);
}
