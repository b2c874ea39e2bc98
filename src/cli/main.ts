import { pathToFileURL } from "node:url";
import type { CliIO } from "./CliIO.js";
import { runProgram } from "./program.js";

/**
 * Runs `kiln <command> ...` (commands and options in `program.ts`). Exit codes: 0 ok, 2 usage
 * or input errors (one line each on stderr), 1 anything else.
 *
 * @param argv - the arguments after `kiln`
 * @param io - output streams and clock
 * @returns the exit code
 * @example await main(["--help"], io) // => 0
 */
export function main(argv: readonly string[], io: CliIO): Promise<number> {
  return runProgram(argv, io);
}

/** The process's streams and clock as a CliIO. */
export function processIO(): CliIO {
  return {
    stdout: (s) => void process.stdout.write(s),
    stderr: (s) => void process.stderr.write(s),
    isTTY: Boolean(process.stderr.isTTY),
    now: () => performance.now(),
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main(process.argv.slice(2), processIO()).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`kiln: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    },
  );
}
