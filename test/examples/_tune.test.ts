import { readFileSync } from "node:fs";
import { it } from "vitest";
import { solveNetwork } from "../../src/index.js";

const files = (process.env.EX ?? "workshop-ring-main").split(",");
for (const f of files) {
  it(f, () => {
    const doc = JSON.parse(readFileSync(`docs/examples/${f}.json`, "utf8"));
    const r = solveNetwork(doc);
    const lines: string[] = [`${f}: ${r.status} it=${r.iterations} res=${r.residual.toExponential(2)}`];
    const pa = r.ambient.pressure;
    for (const n of r.nodes) lines.push(`  N ${n.id.padEnd(14)} p=${((n.pressure - pa) / 1e5).toFixed(4)} barg (${(n.pressure/1e5).toFixed(4)} bara) T=${(n.temperature - 273.15).toFixed(3)} C dem=${n.demand.toFixed(4)}`);
    for (const e of r.edges) lines.push(`  E ${e.id.padEnd(14)} m=${e.massFlow.toFixed(4)} dp=${(e.pressureDrop/1e5).toFixed(4)} vin=${e.inlet.velocity.toFixed(2)} vout=${e.outlet.velocity.toFixed(2)} Min=${e.inlet.mach.toFixed(4)} Mout=${e.outlet.mach.toFixed(4)} pout=${(e.outlet.pressure/1e5).toFixed(4)} ch=${e.choked} cr=${e.chokeRatio.toFixed(3)} Re=${e.reynolds.toExponential(2)} f=${e.frictionFactor.toFixed(4)}`);
    for (const w of r.warnings) lines.push(`  W ${w.code} ${w.message}`);
    console.log(lines.join("\n"));
  });
}
