#!/usr/bin/env node
// The `kiln` command: registers tsx so Node can load the TypeScript sources, then runs the CLI.
import { register } from "tsx/esm/api";

register();
const { main, processIO } = await import("../src/cli/main.ts");
process.exitCode = await main(process.argv.slice(2), processIO());
