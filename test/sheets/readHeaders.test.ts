// Header matching rules; the synonyms are common words of the delivery trade (common practice).
import { describe, expect, it } from "vitest";
import { findHeaderRow } from "../../src/sheets/findHeaderRow.js";
import { FIELD_LABELS } from "../../src/sheets/fieldLabels.js";
import { unusedColumnWarnings } from "../../src/sheets/unusedColumnWarnings.js";
import { mapColumns, matchHeader } from "../../src/sheets/matchHeaders.js";
import { parseSettingsSheet } from "../../src/sheets/parseSettingsSheet.js";
import { plainCell } from "../../src/sheets/cellValue.js";
import { parseWindows, mergeWindows } from "../../src/sheets/parseWindows.js";

describe("matchHeader", () => {
  it("ignores case, spaces and punctuation", () => {
    expect(matchHeader("  LATITUDE ", "stops")).toEqual({ base: "latitude" });
    expect(matchHeader("Service (min)", "stops")).toEqual({ base: "serviceMin" });
    expect(matchHeader("speed_km/h", "fleet")).toEqual({ base: "speedKmh" });
    expect(matchHeader("Cost-per-KM", "fleet")).toEqual({ base: "costPerKm" });
  });
  it("knows the common synonyms of the stops table", () => {
    const cases: [string, string][] = [
      ["lat", "latitude"],
      ["lng", "longitude"],
      ["lon", "longitude"],
      ["Long", "longitude"],
      ["From", "earliest"],
      ["To", "latest"],
      ["Window start", "earliest"],
      ["Window end", "latest"],
      ["Ready time", "earliest"],
      ["Due", "latest"],
      ["Dwell", "serviceMin"],
      ["Stop time", "serviceMin"],
      ["Service", "serviceMin"],
      ["Qty", "demand"],
      ["Quantity", "demand"],
      ["Weight", "demand"],
      ["Stop ID", "id"],
      ["Customer", "name"],
      ["Lat, Lon", "coordinates"],
      ["Required features", "features"],
      ["Unserved cost", "priority"],
      // A dispatcher's one-column window, "07:00-09:00" (common practice).
      ["Deliver between", "windows"],
    ];
    for (const [text, base] of cases) expect(matchHeader(text, "stops")?.base, text).toBe(base);
  });
  it("knows the common synonyms of the fleet table", () => {
    const cases: [string, string][] = [
      ["Van", "id"],
      ["Truck", "id"],
      ["Driver", "driver"],
      ["Driver name", "driver"],
      ["Count", "count"],
      ["Depot lat", "startLatitude"],
      ["Start lng", "startLongitude"],
      ["Return lat", "endLatitude"],
      ["End long", "endLongitude"],
      ["Depot", "startCoordinates"],
      ["Shift start", "shiftStart"],
      ["Finish", "shiftEnd"],
      ["Fixed cost", "fixedCost"],
      ["Hourly rate", "costPerHour"],
      ["Max stops", "maxStops"],
      ["Payload", "capacity"],
      ["Depot address", "address"],
      ["End address", "endAddress"],
      ["Return address", "endAddress"],
    ];
    for (const [text, base] of cases) expect(matchHeader(text, "fleet")?.base, text).toBe(base);
  });
  it("reads unit words as load dimensions and numbers as repeated windows", () => {
    expect(matchHeader("Demand kg", "stops")).toEqual({ base: "demand", dimension: "kg" });
    expect(matchHeader("Weight (kg)", "stops")).toEqual({ base: "demand", dimension: "kg" });
    expect(matchHeader("Capacity crates", "fleet")).toEqual({ base: "capacity", dimension: "crates" });
    expect(matchHeader("Earliest 2", "stops")).toEqual({ base: "earliest", index: 2 });
    expect(matchHeader("Window end 3", "stops")).toEqual({ base: "latest", index: 3 });
    expect(matchHeader("Phone", "stops")).toBeUndefined();
  });
  it("maps a header row: repeated unnumbered windows become pairs, second id columns are carried, other repeats are issues", () => {
    const cols = mapColumns(
      ["Stop", "Customer ID", "Lat", "Lon", "Earliest", "Latest", "Earliest", "Latest", "Phone", "Latitude"],
      "stops",
      { sheet: "Stops", row: 2, col: 1 },
    );
    expect([...cols.fields.keys()]).toEqual(["id", "latitude", "longitude", "earliest", "latest", "earliest:2", "latest:2"]);
    expect(cols.extras.map((x) => x.header)).toEqual(["Customer ID", "Phone"]);
    expect(cols.issues).toHaveLength(1);
    expect(cols.issues[0]).toMatchObject({ sheet: "Stops", cell: "K3" });
    expect(cols.issues[0]!.message).toContain("same field as column D");
  });
});

describe("findHeaderRow", () => {
  it("gives a merged group header's value to its first cell only, as Excel reads it and as exceljs reads it", () => {
    const merges = [
      { row: 4, col: 2, rows: 1, cols: 2 },
      { row: 4, col: 4, rows: 1, cols: 3 },
    ];
    const excel = [
      ["Customer", "", "Location", "", ""],
      ["Client", "Street", "Phone", "Lat", "Lon"],
    ];
    const exceljs = [
      ["Customer", "Customer", "Location", "Location", "Location"],
      ["Client", "Street", "Phone", "Lat", "Lon"],
    ];
    for (const values of [excel, exceljs]) expect(findHeaderRow(values, "stops", { row: 4, col: 2, merges })).toBe(1);
    // Without the merges the naive reading takes the group row.
    expect(findHeaderRow(exceljs, "stops")).toBe(0);
  });

  it("skips blank leading rows and a title row", () => {
    expect(findHeaderRow([[], ["Tomorrow's deliveries"], ["", ""], ["Stop", "Lat", "Lon"], ["a", 1, 2]], "stops")).toBe(3);
    expect(
      findHeaderRow(
        [
          ["Just", "words"],
          [1, 2],
        ],
        "stops",
      ),
    ).toBeUndefined();
  });
});

describe("parseSettingsSheet", () => {
  it("fills the parameters of a schedule named alone, and reads the time schedule's temperatures", () => {
    expect(parseSettingsSheet({ sheet: "S", row: 0, col: 0, values: [["Schedule", "linear"]] }).settings.cooling).toEqual({
      kind: "linear",
      steps: 20,
    });
    const r = parseSettingsSheet({
      sheet: "S",
      row: 0,
      col: 0,
      values: [
        ["schedule", "Time"],
        ["T0", 50],
        ["T end", "0.5"],
        ["Seconds", 3],
      ],
    });
    expect(r.issues).toEqual([]);
    expect(r.settings).toEqual({ cooling: { kind: "timeFraction", t0: 50, tEnd: 0.5 }, seconds: 3 });
    const lm = parseSettingsSheet({
      sheet: "S",
      row: 0,
      col: 0,
      values: [
        ["Schedule", "lundy mees"],
        ["Beta", 0.001],
      ],
    });
    expect(lm.settings.cooling).toEqual({ kind: "lundyMees", beta: 0.001 });
  });
  it("asks for a Schedule row when a schedule parameter stands alone", () => {
    const r = parseSettingsSheet({ sheet: "S", row: 0, col: 0, values: [["Alpha", 0.9]] });
    expect(r.issues[0]).toMatchObject({ sheet: "S", cell: "B1" });
    expect(r.issues[0]!.message).toContain("needs a Schedule row");
  });
});

describe("windows", () => {
  it("reads 12 h ranges with 'to', rolls over midnight, and merges touching windows", () => {
    expect(parseWindows("8 am to 10 am, 2 pm to 4 pm")).toEqual([
      { earliestMin: 480, latestMin: 600 },
      { earliestMin: 840, latestMin: 960 },
    ]);
    expect(parseWindows("22:00–02:00")).toEqual([{ earliestMin: 1320, latestMin: 1560 }]);
    expect(parseWindows("8:00-")).toBeUndefined();
    expect(
      mergeWindows([
        { earliestMin: 600, latestMin: 700 },
        { earliestMin: 480, latestMin: 600 },
      ]),
    ).toEqual([{ earliestMin: 480, latestMin: 700 }]);
  });
});

describe("plainCell", () => {
  it("flattens the cell objects exceljs hands over (reference library shapes: Date, formula result, rich text, hyperlink)", () => {
    expect(plainCell(new Date(Date.UTC(2025, 0, 1, 18)))).toBe(45658.75); // ECMA-376 serial, from memory
    expect(plainCell({ formula: "A1*2", result: 4 })).toBe(4);
    expect(plainCell({ richText: [{ text: "Ba" }, { text: "kery" }] })).toBe("Bakery");
    expect(plainCell({ text: "site", hyperlink: "https://example.org" })).toBe("site");
  });
});

describe("dispatchers' own column words", () => {
  it("reads drop, unload and on-site times as service minutes; qty, units, cases, pallets as demand; customer, client, consignee as the name; time from/to as the window", () => {
    for (const h of ["Drop time", "Unload time", "On-site minutes", "On site (min)", "Stop duration"])
      expect(matchHeader(h, "stops")?.base, h).toBe("serviceMin");
    for (const h of ["Qty", "Units", "Cases", "Pallets"]) expect(matchHeader(h, "stops")?.base, h).toBe("demand");
    for (const h of ["Customer", "Client", "Consignee"]) expect(matchHeader(h, "stops")?.base, h).toBe("name");
    expect(matchHeader("Time from", "stops")?.base).toBe("earliest");
    expect(matchHeader("Time to", "stops")?.base).toBe("latest");
  });

  it("names every field's label back as that field, so a mapping may use the label", () => {
    for (const kind of ["stops", "fleet"] as const)
      for (const [base, label] of Object.entries(FIELD_LABELS[kind])) expect(matchHeader(label, kind)?.base, label).toBe(base);
  });
});

describe("unusedColumnWarnings", () => {
  const read = (header: unknown[], ...rows: unknown[][]) => ({ sheet: "Stops", row: 0, col: 0, values: [header, ...rows] });
  const warn = (header: string, ...values: unknown[]) =>
    unusedColumnWarnings(read(["Stop", header], ...values.map((v) => ["S", v])), 0, [{ header, col: 1 }], "stops").map((i) => i.message);

  it("names the column, its cell and the likely field (the wording a dispatcher can act on)", () => {
    expect(warn("Drop (mins)", 10, 15)).toEqual([
      'Stops!B1: column "Drop (mins)" is not used; if it holds service minutes, map it to Service min.',
    ]);
    expect(warn("Deliver after", "08:00", "9:30")).toEqual([
      'Stops!B1: column "Deliver after" is not used; if it holds the time a window opens, map it to Earliest.',
    ]);
    expect(warn("Kilos", 12, 3)).toEqual(['Stops!B1: column "Kilos" is not used; if it holds the demand, map it to Demand.']);
    expect(warn("Boxes", 12, 3)).toEqual(['Stops!B1: column "Boxes" is not used; if it holds the demand, map it to Demand.']);
    expect(warn("Town", "Delft")).toEqual(['Stops!B1: column "Town" is not used; if it holds part of the address, map it to Address.']);
    expect(warn("Pos N", 52.0113, 52.0161)).toEqual([
      'Stops!B1: column "Pos N" is not used; if it holds coordinates, map it to Latitude or Longitude.',
    ]);
    expect(warn("Slot", 0.3125)).toEqual(['Stops!B1: column "Slot" is not used; if it holds a time window, map it to Earliest or Latest.']);
  });

  it("leaves text columns and reference numbers alone", () => {
    expect(warn("Phone", "01632 960151")).toEqual([]);
    expect(warn("Notes", "ring twice")).toEqual([]);
    expect(warn("Account no", 1042, 1043)).toEqual([]);
  });
});
