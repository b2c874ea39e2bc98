import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { ExcelJsWorkbook } from "../../src/workbook/exceljs/ExcelJsWorkbook.js";
import { describeMissingTable, findInputSheets } from "../../src/workbook/findInputSheets.js";

/** A workbook written by exceljs and read back, as a file a user would open. */
async function fileOf(build: (book: ExcelJS.Workbook) => void): Promise<ExcelJsWorkbook> {
  const book = new ExcelJS.Workbook();
  build(book);
  return ExcelJsWorkbook.fromBuffer(new Uint8Array(await book.xlsx.writeBuffer()));
}

describe("findInputSheets", () => {
  it("takes the sheets named Stops, Fleet and Settings, ignoring case", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      { name: "notes", values: [["Latitude", "Longitude"]] },
      { name: "STOPS", values: [["x"]] },
      { name: "fleet", values: [["x"]] },
      { name: "Settings", values: [["x"]] },
    ]);
    expect(await findInputSheets(book)).toMatchObject({ stops: "STOPS", fleet: "fleet", settings: "Settings" });
  });

  it("otherwise takes the first sheets whose headers look like stops and like a fleet", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      { name: "Read me", values: [["Hello"]] },
      { name: "Vans", values: [["Vehicle", "Capacity kg", "Start latitude", "Start longitude"]] },
      { name: "Tuesday", values: [["Stop", "Name", "Lat", "Lon"]] },
      { name: "Wednesday", values: [["Stop", "Name", "Latitude", "Longitude"]] },
    ]);
    const found = await findInputSheets(book);
    expect(found).toMatchObject({ stops: "Tuesday", fleet: "Vans" });
    expect(found.looked.find((l) => l.sheet === "Wednesday")?.reason).toBe(
      'it looks like a stops table too, but "Tuesday" was taken first',
    );
  });

  it("finds a stops table under a title row and blank rows, and a fleet without a capacity column by its vehicle column", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      {
        name: "Tour",
        values: [["Deliveries for Thursday"], [], ["Customer", "Drop time", "Lat", "Lon", "Qty"], ["Mill", 10, 52.1, 5.1, 4]],
      },
      {
        name: "Vans",
        values: [
          ["Vehicle", "Latitude", "Longitude", "Start", "End"],
          ["V1", 52, 5, "8:00", "17:00"],
        ],
      },
    ]);
    const found = await findInputSheets(book);
    expect(found).toMatchObject({ stops: "Tour", fleet: "Vans" });
    expect(found.looked[0]).toEqual({ sheet: "Tour", taken: "stops", headerRow0: 2 });
  });

  it("skips a row of merged group headers and takes the real header below it (a merge's value belongs to its first cell)", async () => {
    const book = await fileOf((b) => {
      const ws = b.addWorksheet("Week 49");
      // Read naively (every cell of a merge holding its value) the group row names more fields
      // than the real header: name twice and coordinates four times against four headers below.
      ws.addRow(["Customer", "", "Location", "", "", "", "Load & time", ""]);
      ws.addRow(["Account", "Client", "Street", "Town", "Lat", "Lon", "Boxes", "Handover"]);
      ws.addRow(["A-7", "Mill", "Kade 1", "Delft", 52.01, 4.36, 3, 10]);
      ws.mergeCells("A1:B1");
      ws.mergeCells("C1:F1");
      ws.mergeCells("G1:H1");
      const fleet = b.addWorksheet("Vans");
      fleet.addRow(["Vehicle", "Capacity", "Start latitude", "Start longitude"]);
      fleet.addRow(["V1", 10, 52, 4.3]);
    });
    const read = await book.readSheet("Week 49");
    // exceljs reads every cell of a merge as the first cell's value; the merges say which is first.
    expect(read?.values[0]?.slice(0, 2)).toEqual(["Customer", "Customer"]);
    expect(read?.merges).toEqual([
      { row: 0, col: 0, rows: 1, cols: 2 },
      { row: 0, col: 2, rows: 1, cols: 4 },
      { row: 0, col: 6, rows: 1, cols: 2 },
    ]);
    const found = await findInputSheets(book);
    expect(found).toMatchObject({ stops: "Week 49", fleet: "Vans" });
    expect(found.looked[0]?.headerRow0).toBe(1);
  });

  it("leaves out plan sheets Kiln wrote and the Compare sheet", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      { name: "Plan", values: [["Scenario", "Plan"], [], ["Vehicle", "Seq", "Stop", "Name", "Latitude", "Longitude"]] },
      { name: "Compare", values: [["Scenario", "Vehicles", "Km"]] },
    ]);
    await book.writeSetting("kiln.scenario.Plan", "{}");
    const found = await findInputSheets(book);
    expect(found.stops).toBeUndefined();
    expect(found.looked.map((l) => l.reason)).toEqual(["it is a plan Kiln wrote", "it is the Compare sheet"]);
  });

  it("says for each sheet why it was not taken and how to choose one", async () => {
    const book = ExcelJsWorkbook.fromGrids([
      { name: "Notes", values: [] },
      { name: "Vans", values: [["Vehicle", "Capacity"]] },
      { name: "Places", values: [["Stop", "Name", "Demand"]] },
    ]);
    const found = await findInputSheets(book);
    expect(found.stops).toBeUndefined();
    expect(describeMissingTable(found, "stops", "name the stops sheet with --stops SHEET")).toBe(
      'no sheet named "Stops" and no sheet that looks like a stops table; sheets looked at: "Notes" (it is empty), "Vans" (taken as the fleet), ' +
        '"Places" (its header on row 1 (A1) has no Latitude and Longitude, Coordinates or Address column); name the stops sheet with --stops SHEET.',
    );
  });

  it("returns nothing for a workbook without input tables", async () => {
    const found = await findInputSheets(ExcelJsWorkbook.fromGrids([{ name: "A", values: [["x"]] }]));
    expect(found.stops).toBeUndefined();
    expect(found.fleet).toBeUndefined();
  });
});
