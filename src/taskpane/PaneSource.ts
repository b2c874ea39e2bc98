/**
 * What the pane needs from where its tables live: Excel (through Office.js) or a file opened
 * in the standalone page (through exceljs). The pane never touches either directly.
 */
import type { SheetRead, WorkbookPort } from "../workbook/WorkbookPort.js";

/** A table the user picked, and where it came from ("Stops!A1:J81"). */
export interface PickedTable {
  readonly read: SheetRead;
  readonly address: string;
}

/** The pane's view of a workbook. */
export interface PaneSource {
  readonly mode: "excel" | "file";
  /** The workbook the plan is written to. */
  readonly port: WorkbookPort;
  /** Select a cell so the user sees an error's cell (Excel only). */
  selectCell?(sheet: string, cell: string): Promise<void>;
  /** The sheet the user is on (Excel only), for "Rerun". */
  activeSheetName?(): Promise<string>;
  /**
   * The selected range, or the whole table it belongs to (Excel only). For the stops table,
   * coordinates of Geography cells are filled in where the host exposes them.
   */
  pickSelection?(table: "stops" | "fleet"): Promise<PickedTable>;
  /**
   * Call `listener` when sheets are added, deleted or renamed in the workbook (Excel only, where
   * the host has the events); resolves to whether any change is watched.
   */
  watchSheets?(listener: (change: { readonly kind: string; readonly from?: string; readonly to?: string }) => void): Promise<boolean>;
}
