/**
 * The bad and unusual workbooks of `test/corpus/`, each with its expected outcome, built from an
 * invented bread round around York (10 stops, 2 vans). `scripts/buildCorpus.ts` writes them;
 * `test/corpus/corpus.test.ts` runs each through the command line and the pane's reading path.
 */
import ExcelJS from "exceljs";

/** What a case must give. */
export interface CorpusExpectation {
  /** Exit code of `kiln solve`: 0 planned, 2 input error. */
  readonly exit: 0 | 2;
  /** Text every one of which must appear on stderr (cells named, or the file's problem). */
  readonly stderr?: readonly string[];
  /** Stop ids that must be unassigned in the written plan. */
  readonly unassigned?: readonly string[];
  /** Must-serve stops left out, as the plan's totals say. */
  readonly mustServeLeftOut?: number;
  /** Text that must appear in the warnings (stderr lines starting "warning:"). */
  readonly warnings?: readonly string[];
  /** Strings that must appear unchanged in the written plan sheet. */
  readonly textKept?: readonly string[];
}

export interface CorpusCase {
  readonly name: string;
  readonly file: string;
  readonly expect: CorpusExpectation;
  /** The file's bytes. */
  build(): Promise<Uint8Array>;
}

type Row = (string | number | null | ExcelJS.CellErrorValue)[];
const STOP_HEADER = ["Stop", "Name", "Latitude", "Longitude", "Demand kg", "Earliest", "Latest", "Service min", "Features"];
const FLEET_HEADER = ["Vehicle", "Capacity kg", "Start latitude", "Start longitude", "Shift start", "Shift end", "Features"];

function stopRows(): Row[] {
  return Array.from({ length: 10 }, (_, i) => [
    `Y${i + 1}`,
    `Bakery ${i + 1}`,
    53.95 + 0.004 * i,
    -1.09 + 0.005 * (i % 5),
    20,
    "06:00",
    "12:00",
    5,
    null,
  ]);
}
const VANS: Row[] = [
  ["Van A", 400, 53.958, -1.08, "05:00", "15:00", "fridge"],
  ["Van B", 400, 53.958, -1.08, "05:00", "15:00", null],
];

async function workbook(stops: Row[], fleet: Row[] = VANS, extra?: (b: ExcelJS.Workbook) => void): Promise<Uint8Array> {
  const book = new ExcelJS.Workbook();
  book.created = book.modified = new Date(Date.UTC(2026, 0, 1));
  const s = book.addWorksheet("Stops");
  for (const r of stops) s.addRow(r);
  const f = book.addWorksheet("Fleet");
  for (const r of fleet) f.addRow(r);
  extra?.(book);
  return new Uint8Array((await book.xlsx.writeBuffer()) as ArrayBuffer);
}

const withRow = (k: number, patch: (r: Row) => Row): Row[] => stopRows().map((r, i) => (i === k ? patch([...r]) : r));
const set = (col: number, value: Row[number]) => (r: Row) => ((r[col] = value), r);
const base = (rows: Row[]): Row[] => [STOP_HEADER, ...rows];
const fleet = (rows: Row[]): Row[] => [FLEET_HEADER, ...rows];

export const CORPUS: readonly CorpusCase[] = [
  {
    name: "clean round",
    file: "clean.xlsx",
    expect: { exit: 0, unassigned: [], mustServeLeftOut: 0 },
    build: () => workbook(base(stopRows()), fleet(VANS)),
  },
  {
    // 10 stops x 160 kg against two 400 kg vans: two stops per van fit, 6 are left out (by hand).
    name: "more demand than the fleet carries (blank Priority)",
    file: "over-demand.xlsx",
    expect: { exit: 0, mustServeLeftOut: 6 },
    build: () => workbook(base(stopRows().map((r) => ((r[4] = 160), r))), fleet(VANS)),
  },
  {
    name: "latitude as text",
    file: "text-latitude.xlsx",
    expect: { exit: 2, stderr: ["Stops!C4"] },
    build: () => workbook(base(withRow(2, set(2, "north"))), fleet(VANS)),
  },
  {
    name: "an Excel error value in every column type",
    file: "error-values.xlsx",
    expect: { exit: 2, stderr: ["Stops!C2", "Stops!E3", "Stops!F4", "Stops!H5", "Fleet!B2"] },
    build: () => {
      const na = { error: "#N/A" } as ExcelJS.CellErrorValue;
      const rows = stopRows();
      rows[0]![2] = na;
      rows[1]![4] = { error: "#VALUE!" } as ExcelJS.CellErrorValue;
      rows[2]![5] = { error: "#REF!" } as ExcelJS.CellErrorValue;
      rows[3]![7] = { error: "#DIV/0!" } as ExcelJS.CellErrorValue;
      return workbook(base(rows), fleet([[VANS[0]![0]!, na, ...VANS[0]!.slice(2)], VANS[1]!]));
    },
  },
  {
    name: "duplicate stop ids",
    file: "duplicate-ids.xlsx",
    expect: { exit: 2, stderr: ["Y1"] },
    build: () => workbook(base(withRow(4, set(0, "Y1"))), fleet(VANS)),
  },
  {
    name: "window opens after every shift ends",
    file: "window-after-shifts.xlsx",
    expect: { exit: 0, unassigned: ["Y3"], warnings: ["Stops!F4", "opens after every vehicle's shift ends"] },
    build: () => workbook(base(withRow(2, (r) => ((r[5] = "18:00"), (r[6] = "19:00"), r))), fleet(VANS)),
  },
  {
    name: "demand over every capacity",
    file: "demand-over-capacity.xlsx",
    expect: { exit: 0, unassigned: ["Y2"], warnings: ["Stops!E3", "exceeds every vehicle's capacity"] },
    build: () => workbook(base(withRow(1, set(4, 900))), fleet(VANS)),
  },
  {
    name: "window no van reaches",
    file: "window-unreachable.xlsx",
    expect: { exit: 0, unassigned: ["Y5"], warnings: ["Stops!F6", "cannot be reached"] },
    build: () => workbook(base(withRow(4, (r) => ((r[5] = "05:00"), (r[6] = "05:01"), r))), fleet(VANS)),
  },
  {
    name: "a feature no van has",
    file: "missing-feature.xlsx",
    expect: { exit: 0, unassigned: ["Y6"], warnings: ["Stops!I7", "crane"] },
    build: () => workbook(base(withRow(5, set(8, "crane"))), fleet(VANS)),
  },
  {
    name: "stop at 0, 0",
    file: "zero-zero.xlsx",
    expect: { exit: 0, warnings: ["Stops!C8", "0, 0"] },
    build: () => workbook(base(withRow(6, (r) => ((r[2] = 0), (r[3] = 0), r))), fleet(VANS)),
  },
  {
    name: "latitude and longitude swapped",
    file: "swapped.xlsx",
    expect: { exit: 0, warnings: ["Stops!C9", "swapped"] },
    build: () => workbook(base(withRow(7, (r) => ((r[2] = -1.085), (r[3] = 53.96), r))), fleet(VANS)),
  },
  {
    name: "a stop far from the rest",
    file: "far-point.xlsx",
    expect: { exit: 0, warnings: ["Stops!C10", "km from the middle"] },
    build: () => workbook(base(withRow(8, (r) => ((r[2] = 55.95), (r[3] = -3.19), r))), fleet(VANS)),
  },
  {
    name: "backwards window",
    file: "backwards-window.xlsx",
    expect: { exit: 0, warnings: ["Stops!F2", "read as overnight"] },
    build: () => workbook(base(withRow(0, (r) => ((r[5] = "15:00"), (r[6] = "09:30"), r))), fleet(VANS)),
  },
  {
    name: "zero capacity everywhere",
    file: "zero-capacity.xlsx",
    expect: { exit: 0, warnings: ["Fleet!B1", "every vehicle has capacity kg 0"] },
    build: () => workbook(base(stopRows()), fleet(VANS.map((v) => [v[0]!, 0, ...v.slice(2)]))),
  },
  {
    name: "formula-like, right-to-left, emoji and very long text",
    file: "tricky-text.xlsx",
    expect: { exit: 0, textKept: ["=SUM(A1)", "+32 16 00 00 00", "-F09", "@home", "'quoted", "مخبز الحي", "🥖 Bakery", "x".repeat(5000)] },
    build: () => {
      const rows = stopRows();
      const texts = ["=SUM(A1)", "+32 16 00 00 00", "@home", "'quoted", "مخبز الحي", "🥖 Bakery", "x".repeat(5000)];
      texts.forEach((t, i) => (rows[i]![1] = t));
      rows[7]![0] = "-F09";
      return workbook(base(rows), fleet(VANS));
    },
  },
  { name: "empty stops sheet", file: "empty-stops.xlsx", expect: { exit: 2, stderr: ["Stops"] }, build: () => workbook([], fleet(VANS)) },
  { name: "header only", file: "header-only.xlsx", expect: { exit: 2, stderr: ["Stops"] }, build: () => workbook(base([]), fleet(VANS)) },
  {
    name: "decimal commas and thousands separators as text",
    file: "decimal-comma-text.xlsx",
    expect: { exit: 2, stderr: ["Stops!E2", "Stops!E3"] },
    build: () =>
      workbook(base(stopRows().map((r, i) => (i === 0 ? ((r[4] = "45,5"), r) : i === 1 ? ((r[4] = "1,200"), r) : r))), fleet(VANS)),
  },
  {
    name: "merged cells over a stop's name",
    file: "merged.xlsx",
    expect: { exit: 0 },
    build: () => workbook(base(stopRows()), fleet(VANS), (b) => b.getWorksheet("Stops")!.mergeCells("B2:B3")),
  },
  {
    name: "50 000 blank formatted rows below the table",
    file: "blank-formatted-rows.xlsx",
    expect: { exit: 0, unassigned: [] },
    build: () =>
      workbook(base(stopRows()), fleet(VANS), (b) => {
        const ws = b.getWorksheet("Stops")!;
        for (let r = 12; r < 50_012; r++) ws.getCell(r, 1).numFmt = "@";
      }),
  },
  {
    name: "2 000 stops",
    file: "stops-2000.xlsx",
    expect: { exit: 0 },
    build: () =>
      workbook(
        base(
          Array.from({ length: 2000 }, (_, i) => [
            `B${i + 1}`,
            `Shop ${i + 1}`,
            53.8 + ((i * 37) % 400) / 1000,
            -1.3 + ((i * 53) % 600) / 1000,
            1,
            null,
            null,
            2,
            null,
          ]),
        ),
        fleet(
          [["Van", 400, 53.958, -1.08, "05:00", "23:00", null, ...[]]].concat(
            Array.from({ length: 9 }, (_, k) => [`Van ${k + 2}`, 400, 53.958, -1.08, "05:00", "23:00", null]),
          ),
        ),
      ),
  },
  {
    name: "a truncated file",
    file: "truncated.xlsx",
    expect: { exit: 2, stderr: ["damaged or incomplete"] },
    build: async () => (await workbook(base(stopRows()), fleet(VANS))).subarray(0, 1500),
  },
  {
    name: "a CSV renamed .xlsx",
    file: "renamed-csv.xlsx",
    expect: { exit: 2, stderr: ["text file (CSV or similar)"] },
    build: async () => new TextEncoder().encode("Stop,Latitude,Longitude\nY1,53.95,-1.09\n"),
  },
  {
    name: "a password-protected workbook (the compound-file envelope of an encrypted package, MS-OFFCRYPTO)",
    file: "password.xlsx",
    expect: { exit: 2, stderr: ["password-protected", "remove the password"] },
    build: async () => {
      const sig = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];
      const stream = (s: string): number[] => Array.from(s).flatMap((c) => [c.charCodeAt(0), 0]);
      return Uint8Array.from([
        ...sig,
        ...new Array<number>(1016).fill(0),
        ...stream("EncryptionInfo"),
        0,
        0,
        ...stream("EncryptedPackage"),
      ]);
    },
  },
];
