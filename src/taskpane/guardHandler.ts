/**
 * The pane's one error boundary: every event handler is wrapped once, so a failure shows as a
 * message in the pane (never a silent console line or a dead pane), and an Office error's
 * `debugInfo` goes to the console for the developer.
 */

/** A wrapped handler: same arguments, never throws, never rejects. */
export type Guarded<A extends unknown[]> = (...args: A) => void;

/**
 * Make a wrapper for handlers that reports failures through `show`.
 *
 * @param show - puts a message in the pane
 * @returns `guard(name, handler)`; `name` says what the user was doing ("Plan routes")
 * @example button.onclick = guard("Plan routes", () => optimize());
 */
export function createGuard(show: (message: string) => void) {
  return function guard<A extends unknown[]>(name: string, handler: (...args: A) => unknown): Guarded<A> {
    const report = (err: unknown): void => {
      const debugInfo = (err as { debugInfo?: unknown } | null)?.debugInfo;
      if (debugInfo !== undefined) console.error(`${name}: Office debugInfo`, debugInfo);
      console.error(`${name} failed`, err);
      show(`${name} failed: ${describeError(err)}`);
    };
    return (...args: A) => {
      try {
        const out = handler(...args);
        if (out instanceof Promise) out.catch(report);
      } catch (err) {
        report(err);
      }
    };
  };
}

/**
 * A short, user-facing text for any thrown value.
 *
 * @param err - what was thrown
 * @returns its message
 * @example describeError(new RangeError("alpha must be in (0, 1)")) // => "alpha must be in (0, 1)"
 */
export function describeError(err: unknown): string {
  if (err instanceof Error) return err.message || err.name;
  if (typeof err === "string") return err;
  try {
    return JSON.stringify(err);
  } catch {
    return String(err);
  }
}
