import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { ExcelJsWorkbook, SETTINGS_SHEET } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";

/** Bytes of a workbook built directly with exceljs (the outside reference of these tests). */
async function bytesOf(build: (book: ExcelJS.Workbook) => void): Promise<Uint8Array> {
  const book = new ExcelJS.Workbook();
  build(book);
  return new Uint8Array((await book.xlsx.writeBuffer()) as ArrayBuffer);
}

async function reload(book: ExcelJsWorkbook): Promise<ExcelJS.Workbook> {
  const fresh = new ExcelJS.Workbook();
  const bytes = await book.toBuffer();
  await fresh.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  return fresh;
}

describe("ExcelJsWorkbook.readSheet", () => {
  it("reads dates as ECMA-376 1900-system serials (2025-01-01 = 45658, from memory; 1900-03-01 = 61 after the leap-year slot)", async () => {
    const bytes = await bytesOf((b) => {
      const ws = b.addWorksheet("Dates");
      ws.getCell("A1").value = new Date(Date.UTC(2025, 0, 1));
      ws.getCell("B1").value = new Date(Date.UTC(1900, 2, 1));
      ws.getCell("C1").value = new Date(Date.UTC(2025, 0, 1, 8, 30));
    });
    const read = await (await ExcelJsWorkbook.fromBuffer(bytes)).readSheet("Dates");
    expect(read!.values[0]![0]).toBe(45658);
    expect(read!.values[0]![1]).toBe(61);
    // 08:30 is 8.5 / 24 of a day (ECMA-376 time fraction).
    expect(read!.values[0]![2] as number).toBeCloseTo(45658 + 8.5 / 24, 9);
  });

  it("reads a time-only cell (numFmt hh:mm, value 0.354) back as its day fraction", async () => {
    const bytes = await bytesOf((b) => {
      const ws = b.addWorksheet("T");
      ws.getCell("A1").value = 0.354;
      ws.getCell("A1").numFmt = "hh:mm";
    });
    const read = await (await ExcelJsWorkbook.fromBuffer(bytes)).readSheet("T");
    expect(read!.values[0]![0] as number).toBeCloseTo(0.354, 9);
  });

  it("reads 07:30 under hh:mm as exactly 450 / 1440 of a day (no rounding residue)", async () => {
    const bytes = await bytesOf((b) => {
      const ws = b.addWorksheet("T");
      ws.getCell("A1").value = 450 / 1440;
      ws.getCell("A1").numFmt = "hh:mm";
    });
    const read = await (await ExcelJsWorkbook.fromBuffer(bytes)).readSheet("T");
    expect(read!.values[0]![0]).toBe(450 / 1440);
  });

  it("reduces rich text, formulas, hyperlinks and errors to what Excel shows", async () => {
    const bytes = await bytesOf((b) => {
      const ws = b.addWorksheet("Mixed");
      ws.getCell("A1").value = { richText: [{ text: "Corner " }, { text: "Café", font: { bold: true } }] };
      ws.getCell("B1").value = { formula: "1+2", result: 3 };
      ws.getCell("C1").value = { text: "site", hyperlink: "https://example.org" };
      ws.getCell("D1").value = { error: "#N/A" };
      ws.getCell("E1").value = { formula: "A1", result: "text result" };
      ws.getCell("F1").value = true;
    });
    const read = await (await ExcelJsWorkbook.fromBuffer(bytes)).readSheet("Mixed");
    expect(read!.values).toEqual([["Corner Café", 3, "site", "#N/A", "text result", true]]);
  });

  it("returns the used range with its offset and '' for holes", async () => {
    const bytes = await bytesOf((b) => {
      const ws = b.addWorksheet("Offset");
      ws.getCell("B3").value = "x";
      ws.getCell("D4").value = 7;
      ws.getCell("A10").numFmt = "0.00"; // formatted but empty: not part of the used values
    });
    const read = await (await ExcelJsWorkbook.fromBuffer(bytes)).readSheet("offset");
    expect(read).toEqual({
      sheet: "Offset",
      row: 2,
      col: 1,
      values: [
        ["x", "", ""],
        ["", "", 7],
      ],
    });
  });

  it("returns undefined for a missing sheet and an empty read for an empty one", async () => {
    const book = ExcelJsWorkbook.fromGrids([{ name: "Empty", values: [] }]);
    expect(await book.readSheet("Nope")).toBeUndefined();
    expect(await book.readSheet("Empty")).toEqual({ sheet: "Empty", row: 0, col: 0, values: [] });
  });
});

describe("ExcelJsWorkbook writing", () => {
  it("writes text that starts with = + - @ as text, never as a formula (checked with a fresh exceljs load)", async () => {
    const book = ExcelJsWorkbook.fromGrids([]);
    await book.addSheet("Out", { values: [["=SUM(A1)", "+44 1234", "-3", "@home", 12]] });
    const ws = (await reload(book)).getWorksheet("Out")!;
    for (const [addr, text] of [
      ["A1", "=SUM(A1)"],
      ["B1", "+44 1234"],
      ["C1", "-3"],
      ["D1", "@home"],
    ] as const) {
      const cell = ws.getCell(addr);
      expect(cell.type).toBe(ExcelJS.ValueType.String);
      expect(cell.formula).toBeFalsy();
      expect(cell.value).toBe(text);
    }
    expect(ws.getCell("E1").value).toBe(12);
  });

  it("writes number formats, bold rows, column widths and frozen rows", async () => {
    const book = ExcelJsWorkbook.fromGrids([]);
    await book.addSheet("Fmt", {
      values: [
        ["Stop", "Arrival"],
        ["S1", 0.25],
      ],
      numberFormats: [
        [null, null],
        [null, "hh:mm"],
      ],
      columnWidths: [10, 14],
      freezeRows: 1,
      boldRows: [0],
    });
    const ws = (await reload(book)).getWorksheet("Fmt")!;
    expect(ws.getCell("B2").numFmt).toBe("hh:mm");
    expect(ws.getCell("A1").font?.bold).toBe(true);
    expect(ws.getCell("A2").font?.bold).toBeFalsy();
    expect(ws.getColumn(1).width).toBe(10);
    expect(ws.getColumn(2).width).toBe(14);
    expect(ws.views[0]).toMatchObject({ state: "frozen", ySplit: 1 });
  });

  it("refuses a taken or invalid sheet name with a RangeError naming it", async () => {
    const book = ExcelJsWorkbook.fromGrids([{ name: "Stops", values: [["a"]] }]);
    await expect(book.addSheet("stops", { values: [] })).rejects.toThrow(RangeError);
    await expect(book.addSheet("a/b", { values: [] })).rejects.toThrow(/forbids/);
    await expect(book.addSheet("x".repeat(32), { values: [] })).rejects.toThrow(/1 to 31 characters/);
  });

  it("records that a chart was skipped (exceljs cannot write charts)", async () => {
    const book = ExcelJsWorkbook.fromGrids([]);
    const block = { row: 1, col: 0, rows: 1, cols: 1 };
    await book.addSheet(
      "Plan",
      { values: [["x"]] },
      { title: "Routes", series: [{ name: "V1", x: block, y: block }], anchor: { row: 0, col: 3 } },
    );
    expect(book.skippedCharts).toEqual(["Plan"]);
  });

  it("appendRows creates the sheet with its header, then appends below the last used row", async () => {
    const book = ExcelJsWorkbook.fromGrids([]);
    const header = { values: [["Scenario", "Km"]], boldRows: [0], freezeRows: 1 };
    await book.appendRows("Compare", header, { values: [["A", 1.5]] });
    await book.appendRows("Compare", header, { values: [["B", 2.5]], numberFormats: [[null, "0.0"]] });
    const fresh = await reload(book);
    const ws = fresh.getWorksheet("Compare")!;
    expect(
      ws
        .getSheetValues()
        .slice(1)
        .map((r) => (r as unknown[]).slice(1)),
    ).toEqual([
      ["Scenario", "Km"],
      ["A", 1.5],
      ["B", 2.5],
    ]);
    expect(ws.getCell("B3").numFmt).toBe("0.0");
    expect(ws.getCell("A1").font?.bold).toBe(true);
  });

  it("keeps settings on a veryHidden sheet, replacing a key's value in place", async () => {
    const book = ExcelJsWorkbook.fromGrids([{ name: "Stops", values: [["a"]] }]);
    await book.writeSetting("kiln.one", '{"seed":1}');
    await book.writeSetting("kiln.two", "=1");
    await book.writeSetting("kiln.one", '{"seed":2}');
    const again = await ExcelJsWorkbook.fromBuffer(await book.toBuffer());
    expect(await again.readSettings()).toEqual({ "kiln.one": '{"seed":2}', "kiln.two": "=1" });
    const ws = (await reload(book)).getWorksheet(SETTINGS_SHEET)!;
    expect(ws.state).toBe("veryHidden");
    expect(ws.rowCount).toBe(3);
  });

  it("round-trips the sheets of fromGrids through bytes", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      {
        name: "Stops",
        values: [
          ["Stop", "Lat"],
          ["S1", 52.5],
          ["=x", null],
        ],
      },
    ]);
    const again = await ExcelJsWorkbook.fromBuffer(await book.toBuffer());
    expect(await again.listSheets()).toEqual(["Stops"]);
    expect((await again.readSheet("Stops"))!.values).toEqual([
      ["Stop", "Lat"],
      ["S1", 52.5],
      ["=x", ""],
    ]);
  });
});

describe("ExcelJsWorkbook.setDocumentDates", () => {
  it("gives equal bytes for equal content, and the file still opens in exceljs", async () => {
    const make = async (): Promise<Uint8Array> => {
      const book = ExcelJsWorkbook.fromGrids([{ name: "Stops", values: [["Stop"], ["S1"]] }]);
      book.setDocumentDates(new Date(Date.UTC(2026, 0, 5, 18)));
      return book.toBuffer();
    };
    const a = await make();
    await new Promise((r) => setTimeout(r, 2100)); // DOS times step by 2 s: make sure the clock moved on
    const b = await make();
    expect(Buffer.from(a).equals(Buffer.from(b))).toBe(true);
    const fresh = new ExcelJS.Workbook();
    await fresh.xlsx.load(a.buffer.slice(a.byteOffset, a.byteOffset + a.byteLength) as ArrayBuffer);
    expect(fresh.getWorksheet("Stops")!.getCell("A2").value).toBe("S1");
    expect(fresh.created.toISOString()).toBe("2026-01-05T18:00:00.000Z");
  });
});

describe("ExcelJsWorkbook in a 1904-date-system workbook", () => {
  const bytes1904 = (): Promise<Uint8Array> =>
    bytesOf((b) => {
      b.properties.date1904 = true;
      const ws = b.addWorksheet("Dates");
      ws.getCell("A1").value = new Date(Date.UTC(2025, 0, 1));
      ws.getCell("B1").value = 0.5;
    });

  it("reads a date cell as its 1900-system serial (2025-01-01 = 45658, ECMA-376; from memory)", async () => {
    const read = await (await ExcelJsWorkbook.fromBuffer(await bytes1904())).readSheet("Dates");
    expect(read!.values[0]).toEqual([45658, 0.5]);
  });

  it("writes a date-time serial so that exceljs shows the same date, and leaves times of day and plain numbers alone", async () => {
    const book = await ExcelJsWorkbook.fromBuffer(await bytes1904());
    await book.addSheet("Out", {
      values: [[46028 + 4 / 24, 0.25, 46028]],
      numberFormats: [["yyyy-mm-dd hh:mm", "hh:mm", "0"]],
    });
    const ws = (await reload(book)).getWorksheet("Out")!;
    expect((ws.getCell("A1").value as Date).toISOString()).toBe("2026-01-06T04:00:00.000Z");
    expect((ws.getCell("B1").value as Date).toISOString()).toBe("1904-01-01T06:00:00.000Z");
    expect(ws.getCell("C1").value).toBe(46028);
  });
});
