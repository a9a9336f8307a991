#!/usr/bin/env node
// Thin launcher: the command line itself is compiled from src/cli/ into dist/ by `npm run build`
// (run automatically by `npm ci` through the "prepare" script).
import { main } from "../dist/src/cli/main.js";

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
