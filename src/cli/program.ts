/**
 * The `kiln` command line on commander: every command and option declared once with its help
 * text, `kiln --help`, `kiln <command> --help`, `--version`. Usage mistakes (an unknown option or
 * command, a missing value or argument) print commander's message with a suggestion and exit 2.
 */
import { readFileSync } from "node:fs";
import { Command, CommanderError } from "commander";
import { declareBench } from "./benchCommand.js";
import type { CliIO } from "./CliIO.js";
import { declarePlan } from "./planCommand.js";
import { declareGeocode } from "./geocodeCommand.js";
import { declareProfile } from "./profileCommand.js";
import { declareCompareSchedules } from "./compareSchedulesCommand.js";

/**
 * The package version, from the package's own package.json: two folders up from src/cli (run
 * through tsx), three from dist/cli/cli (the compiled `bin`, also in an installed tarball).
 */
export function packageVersion(): string {
  for (const up of ["../../package.json", "../../../package.json"]) {
    try {
      const pkg = JSON.parse(readFileSync(new URL(up, import.meta.url), "utf8")) as { name?: unknown; version?: unknown };
      if (pkg.name === "kiln-routes" && typeof pkg.version === "string") return pkg.version;
    } catch {
      // Not there in this layout: try the next.
    }
  }
  return "0.0.0";
}

/**
 * Build the program for one run: output goes to `io`, and the command's exit code to `exit`.
 *
 * @param io - output streams and clock
 * @param exit - receives the exit code of the command that ran
 * @returns the commander program
 * @example await buildProgram(io, (c) => (code = c)).parseAsync(["plan", "week.xlsx"], { from: "user" })
 */
export function buildProgram(io: CliIO, exit: (code: number) => void): Command {
  const program = new Command("kiln")
    .description(
      "Kiln Route Planner: delivery routes with time windows by simulated annealing.\n" +
        "Plans are estimates: check roads, vehicle restrictions and driving and rest hours.",
    )
    .version(packageVersion(), "-V, --version", "print the version and exit")
    .helpOption("-h, --help", "show help for kiln or a command")
    .helpCommand("help [command]", "show help for a command")
    .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) })
    .showSuggestionAfterError(true)
    .exitOverride();
  declarePlan(program, io, exit);
  declareGeocode(program, io, exit);
  declareProfile(program, io, exit);
  declareCompareSchedules(program, io, exit);
  declareBench(program, io, exit);
  return program;
}

/**
 * Run `kiln` with these arguments. Help and version exit 0; usage mistakes exit 2 (commander's
 * one-line message and its "Did you mean ...?" suggestion on stderr); an unexpected failure
 * prints one line (no stack trace unless KILN_DEBUG is set) and exits 1.
 *
 * @param argv - the arguments after `kiln`
 * @param io - output streams and clock
 * @returns the exit code
 * @example await runProgram(["plan", "--help"], io) // => 0
 */
export async function runProgram(argv: readonly string[], io: CliIO): Promise<number> {
  let code = 0;
  const program = buildProgram(io, (c) => (code = c));
  if (argv.length === 0) {
    io.stderr(program.helpInformation());
    return 2;
  }
  try {
    await program.parseAsync([...argv], { from: "user" });
    return code;
  } catch (e) {
    if (e instanceof CommanderError) {
      if (e.code === "commander.helpDisplayed" || e.code === "commander.version" || e.code === "commander.help") return 0;
      return 2;
    }
    io.stderr(`kiln: ${e instanceof Error ? e.message : String(e)}\n`);
    if (typeof process !== "undefined" && process.env["KILN_DEBUG"] && e instanceof Error && e.stack) io.stderr(e.stack + "\n");
    return 1;
  }
}
