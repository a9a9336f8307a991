// Writes the JSON Schema files in this folder from their TypeScript sources in src/input/.
// Run with `npm run schemas` (builds first); test/input/schema-file.test.ts checks they agree.
import { writeFileSync } from "node:fs";
import { networkSchema } from "../dist/src/input/network-schema.js";

const target = new URL("./network.schema.json", import.meta.url);
writeFileSync(target, `${JSON.stringify(networkSchema, null, 2)}\n`);
console.log(`wrote ${target.pathname}`);
