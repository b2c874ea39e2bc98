import { pathToFileURL } from "node:url";
import { BENCH_USAGE, runBench } from "./benchCommand.js";
import type { CliIO } from "./CliIO.js";
import { PROFILE_USAGE, runProfile } from "./profileCommand.js";
import { SOLVE_USAGE, runSolve } from "./solveCommand.js";

/** A `kiln` subcommand: what `--help` shows and the function that runs it. */
export interface Command {
  /** One line for the command list. */
  readonly summary: string;
  readonly usage: string;
  /** Returns the exit code: 0 ok, 2 input errors, 1 anything else. */
  readonly run: (args: string[], io: CliIO) => Promise<number>;
}

/** The subcommands of `kiln`, by name. Add a command by adding an entry. */
export const commands: Record<string, Command> = {
  bench: { summary: "solve TSPLIB or Solomon benchmark files, one JSON line each", usage: BENCH_USAGE, run: runBench },
  solve: { summary: "plan routes from a workbook's Stops and Fleet into a new workbook", usage: SOLVE_USAGE, run: runSolve },
  profile: { summary: "show the temperature and P(accept) profile of a schedule, without solving", usage: PROFILE_USAGE, run: runProfile },
};

/**
 * Runs `kiln <command> ...`. User errors print one line each on stderr and return 2;
 * an unexpected failure prints one line (no stack trace unless KILN_DEBUG is set) and
 * returns 1.
 *
 * @param argv - the arguments after `kiln`
 * @param io - output streams and clock
 * @returns the exit code
 * @example await main(["--help"], io) // => 0
 */
export async function main(argv: readonly string[], io: CliIO): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === "--help" || name === "-h" || name === "help") {
    io.stdout(helpText());
    return name === undefined ? 2 : 0;
  }
  const command = Object.hasOwn(commands, name) ? commands[name] : undefined;
  if (!command) {
    io.stderr(`kiln: unknown command "${name}"; commands: ${Object.keys(commands).join(", ")} (kiln --help)\n`);
    return 2;
  }
  try {
    return await command.run(rest, io);
  } catch (e) {
    io.stderr(`kiln ${name}: ${e instanceof Error ? e.message : String(e)}\n`);
    if (typeof process !== "undefined" && process.env["KILN_DEBUG"] && e instanceof Error && e.stack) io.stderr(e.stack + "\n");
    return 1;
  }
}

function helpText(): string {
  const list = Object.entries(commands).map(([n, c]) => `  ${n.padEnd(8)} ${c.summary}`);
  const usages = Object.values(commands).map((c) => c.usage);
  return ["usage: kiln <command> [options]", "", ...list, "", ...usages, ""].join("\n");
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
