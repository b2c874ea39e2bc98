/**
 * Which host the pane runs in. taskpane.html loads office.js only when an Office host may be
 * around (no `Office` global: standalone at once). Outside Office, `Office.onReady` resolves with
 * `host` null; when office.js failed to load or never answers, a short timeout decides
 * "standalone" instead.
 */

/**
 * Wait for Office, at most `timeoutMs`.
 *
 * @param timeoutMs - how long to wait for `Office.onReady` (ms, default 2500)
 * @returns "excel" inside Excel, "file" otherwise (standalone page)
 * @example const mode = await whenOfficeReady(); // => "file" in a plain browser tab
 */
export async function whenOfficeReady(timeoutMs = 2500): Promise<"excel" | "file"> {
  const office = (globalThis as { Office?: typeof Office }).Office;
  if (!office || typeof office.onReady !== "function") return "file";
  const timeout = new Promise<"file">((resolve) => setTimeout(() => resolve("file"), timeoutMs));
  const ready = office
    .onReady()
    .then((info): "excel" | "file" => (info && info.host === office.HostType.Excel ? "excel" : "file"))
    .catch((): "file" => "file");
  return Promise.race([ready, timeout]);
}
