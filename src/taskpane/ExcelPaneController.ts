/**
 * The pane inside Excel: tables come from the user's selection (or the whole Excel table it lies
 * in), error addresses select their cell, plans are written through `ExcelWorkbook`.
 */
import { ExcelWorkbook } from "../workbook/excel/ExcelWorkbook.js";
import { fillGeographyCoordinates } from "../sheets/fillGeographyCoordinates.js";
import { PaneController } from "./PaneController.js";

/** The Excel task pane. */
export class ExcelPaneController extends PaneController {
  constructor() {
    // The notice callback needs `this`, which exists only after super(): route it through a holder.
    const notices: { show?: (m: string) => void } = {};
    const book = new ExcelWorkbook({ onNotice: (m) => notices.show?.(m) });
    super({
      mode: "excel",
      port: book,
      selectCell: (sheet, cell) => book.selectCell(sheet, cell),
      activeSheetName: () => book.activeSheetName(),
      pickSelection: async (table) => {
        const selection = await book.readSelection();
        if (table === "fleet" || !book.capabilities().geography) return { read: selection.read, address: selection.address };
        // Stops typed as Geography cells carry their coordinates in valuesAsJson (ExcelApi 1.16).
        const geo = await book.readGeography(selection.address);
        if (!geo.available) return { read: selection.read, address: selection.address };
        const places = geo.cells.map((row) => row.map((c) => (c.kind === "place" ? c.at : undefined)));
        // The filled copy shows Latitude/Longitude among the recognised columns; the sheet is untouched.
        return { read: fillGeographyCoordinates(selection.read, places).read, address: selection.address };
      },
    });
    notices.show = (m) => this.showError(m);
  }

  override init(): void {
    super.init();
    void this.suggestScenarioName().catch((err: unknown) => console.error("Could not list the sheets", err));
  }
}
