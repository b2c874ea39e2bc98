/** Which optional features this Excel supports (requirement sets, OFFICE-NOTES.md). */
export interface ExcelCapabilities {
  /** Chart series from ranges, ExcelApi 1.7. */
  readonly charts: boolean;
  /** `freezePanes`, ExcelApi 1.7. */
  readonly freezePanes: boolean;
  /** `range.getTables`, ExcelApi 1.9. */
  readonly tables: boolean;
  /** `worksheet.pageLayout` and `horizontalPageBreaks`, ExcelApi 1.9. */
  readonly printLayout: boolean;
  /** `getMergedAreasOrNullObject` (merged group headers above a table), ExcelApi 1.13. */
  readonly merges: boolean;
  /** `valuesAsJson` (Geography linked entities), ExcelApi 1.16. */
  readonly geography: boolean;
  /** `worksheets.onAdded` and `onDeleted`, ExcelApi 1.7. */
  readonly sheetEvents: boolean;
  /** `worksheets.onNameChanged`, ExcelApi 1.17. */
  readonly sheetRenameEvents: boolean;
}

/** Optional features of the running Excel; all false outside Office. */
export function excelCapabilities(): ExcelCapabilities {
  const has = (version: string): boolean =>
    typeof Office !== "undefined" && Office.context?.requirements?.isSetSupported("ExcelApi", version) === true;
  return {
    charts: has("1.7"),
    freezePanes: has("1.7"),
    tables: has("1.9"),
    printLayout: has("1.9"),
    merges: has("1.13"),
    geography: has("1.16"),
    sheetEvents: has("1.7"),
    sheetRenameEvents: has("1.17"),
  };
}
