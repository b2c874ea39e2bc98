/**
 * The command-line flags every headless Chromium the project starts gets (the browser tests in
 * test/browser and the page benches in bench/), in one place: no sandbox (root in CI), no GPU,
 * and nothing fetched in the background, so nothing leaves the machine.
 */
export const CHROMIUM_FLAGS = [
  "--no-sandbox",
  "--disable-gpu",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
] as const;
