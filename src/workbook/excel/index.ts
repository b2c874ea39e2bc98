export { ExcelWorkbook } from "./ExcelWorkbook.js";
export type { ExcelWorkbookOptions, ExcelCapabilities, SelectionRead, GeographyRead } from "./ExcelWorkbook.js";
export type { GeographyCell } from "./geographyFromCell.js";
export { geographyFromCell } from "./geographyFromCell.js";
export { OfficeActionError, isItemNotFound } from "./OfficeActionError.js";
export { parseRangeAddress, cellA1, blockA1 } from "./rangeAddress.js";
export { planGridWrite, isFormulaLike, CHUNK_CELLS_DEFAULT } from "./planGridWrite.js";
export type { GridWritePlan, GridChunk, PlanGridWriteOptions } from "./planGridWrite.js";
export { columnWidthPoints } from "./columnWidthPoints.js";
