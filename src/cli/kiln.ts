#!/usr/bin/env node
// The `kiln` command of the package: compiled to dist/cli/cli/kiln.js, which `bin` points at.
import { main, processIO } from "./main.js";

try {
  process.exitCode = await main(process.argv.slice(2), processIO());
} catch (e) {
  process.stderr.write(`kiln: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 1;
}
