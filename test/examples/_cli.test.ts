import { it } from "vitest";
import { main } from "../../src/cli/main.js";
it("cli", async () => {
  for (const f of ["workshop-ring-main", "nitrogen-tank-header", "vent-collection-header"]) {
    let out = "";
    const code = await main(["solve", `docs/examples/${f}.json`], { stdout: (t) => { out += t; }, stderr: (t) => { out += "ERR " + t; } });
    console.log(`=== ${f} exit ${code}\n${out}`);
  }
});
