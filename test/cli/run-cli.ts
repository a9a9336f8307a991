/**
 * Runs the command line in memory: files from a map, standard output and error collected.
 */
import { main } from "../../src/cli/main.js";

/** A file's content, or a directory. */
export type MemoryFile = string | Uint8Array | { directory: true };

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
  /** Files written through --output. */
  written: Map<string, string>;
}

/** An error like the ones fs.promises.readFile rejects with. */
function fileSystemError(code: string, path: string): Error {
  return Object.assign(new Error(`${code}: ${path}`), { code });
}

/** Run `machnet ...args` with an in-memory file system. */
export async function runCli(
  args: string[],
  files: Record<string, MemoryFile> = {},
  env: Record<string, string | undefined> = {},
): Promise<CliRun> {
  let stdout = "";
  let stderr = "";
  const written = new Map<string, string>();
  const code = await main(args, {
    stdout: (text) => {
      stdout += text;
    },
    stderr: (text) => {
      stderr += text;
    },
    readFile: async (path) => {
      const file = files[path];
      if (file === undefined) throw fileSystemError("ENOENT", path);
      if (typeof file === "object" && "directory" in file) throw fileSystemError("EISDIR", path);
      return typeof file === "string" ? file : Buffer.from(file);
    },
    writeFile: async (path, text) => {
      if (path.startsWith("/read-only/")) throw fileSystemError("EACCES", path);
      written.set(path, text);
    },
    env,
  });
  return { code, stdout, stderr, written };
}

/** Non-empty lines of a text. */
export function lines(text: string): string[] {
  return text.split("\n").filter((line) => line !== "");
}
