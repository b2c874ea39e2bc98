/**
 * Entry of the task pane page: decide between Excel and the standalone page, then start the
 * matching pane. With an Office host hint the badge says "Connecting to Excel…" while Office
 * starts; if Excel answers only after the wait, the pane reloads into Excel mode unless the
 * user has started working in the standalone pane. A failure to start shows in the page itself.
 */
import { describeError } from "./guardHandler.js";
import { officeDiagnostics } from "./officeDiagnostics.js";
import { readOfficeHint, whenOfficeReady } from "./whenOfficeReady.js";

function showBanner(message: string): void {
  const box = document.getElementById("pane-error");
  const text = document.getElementById("pane-error-text");
  if (box && text) {
    text.textContent = message;
    box.hidden = false;
  }
}

async function boot(): Promise<void> {
  const badge = document.getElementById("mode-badge");
  const ready = await whenOfficeReady({
    hint: readOfficeHint(),
    onWaiting: () => {
      if (badge) {
        badge.dataset.mode = "connecting";
        badge.textContent = "Connecting to Excel…";
      }
    },
  });
  const diagnostics = document.getElementById("diagnostics");
  if (diagnostics) diagnostics.textContent = officeDiagnostics();
  if (ready.mode === "excel") {
    const { ExcelPaneController } = await import("./ExcelPaneController.js");
    new ExcelPaneController().init();
  } else {
    const { FilePaneController } = await import("./FilePaneController.js");
    new FilePaneController().init();
    if (ready.why) showBanner(`${ready.why}; the pane runs as the standalone planner on files. Reload the pane to try Excel again.`);
    void ready.late?.then((excel) => {
      if (!excel) return;
      if (!touched) window.location.reload();
      else showBanner("Excel answered late. Reload the pane to switch to Excel mode (your work in this pane is not kept).");
    });
  }
  document.body.dataset.ready = "true";
}

let touched = false;
for (const kind of ["pointerdown", "keydown"]) document.addEventListener(kind, () => (touched = true), { once: true });

boot().catch((err: unknown) => {
  console.error("Kiln pane failed to start", err);
  showBanner(`The pane could not start: ${describeError(err)}. Reload the pane; if it persists, report this message.`);
});
