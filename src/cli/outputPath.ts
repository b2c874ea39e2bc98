import { access, realpath } from "node:fs/promises";
import { basename, dirname, extname, join, resolve } from "node:path";

/**
 * Where `plan` writes: `--out` as given (but never the input itself), or the first free
 * `NAME.plan.xlsx`, `NAME.plan-2.xlsx`, ... beside the input.
 *
 * @param inputPath - absolute path of the input workbook
 * @param out - the `--out` value, if any
 * @param suffix - the word before .xlsx of the default name ("plan"; `kiln geocode` uses "geocoded")
 * @returns the path and whether the user chose it, or a user error
 * @example await outputPath("/data/week.xlsx") // => { path: "/data/week.plan.xlsx", explicit: false }
 */
export async function outputPath(
  inputPath: string,
  out?: string,
  suffix = "plan",
): Promise<{ path: string; explicit: boolean } | { error: string }> {
  if (out !== undefined) {
    const path = resolve(out);
    if ((await canonical(path)) === (await canonical(inputPath))) {
      return { error: `--out ${out}: that is the input workbook; kiln never writes over its input, choose another file` };
    }
    return { path, explicit: true };
  }
  const dir = dirname(inputPath);
  const ext = extname(inputPath);
  const stem = basename(inputPath, ext);
  for (let n = 1; n < 10_000; n++) {
    const path = join(dir, `${stem}.${suffix}${n === 1 ? "" : `-${n}`}.xlsx`);
    if (!(await exists(path))) return { path, explicit: false };
  }
  return { error: `${inputPath}: no free NAME.${suffix}-N.xlsx name beside it; name the output with --out` };
}

async function exists(path: string): Promise<boolean> {
  try {
    await access(path);
    return true;
  } catch {
    return false;
  }
}

/**
 * A path with symbolic links resolved when it exists, else made absolute: two names compare
 * equal when they reach the same file.
 *
 * @param path - any path
 * @returns the canonical absolute path
 * @example await canonical("./week.xlsx") // => "/data/week.xlsx"
 */
export async function canonical(path: string): Promise<string> {
  try {
    return await realpath(path);
  } catch {
    return resolve(path);
  }
}
