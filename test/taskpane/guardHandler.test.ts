import { describe, expect, it, vi } from "vitest";
import { createGuard, describeError } from "../../src/taskpane/guardHandler.js";

describe("createGuard (the pane's one error boundary)", () => {
  it("shows a thrown error in the pane instead of letting it escape", () => {
    const shown: string[] = [];
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const handler = createGuard((m) => shown.push(m))("Plan routes", () => {
      throw new RangeError("alpha must be in (0, 1), got 2");
    });
    expect(() => handler()).not.toThrow();
    expect(shown).toEqual(["Plan routes failed: alpha must be in (0, 1), got 2"]);
    errors.mockRestore();
  });

  it("shows a rejected promise and logs an Office error's debugInfo to the console (OfficeExtension.Error shape)", async () => {
    const shown: string[] = [];
    const logged: unknown[][] = [];
    const errors = vi.spyOn(console, "error").mockImplementation((...args: unknown[]) => void logged.push(args));
    const officeError = Object.assign(new Error("The requested resource doesn't exist."), {
      code: "ItemNotFound",
      debugInfo: { errorLocation: "Worksheet.getItem" },
    });
    createGuard((m) => shown.push(m))("Write to workbook", async () => {
      throw officeError;
    })();
    await new Promise((r) => setTimeout(r, 0));
    expect(shown).toEqual(["Write to workbook failed: The requested resource doesn't exist."]);
    expect(logged.some((args) => args.includes(officeError.debugInfo))).toBe(true);
    errors.mockRestore();
  });

  it("describeError reads errors, strings and plain objects", () => {
    expect(describeError(new TypeError("x must be a number"))).toBe("x must be a number");
    expect(describeError("plain text")).toBe("plain text");
    expect(describeError({ code: 7 })).toBe('{"code":7}');
  });
});
