/**
 * An Office.js failure with a message that says what the add-in was doing, the Office
 * error code (e.g. "ItemNotFound", "InvalidArgument") and the `debugInfo` Office attaches
 * (kept for logging, STYLE.md §9: the pane shows `message`, logs `debugInfo`).
 */
export class OfficeActionError extends Error {
  /** Office error code, when the error came from Office.js. */
  readonly code: string | undefined;
  /** `OfficeExtension.Error.debugInfo` (error location, statement), for logs only. */
  readonly debugInfo: unknown;

  /**
   * @param action - what failed, as a verb phrase ("write the sheet \"Run 1\"")
   * @param cause - the error Office.js threw (or anything else that was thrown)
   * @example new OfficeActionError("read the selection", e).message
   *   // "Could not read the selection: The requested resource doesn't exist. (ItemNotFound)"
   */
  constructor(action: string, cause: unknown) {
    const fields = isRecord(cause) ? cause : {};
    const code = typeof fields["code"] === "string" ? fields["code"] : undefined;
    const detail = cause instanceof Error || typeof fields["message"] === "string" ? String(fields["message"]) : String(cause);
    super(`Could not ${action}: ${detail}${code ? ` (${code})` : ""}`, { cause });
    this.name = "OfficeActionError";
    this.code = code;
    this.debugInfo = fields["debugInfo"];
  }
}

/**
 * Whether an error thrown by `context.sync()` is Office's "item not found" (a missing sheet).
 * @example isItemNotFound({ code: "ItemNotFound" }) // true
 */
export function isItemNotFound(error: unknown): boolean {
  return isRecord(error) && error["code"] === "ItemNotFound";
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null;
}
