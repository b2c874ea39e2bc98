// Reads vitest's JSON report of the reference folder run without the benchmark folder and
// fails unless the fixture checks ran and passed (TSPLIB and Solomon) and the suite checks skipped.
import { readFileSync } from "node:fs";

const report = JSON.parse(readFileSync(process.argv[2], "utf8"));
const tests = report.testResults.flatMap((file) => file.assertionResults);
const count = (pred) => tests.filter(pred).length;
const fixtures = (word) => (t) => t.ancestorTitles.join(" ").includes(word) && t.ancestorTitles.join(" ").includes("fixtures)");
const problems = [];
const ranFixtures = [];
for (const word of ["TSPLIB95", "Solomon"]) {
  const ran = count((t) => fixtures(word)(t) && t.status === "passed");
  const other = count((t) => fixtures(word)(t) && t.status !== "passed");
  ranFixtures.push(`${ran} ${word}`);
  if (ran === 0 || other > 0) problems.push(`${word} fixture checks: ${ran} passed, ${other} not passed`);
}
const suite = tests.filter((t) => t.ancestorTitles.join(" ").includes("benchmark folder"));
if (suite.length === 0 || suite.some((t) => t.status !== "skipped" && t.status !== "pending")) {
  problems.push(`suite checks without the benchmark folder: ${suite.map((t) => t.status).join(", ") || "none found"} (expected skipped)`);
}
if (report.numFailedTests > 0) problems.push(`${report.numFailedTests} failed`);
if (problems.length > 0) {
  console.error(`Reference run without the benchmark folder: ${problems.join("; ")}`);
  process.exit(1);
}
const passed = tests.filter((t) => t.status === "passed").length;
console.log(
  `Reference run without the benchmark folder: ${passed} passed (fixture checks: ${ranFixtures.join(", ")}), ${suite.length} suite checks skipped.`,
);
