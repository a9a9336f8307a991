// What src/ imports: packages of package.json "dependencies" only (a development dependency such
// as mathjs, kept for test references, would be missing for a user of the package), and Node's
// own modules only in src/cli (the library core runs in a browser too). Common practice, no
// source: the package manifest decides what a user installs.
import { readdirSync, readFileSync } from "node:fs";
import { builtinModules } from "node:module";
import { join, relative } from "node:path";
import { describe, expect, it } from "vitest";

const root = new URL("..", import.meta.url).pathname;
const manifest = JSON.parse(readFileSync(join(root, "package.json"), "utf8")) as {
  dependencies: Record<string, string>;
};

function sourceFiles(directory: string): string[] {
  return readdirSync(directory, { withFileTypes: true }).flatMap((entry) => {
    const path = join(directory, entry.name);
    if (entry.isDirectory()) return sourceFiles(path);
    return entry.name.endsWith(".ts") && !entry.name.endsWith(".d.ts") ? [path] : [];
  });
}

/** The bare specifiers a file imports at run time (type-only imports left out). */
function runtimeImports(text: string): string[] {
  const found: string[] = [];
  const pattern =
    /^\s*(?:import|export)\s+(?!type\b)(?:[^"';]*?\sfrom\s+)?["']([^"'.][^"']*)["']/gm;
  for (const match of text.matchAll(pattern)) found.push(match[1] as string);
  for (const match of text.matchAll(/\bimport\(\s*["']([^"'.][^"']*)["']\s*\)/g)) {
    found.push(match[1] as string);
  }
  return found;
}

/** "@scope/name/sub" -> "@scope/name", "name/sub" -> "name". */
function packageOf(specifier: string): string {
  const parts = specifier.split("/");
  return specifier.startsWith("@") ? parts.slice(0, 2).join("/") : (parts[0] as string);
}

describe("the imports of src/", () => {
  const files = sourceFiles(join(root, "src"));
  const builtins = new Set(builtinModules);
  const imports = files.flatMap((file) =>
    runtimeImports(readFileSync(file, "utf8")).map((specifier) => ({
      file: relative(root, file),
      specifier,
    })),
  );

  it("finds the imports it checks", () => {
    // The scan must see the libraries the core is known to use, or it could not fail.
    const seen = new Set(imports.map((entry) => packageOf(entry.specifier)));
    for (const name of ["unitmath", "@dagrejs/dagre", "commander"]) {
      expect(seen.has(name), name).toBe(true);
    }
  });

  it("are dependencies of the package, or Node's own modules in the command line only", () => {
    const wrong = imports.filter(({ file, specifier }) => {
      const isBuiltin = specifier.startsWith("node:") || builtins.has(specifier);
      if (isBuiltin) return !file.startsWith("src/cli/");
      return manifest.dependencies[packageOf(specifier)] === undefined;
    });
    expect(wrong).toEqual([]);
  });
});
