/**
 * The pane inside Excel: tables come from the user's selection (or the whole Excel table it lies
 * in), error addresses select their cell, plans are written through `ExcelWorkbook`.
 */
import { ExcelWorkbook } from "../workbook/excel/ExcelWorkbook.js";
import type { LatLon } from "../core/index.js";
import { fillGeographyCoordinates } from "../sheets/fillGeographyCoordinates.js";
import { placeColumns } from "../sheets/placeColumns.js";
import { sheetRef } from "../sheets/cellAddress.js";
import { blockA1 } from "../workbook/excel/rangeAddress.js";
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
      watchSheets: async (listener) => (await book.watchSheets(listener)).added,
      pickSelection: async (table) => {
        const selection = await book.readSelection();
        if (table === "fleet" || !book.capabilities().geography) return { read: selection.read, address: selection.address };
        // Stops typed as Geography cells carry their coordinates in valuesAsJson (ExcelApi 1.16):
        // read only the columns that may hold places; on any failure keep the plain values.
        const read = selection.read;
        const places: (LatLon | undefined)[][] = read.values.map((r) => r.map(() => undefined));
        for (const c of placeColumns(read)) {
          const rows = read.values.length;
          const address = `${sheetRef(read.sheet)}!${blockA1({ row: read.row, col: read.col + c, rows, cols: 1 })}`;
          const geo = await book.readGeography(address);
          if (!geo.available) {
            notices.show?.(`Geography cells of ${address} were not read (${geo.reason}); the plain cell values were used instead.`);
            return { read, address: selection.address };
          }
          geo.cells.forEach((row, r) => {
            const cell = row[0];
            if (cell?.kind === "place") places[r]![c] = cell.at;
          });
        }
        // The filled copy shows Latitude/Longitude among the recognised columns; the sheet is untouched.
        return { read: fillGeographyCoordinates(read, places).read, address: selection.address };
      },
    });
    notices.show = (m) => this.showError(m);
  }

  override init(): void {
    super.init();
    void this.suggestScenarioName().catch((err: unknown) => console.error("Could not list the sheets", err));
    // The Settings sheet first: it is never offered as a distance matrix.
    void this.loadWorkbookSettings()
      .catch((err: unknown) => this.showError(`Reading the Settings sheet failed: ${String(err)}`))
      .then(() => this.refreshMatrixList());
  }
}
