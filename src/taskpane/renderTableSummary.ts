/**
 * The summary under a picked table: its address, the columns recognised and the row count,
 * and the table's errors with clickable cell addresses.
 */
import type { Issue } from "../core/index.js";
import type { ColumnMatch } from "../sheets/ReadResult.js";
import type { TableKind } from "../sheets/matchHeaders.js";
import { readTable } from "../sheets/readTable.js";
import type { PaneDom } from "./paneDom.js";
import type { PickedTable } from "./PaneSource.js";
import { FIELD_LABELS, fieldLabel } from "../sheets/fieldLabels.js";

/** What the column controls of one table need: its kind and where a choice goes. */
export interface ColumnMapping {
  readonly kind: TableKind;
  /** The user chose `field` (a field label, "carry" or "ignore") for the column headed `header`. */
  readonly onMap: (header: string, field: string) => void;
}

/**
 * Show a table's summary and issues.
 *
 * @param summary - the summary element (replaced)
 * @param list - the issues list (replaced)
 * @param table - the address and data rows of the table, or undefined when none is picked
 * @param columns - the columns the reader recognised
 * @param issues - the errors (and, with `warning: true`, notes) about this table
 * @param onCell - called with (sheet, cell) when an address is clicked; absent: addresses are plain text
 * @param mapping - the table's kind and what to call when the user maps a column; absent: columns shown as text
 * @param empty - what to show when no table is picked: what to select or choose (`emptyTableHint`)
 * @example renderTableSummary(summaryEl, listEl, { address: "Stops!A1:J81", rows: 80 }, cols, [], undefined)
 */
export function renderTableSummary(
  summary: HTMLElement,
  list: HTMLElement,
  table: { readonly address: string; readonly rows: number } | undefined,
  columns: readonly ColumnMatch[],
  issues: readonly (Issue & { readonly warning?: boolean })[],
  onCell: ((sheet: string, cell: string) => void) | undefined,
  mapping?: ColumnMapping,
  empty = "No table chosen yet.",
): void {
  summary.replaceChildren();
  list.replaceChildren();
  if (!table) {
    summary.textContent = empty;
    return;
  }
  const head = document.createElement("div");
  const address = document.createElement("strong");
  address.textContent = table.address;
  head.append(address, ` · ${table.rows} data row${table.rows === 1 ? "" : "s"}`);
  summary.append(head);
  if (columns.length > 0) summary.append(columnControls(columns, mapping));
  for (const issue of issues) {
    const item = document.createElement("li");
    if (issue.warning) item.className = "warning";
    if (issue.cell) {
      const where = `${issue.sheet}!${issue.cell}`;
      if (onCell && /^[A-Z]{1,3}[0-9]+$/.test(issue.cell)) {
        const link = document.createElement("button");
        link.type = "button";
        link.className = "link cell";
        link.textContent = where;
        link.title = "Select this cell";
        link.addEventListener("click", () => onCell(issue.sheet, issue.cell));
        item.append(link);
      } else {
        const code = document.createElement("span");
        code.className = "cell";
        code.textContent = where;
        item.append(code);
      }
    }
    // Messages usually start with their own address; do not repeat it.
    const prefix = `${issue.sheet}!${issue.cell}:`;
    item.append(issue.message.startsWith(prefix) ? issue.message.slice(prefix.length).trimStart() : issue.message);
    list.append(item);
  }
}

/**
 * Show the summaries of both picked tables; an issue goes under the fleet when it names the
 * fleet's sheet (and that is not also the stops' sheet), under the stops otherwise.
 *
 * @param d - the pane's elements
 * @param stops - the picked stops table, if any
 * @param fleet - the picked fleet table, if any
 * @param columns - the columns recognised in each table
 * @param issues - every error and warning of the read
 * @param onCell - called with (sheet, cell) when an address is clicked
 * @param onMap - called when the user maps a column of a table to a field, carry or ignore
 * @param empty - what each summary says while its table is not picked (what to select or choose)
 */
export function renderPickedTables(
  d: PaneDom,
  stops: PickedTable | undefined,
  fleet: PickedTable | undefined,
  columns: { readonly stops: readonly ColumnMatch[]; readonly fleet: readonly ColumnMatch[] },
  issues: readonly (Issue & { readonly warning?: boolean })[],
  onCell: ((sheet: string, cell: string) => void) | undefined,
  onMap?: (kind: TableKind, header: string, field: string) => void,
  empty?: (kind: TableKind) => string,
): void {
  const stopsSheet = stops?.read.sheet;
  const fleetSheet = fleet?.read.sheet;
  const forFleet = issues.filter((i) => i.sheet === fleetSheet && i.sheet !== stopsSheet);
  const forStops = issues.filter((i) => !forFleet.includes(i));
  // Data rows as the reader counts them: below the header row, blank rows and title rows left out.
  const rows = (t: PickedTable | undefined, kind: TableKind) =>
    t && { address: t.address, rows: readTable(t.read, kind).table?.rows.length ?? 0 };
  const mapping = (kind: TableKind): ColumnMapping | undefined => onMap && { kind, onMap: (h, f) => onMap(kind, h, f) };
  renderTableSummary(
    d.stopsSummary,
    d.stopsIssues,
    rows(stops, "stops"),
    columns.stops,
    forStops,
    onCell,
    mapping("stops"),
    empty?.("stops"),
  );
  renderTableSummary(
    d.fleetSummary,
    d.fleetIssues,
    rows(fleet, "fleet"),
    columns.fleet,
    forFleet,
    onCell,
    mapping("fleet"),
    empty?.("fleet"),
  );
}

/**
 * One line per column: its letter and header, what it is used as, and (with `mapping`) a select
 * to change that: any field of the table, carried through to the plan (stops), or not used.
 */
function columnControls(columns: readonly ColumnMatch[], mapping: ColumnMapping | undefined): HTMLElement {
  const box = document.createElement("div");
  box.className = "cols";
  for (const c of columns) {
    const line = document.createElement("div");
    const state = c.field === "ignored" ? "ignored" : c.field === "extra" ? "extra" : "used";
    line.className = `col ${state}`;
    line.dataset.column = c.column;
    line.dataset.field = c.field;
    const name = document.createElement("span");
    name.className = "col-name";
    name.textContent = `${c.column}: ${c.header}`;
    line.append(name);
    const kind = mapping?.kind ?? "stops";
    const carried = kind === "stops" ? "carried through to the plan" : "not used";
    const now = state === "used" ? `used as ${fieldLabel(kind, c.field)}` : state === "extra" ? carried : "ignored";
    if (!mapping) {
      name.title = now;
      line.append(` · ${now}`);
      box.append(line);
      continue;
    }
    const select = document.createElement("select");
    select.setAttribute("aria-label", `Column ${c.column} "${c.header}"`);
    const options: [string, string][] = Object.values(FIELD_LABELS[kind]).map((label) => [label, `used as ${label}`]);
    if (state === "used" && !options.some(([v]) => v === fieldLabel(kind, c.field))) {
      const label = fieldLabel(kind, c.field);
      options.unshift([label, `used as ${label}`]);
    }
    if (kind === "stops") options.push(["carry", "carried through to the plan"]);
    options.push(["ignore", kind === "stops" ? "ignored (left out)" : "not used"]);
    select.replaceChildren(...options.map(([value, text]) => new Option(text, value)));
    select.value = state === "used" ? fieldLabel(kind, c.field) : state === "extra" && kind === "stops" ? "carry" : "ignore";
    select.addEventListener("change", () => mapping.onMap(c.header, select.value));
    line.append(select);
    if (c.mapped) {
      const mine = document.createElement("span");
      mine.className = "muted";
      mine.textContent = " (your choice)";
      line.append(mine);
    }
    box.append(line);
  }
  return box;
}

/**
 * What an empty table summary says in Excel: which range to select and which button to press.
 *
 * @param kind - the table
 * @returns the sentence for the summary
 * @example excelEmptyTableHint("fleet") // => "No range chosen yet: select the fleet table in its sheet (the header row and one row per vehicle), then press Use selection."
 */
export function excelEmptyTableHint(kind: TableKind): string {
  const rows = kind === "stops" ? "one row per stop" : "one row per vehicle";
  return `No range chosen yet: select the ${kind} table in its sheet (the header row and ${rows}), then press Use selection.`;
}
