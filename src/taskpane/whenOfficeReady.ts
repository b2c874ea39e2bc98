/**
 * Which host the pane runs in. taskpane.html loads office.js (from Microsoft's CDN) only when
 * an Office host may be around, and records that hint in `window.__kilnOffice`. Outside Office,
 * `Office.onReady` resolves with `host` null. Inside Office it can take several seconds
 * (office.js, the Excel host script, a language file): with the hint present the pane waits
 * at least `CONNECT_TIMEOUT_MS` and shows "Connecting to Excel…" meanwhile (OFFICE-NOTES.md).
 */

/** How long the pane waits for Office when the host hint is present (at least 20 s). */
export const CONNECT_TIMEOUT_MS = 20_000;

/** What taskpane.html's inline script leaves on `window` about office.js. */
export interface OfficeHint {
  /** An Office host may be around, so office.js was requested. */
  readonly hint: boolean;
  /** The office.js script failed to load (network, blocked CDN). */
  readonly failed?: boolean;
}

/** The answer of `whenOfficeReady`. */
export interface OfficeReady {
  readonly mode: "excel" | "file";
  /** Why the pane runs standalone although a host hint was present (for a note in the pane). */
  readonly why?: string;
  /** After a timeout: resolves true if Office answers late with Excel (the pane may switch). */
  readonly late?: Promise<boolean>;
}

/**
 * Wait for Office.
 *
 * @param options - the hint from the page, the wait with the hint (default `CONNECT_TIMEOUT_MS`)
 *   and without it (default 2500 ms), and `onWaiting`, called once when the long wait starts
 * @returns the mode, why it fell back, and a promise of a late answer
 * @example const { mode } = await whenOfficeReady({ hint: readHint() }); // => "file" in a plain browser tab
 */
export async function whenOfficeReady(options: {
  readonly hint: OfficeHint;
  readonly timeoutMs?: number;
  readonly noHintTimeoutMs?: number;
  readonly onWaiting?: () => void;
}): Promise<OfficeReady> {
  const office = (globalThis as { Office?: typeof Office }).Office;
  if (!office || typeof office.onReady !== "function") {
    if (!options.hint.hint) return { mode: "file" };
    return { mode: "file", why: "office.js could not be loaded from Microsoft's CDN (offline or blocked?)" };
  }
  const waitMs = options.hint.hint ? (options.timeoutMs ?? CONNECT_TIMEOUT_MS) : (options.noHintTimeoutMs ?? 2500);
  if (options.hint.hint) options.onWaiting?.();
  const ready = office
    .onReady()
    .then((info): "excel" | "file" => (info && info.host === office.HostType.Excel ? "excel" : "file"))
    .catch((): "file" => "file");
  let timer: ReturnType<typeof setTimeout> | undefined;
  const timeout = new Promise<"timeout">((resolve) => (timer = setTimeout(() => resolve("timeout"), waitMs)));
  const first = await Promise.race([ready, timeout]);
  clearTimeout(timer);
  if (first !== "timeout") return { mode: first };
  return {
    mode: "file",
    why: `Excel did not answer within ${Math.round(waitMs / 1000)} s`,
    late: ready.then((mode) => mode === "excel"),
  };
}

/** The hint taskpane.html left on `window` (none when the page was opened some other way). */
export function readOfficeHint(): OfficeHint {
  const w = globalThis as { __kilnOffice?: OfficeHint };
  return { hint: w.__kilnOffice?.hint === true, failed: w.__kilnOffice?.failed === true };
}
