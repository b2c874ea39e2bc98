/** What `parseArgs` accepts. */
export interface ArgSpec {
  /** Options that take a value: `--name value` or `--name=value` (names without dashes). */
  readonly values?: readonly string[];
  /** Options without a value: `--flag`. */
  readonly flags?: readonly string[];
}

/** The result of `parseArgs`. */
export interface ParsedArgs {
  /** Arguments that are not options, in order. */
  readonly positional: string[];
  /** Option values by name; a repeated option keeps the last value. */
  readonly values: Map<string, string>;
  readonly flags: Set<string>;
  /** User errors in words ("unknown option --sed"), one per problem; empty when all is well. */
  readonly errors: string[];
}

/**
 * A small command-line parser: `--name value`, `--name=value`, `--flag`, positional
 * arguments, and `--` to end the options. Mistakes come back in `errors`, never thrown.
 *
 * @param args - the arguments after the command name
 * @param spec - which names take a value and which are flags
 * @returns positional arguments, values, flags and errors
 * @example parseArgs(["a.tsp", "--seed", "7"], { values: ["seed"] }).values.get("seed") // => "7"
 */
export function parseArgs(args: readonly string[], spec: ArgSpec): ParsedArgs {
  const valueNames = new Set(spec.values ?? []);
  const flagNames = new Set(spec.flags ?? []);
  const out: ParsedArgs = { positional: [], values: new Map(), flags: new Set(), errors: [] };
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg === "--") {
      out.positional.push(...args.slice(i + 1));
      break;
    }
    if (!arg.startsWith("--") || arg === "-") {
      out.positional.push(arg);
      continue;
    }
    const eq = arg.indexOf("=");
    const name = arg.slice(2, eq >= 0 ? eq : undefined);
    if (valueNames.has(name)) {
      const value = eq >= 0 ? arg.slice(eq + 1) : args[i + 1];
      if (value === undefined || (eq < 0 && value.startsWith("--"))) {
        out.errors.push(`--${name} needs a value`);
      } else {
        out.values.set(name, value);
        if (eq < 0) i++;
      }
    } else if (flagNames.has(name) && eq < 0) {
      out.flags.add(name);
    } else if (flagNames.has(name)) {
      out.errors.push(`--${name} takes no value`);
    } else {
      out.errors.push(`unknown option --${name}`);
    }
  }
  return out;
}

/**
 * Reads a numeric option, adding a user error when it is not a number in range.
 *
 * @param parsed - the result of `parseArgs` (its `errors` receives any problem)
 * @param name - the option name without dashes
 * @param check - `min` (inclusive) and whether it must be a whole number
 * @returns the number, or `undefined` when the option is absent or wrong
 * @example numberOption(parseArgs(["--seconds", "5"], { values: ["seconds"] }), "seconds", { min: 0 }) // => 5
 */
export function numberOption(
  parsed: ParsedArgs,
  name: string,
  check: { readonly min: number; readonly integer?: boolean },
): number | undefined {
  const text = parsed.values.get(name);
  if (text === undefined) return undefined;
  const value = Number(text);
  if (text.trim() === "" || !Number.isFinite(value) || value < check.min || (check.integer && !Number.isInteger(value))) {
    const what = check.integer ? "a whole number" : "a number";
    parsed.errors.push(`--${name} must be ${what} >= ${check.min}, got "${text}"`);
    return undefined;
  }
  return value;
}
