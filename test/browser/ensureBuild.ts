/**
 * Build the add-in and the standalone page into dist/ when the sources are newer, once even when
 * several browser test files start together (vitest runs files in parallel): a lock directory
 * (mkdir is atomic) lets one file build while the others wait, then they see a fresh dist/.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, readdirSync, rmSync, statSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = resolve(fileURLToPath(new URL("../..", import.meta.url)));
export const DIST = join(ROOT, "dist");
const LOCK = join(ROOT, ".browser-build.lock");

/** Newest modification time under `dir` (ms). */
function newest(dir: string): number {
  let t = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, entry.name);
    t = Math.max(t, entry.isDirectory() ? newest(p) : statSync(p).mtimeMs);
  }
  return t;
}

function isFresh(): boolean {
  const built = join(DIST, "taskpane.html");
  const sources = Math.max(newest(join(ROOT, "src")), statSync(join(ROOT, "webpack.config.js")).mtimeMs);
  return existsSync(built) && statSync(built).mtimeMs >= sources;
}

/** Build dist/ unless it is newer than every source; waits for a build another test file started. */
export async function ensureBuild(): Promise<void> {
  for (;;) {
    if (isFresh()) return;
    try {
      mkdirSync(LOCK);
    } catch {
      // Another file is building: wait for it, then look again (a lock older than 15 minutes is stale).
      if (existsSync(LOCK) && Date.now() - statSync(LOCK).mtimeMs > 900_000) rmSync(LOCK, { recursive: true, force: true });
      await new Promise((ok) => setTimeout(ok, 2000));
      continue;
    }
    try {
      if (isFresh()) return;
      execFileSync(process.execPath, [join(ROOT, "node_modules", "webpack", "bin", "webpack.js"), "--mode", "production"], {
        cwd: ROOT,
        stdio: "inherit",
        timeout: 600_000,
      });
      return;
    } finally {
      rmSync(LOCK, { recursive: true, force: true });
    }
  }
}
