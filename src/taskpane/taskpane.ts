/**
 * Entry of the task pane page: decide between Excel and the standalone page, then start the
 * matching pane. A failure to start shows in the page itself.
 */
import { describeError } from "./guardHandler.js";
import { whenOfficeReady } from "./whenOfficeReady.js";

async function boot(): Promise<void> {
  const mode = await whenOfficeReady();
  if (mode === "excel") {
    const { ExcelPaneController } = await import("./ExcelPaneController.js");
    new ExcelPaneController().init();
  } else {
    const { FilePaneController } = await import("./FilePaneController.js");
    new FilePaneController().init();
  }
  document.body.dataset.ready = "true";
}

boot().catch((err: unknown) => {
  console.error("Kiln pane failed to start", err);
  const box = document.getElementById("pane-error");
  const text = document.getElementById("pane-error-text");
  if (box && text) {
    text.textContent = `The pane could not start: ${describeError(err)}. Reload the pane; if it persists, report this message.`;
    box.hidden = false;
  }
});
