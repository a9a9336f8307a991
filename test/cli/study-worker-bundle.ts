/**
 * The study worker bundled from source for the command-line tests: piscina loads worker files in
 * real threads, which run plain JavaScript, not the TypeScript that vitest runs. vite (the test
 * runner's own bundler) compiles src/cli/study-worker.ts and everything it imports into one file
 * under test-artifacts/ (gitignored, inside the repository so that its bare imports resolve to
 * node_modules); `machnet study` takes it from MACHNET_STUDY_WORKER.
 */
import { mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "vite";

const ROOT = fileURLToPath(new URL("../../", import.meta.url));

/** Bundle the worker; returns its path and a function that removes it. */
export async function bundleStudyWorker(): Promise<{ file: string; remove: () => void }> {
  const artifacts = join(ROOT, "test-artifacts");
  mkdirSync(artifacts, { recursive: true });
  const directory = mkdtempSync(join(artifacts, "study-worker-"));
  await build({
    configFile: false,
    logLevel: "error",
    root: ROOT,
    build: {
      ssr: join(ROOT, "src/cli/study-worker.ts"),
      outDir: directory,
      emptyOutDir: false,
      minify: false,
      target: "node20",
      rollupOptions: { output: { format: "es", entryFileNames: "study-worker.mjs" } },
    },
  });
  return {
    file: join(directory, "study-worker.mjs"),
    remove: () => rmSync(directory, { recursive: true, force: true }),
  };
}
