import { resolve } from "node:path";
import { fileURLToPath } from "node:url";

/**
 * The benchmark folder of the benches, with a trailing slash: `KILN_BENCHMARKS_DIR` when set,
 * otherwise `../shared/benchmarks` beside the checkout (TSPLIB in `tsplib/`, Solomon in `solomon/`).
 */
export const BENCHMARKS_DIR = process.env["KILN_BENCHMARKS_DIR"]
  ? resolve(process.env["KILN_BENCHMARKS_DIR"]) + "/"
  : fileURLToPath(new URL("../../shared/benchmarks/", import.meta.url));
