/**
 * Holds layout-changing updates while a pointer is pressed. A click on Plan routes right after
 * typing in a field first blurs the field (its `change` event fires on pointer down); if the
 * pane re-rendered then, the preview text and issue lists could move the button from under the
 * pointer and the click would land elsewhere. Updates wait for the pointer to be released (and
 * the click to be dispatched), then run once, in order.
 */
export class PointerHold {
  #down = false;
  readonly #queued: (() => void)[] = [];

  /** @param target - the document whose pointer presses hold updates */
  constructor(target: Pick<Document, "addEventListener">) {
    target.addEventListener("pointerdown", () => (this.#down = true), true);
    const release = (): void => {
      this.#down = false;
      // After pointerup the browser dispatches the click in the same task; run the updates after it.
      setTimeout(() => this.#flush(), 0);
    };
    target.addEventListener("pointerup", release, true);
    target.addEventListener("pointercancel", release, true);
  }

  /**
   * Run `update` now, or once the pressed pointer is released.
   * @param update - the update that may change the layout
   */
  run(update: () => void): void {
    if (!this.#down) {
      update();
      return;
    }
    if (!this.#queued.includes(update)) this.#queued.push(update);
  }

  #flush(): void {
    if (this.#down) return;
    for (const update of this.#queued.splice(0)) update();
  }
}
