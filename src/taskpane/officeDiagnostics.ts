/**
 * One line a user can copy into a support request: host, platform, Office version and the
 * highest ExcelApi requirement set the host supports. `Office.context.diagnostics`
 * (ContextInformation: host, platform, version) and
 * `Office.context.requirements.isSetSupported` are Office's Common API.
 */

/** Newest ExcelApi set probed; sets are numbered 1.1, 1.2, … without gaps. */
const NEWEST_PROBED_MINOR = 30;

/**
 * The highest ExcelApi set `isSupported` accepts, probing 1.1 upwards.
 * @example highestExcelApi((v) => ["1.1", "1.2"].includes(v)) // => "1.2"
 */
export function highestExcelApi(isSupported: (version: string) => boolean): string | undefined {
  let best: string | undefined;
  for (let minor = 1; minor <= NEWEST_PROBED_MINOR; minor++) {
    if (!isSupported(`1.${minor}`)) break;
    best = `1.${minor}`;
  }
  return best;
}

/**
 * The diagnostics line of the running Office host, or a line saying there is none.
 * @example officeDiagnostics() // => "Excel · OfficeOnline · 16.0.18025.10000 · ExcelApi 1.17"
 */
export function officeDiagnostics(): string {
  const office = (globalThis as { Office?: typeof Office }).Office;
  const context = office?.context;
  if (!context) return "No Office host (standalone page)";
  const d = context.diagnostics;
  const api = highestExcelApi((v) => context.requirements?.isSetSupported("ExcelApi", v) === true);
  return [
    d?.host ?? "unknown host",
    d?.platform ?? "unknown platform",
    d?.version ?? "unknown version",
    api ? `ExcelApi ${api}` : "no ExcelApi",
  ].join(" · ");
}
