/**
 * One standalone-page session for the browser tests: the built page served from 127.0.0.1, Debian's
 * Chromium (never a downloaded one) in a fresh profile with the flags the project uses, page errors
 * printed, and every request refused unless it goes to that server, a blob or a data URL (nothing
 * may leave the machine).
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { CHROMIUM_FLAGS } from "../../scripts/chromiumFlags.js";
import { serveStatic } from "../../scripts/serveStatic.js";
import { DIST, ensureBuild } from "./ensureBuild.js";

/** A page on the served build, with a scratch folder for files; `close` undoes all of it. */
export interface PageSession {
  readonly page: Page;
  /** The browser context, for a test that needs a second page with its own request rules. */
  readonly context: BrowserContext;
  readonly baseUrl: string;
  /** Scratch folder (the browser profile sits inside it), removed by `close`. */
  readonly dir: string;
  close(): Promise<void>;
}

/**
 * Build the page if needed, serve it and open Chromium on it.
 *
 * @param chromiumPath - the Chromium executable
 * @param prefix - name prefix of the scratch folder
 * @param options - viewport and whether downloads are accepted (both as the test needs)
 * @returns the session
 */
export async function openPageSession(
  chromiumPath: string,
  prefix: string,
  options: { viewport?: { width: number; height: number }; acceptDownloads?: boolean } = {},
): Promise<PageSession> {
  await ensureBuild();
  const { server, url: baseUrl } = await serveStatic(DIST);
  const dir = mkdtempSync(join(tmpdir(), prefix));
  let context: BrowserContext | undefined;
  const close = async (): Promise<void> => {
    await context?.close();
    await new Promise<void>((ok) => server.close(() => ok()));
    rmSync(dir, { recursive: true, force: true });
  };
  try {
    context = await chromium.launchPersistentContext(join(dir, "profile"), {
      executablePath: chromiumPath,
      headless: true,
      args: [...CHROMIUM_FLAGS],
      viewport: options.viewport ?? { width: 360, height: 900 },
      acceptDownloads: options.acceptDownloads ?? true,
    });
    const page = context.pages()[0] ?? (await context.newPage());
    page.on("pageerror", (err) => console.error("page error:", err.message));
    await page.route("**/*", (route) => {
      const url = route.request().url();
      if (url.startsWith(baseUrl) || url.startsWith("blob:") || url.startsWith("data:")) return route.continue();
      return route.abort();
    });
    return { page, context, baseUrl, dir, close };
  } catch (e) {
    await close();
    throw e;
  }
}
