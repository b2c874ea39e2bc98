// `npm run check:package`: packs the package, installs the tarball into an empty temporary
// folder (no repository, no TypeScript tooling) and runs the installed command there:
// `npx kiln --help` and `npx kiln plan` on a copy of the demo workbook. Exits 1 on any failure.
import { execFileSync } from "node:child_process";
import { copyFileSync, existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("..", import.meta.url));
const scratch = mkdtempSync(join(tmpdir(), "kiln-package-"));
const run = (cmd, args, cwd) => execFileSync(cmd, args, { cwd, encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
const problems = [];

try {
  // `npm pack` runs `prepare`, which compiles the command line into dist/cli/.
  const [packed] = JSON.parse(run("npm", ["pack", "--json", "--pack-destination", scratch], root));
  const shipped = packed.files.map((f) => f.path);
  const expected = (p) => (p.startsWith("dist/cli/") && p.endsWith(".js")) || ["package.json", "README.md", "LICENSE"].includes(p);
  const unexpected = shipped.filter((p) => !expected(p));
  if (unexpected.length > 0) problems.push(`the tarball ships more than the compiled command: ${unexpected.join(", ")}`);
  if (!shipped.includes("dist/cli/cli/kiln.js")) problems.push("the tarball lacks dist/cli/cli/kiln.js");
  if (shipped.some((p) => p.endsWith(".ts"))) problems.push("the tarball ships TypeScript sources");

  const app = join(scratch, "app");
  run("mkdir", ["-p", app]);
  writeFileSync(join(app, "package.json"), JSON.stringify({ name: "kiln-install-check", private: true }) + "\n");
  run("npm", ["install", "--no-audit", "--no-fund", "--prefer-offline", join(scratch, packed.filename)], app);
  for (const tool of ["typescript", "tsx", "ts-node"]) {
    if (existsSync(join(app, "node_modules", tool))) problems.push(`installing the tarball pulled in ${tool}`);
  }

  const help = run("npx", ["--no-install", "kiln", "--help"], app);
  if (!/solve/.test(help)) problems.push(`kiln --help did not list the solve command:\n${help}`);
  const version = run("npx", ["--no-install", "kiln", "--version"], app).trim();
  if (version !== packed.version) problems.push(`kiln --version printed "${version}", the package is ${packed.version}`);

  copyFileSync(join(root, "demo", "kiln-demo.xlsx"), join(app, "demo.xlsx"));
  const solved = run("npx", ["--no-install", "kiln", "plan", "demo.xlsx", "--moves", "20000", "--seed", "1"], app);
  if (!existsSync(join(app, "demo.plan.xlsx"))) problems.push(`kiln plan wrote no demo.plan.xlsx:\n${solved}`);
  console.log(`${packed.filename}: ${shipped.length} files, ${(packed.size / 1024).toFixed(0)} kB packed; installed and ran:`);
  console.log(solved.trim().split("\n").slice(0, 6).join("\n"));
} catch (err) {
  problems.push(`${err.message}${err.stderr ? `\n${err.stderr}` : ""}`);
} finally {
  rmSync(scratch, { recursive: true, force: true });
}

if (problems.length > 0) {
  console.error(`Package check failed:\n- ${problems.join("\n- ")}`);
  process.exit(1);
}
console.log("Package check passed: the tarball installs into an empty folder and plans the demo.");
