/**
 * PointerHold: a settings update that arrives while a pointer is pressed (a field's `change` on
 * the pointer down of a click elsewhere, as browsers fire it: UI Events / HTML focus update steps)
 * waits until the pointer is released and the click has been dispatched.
 */
import { describe, expect, it, vi } from "vitest";
import { PointerHold } from "../../src/taskpane/pointerHold.js";

describe("PointerHold", () => {
  it("runs an update at once when no pointer is pressed", () => {
    const hold = new PointerHold(new EventTarget());
    const update = vi.fn();
    hold.run(update);
    expect(update).toHaveBeenCalledTimes(1);
  });

  it("holds updates during a press, runs each once after release and after the click", async () => {
    vi.useFakeTimers();
    try {
      const doc = new EventTarget();
      const hold = new PointerHold(doc);
      const order: string[] = [];
      const update = () => order.push("update");
      doc.dispatchEvent(new Event("pointerdown"));
      hold.run(update);
      hold.run(update); // change and input of the same edit: one update
      expect(order).toEqual([]);
      doc.dispatchEvent(new Event("pointerup"));
      order.push("click"); // dispatched in the same task as pointerup
      expect(order).toEqual(["click"]);
      await vi.runAllTimersAsync();
      expect(order).toEqual(["click", "update"]);
    } finally {
      vi.useRealTimers();
    }
  });

  it("a cancelled press releases the held updates too", async () => {
    vi.useFakeTimers();
    try {
      const doc = new EventTarget();
      const hold = new PointerHold(doc);
      const update = vi.fn();
      doc.dispatchEvent(new Event("pointerdown"));
      hold.run(update);
      doc.dispatchEvent(new Event("pointercancel"));
      await vi.runAllTimersAsync();
      expect(update).toHaveBeenCalledTimes(1);
    } finally {
      vi.useRealTimers();
    }
  });
});
