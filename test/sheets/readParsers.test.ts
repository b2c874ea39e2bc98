import { createRequire } from "node:module";
import { describe, expect, it } from "vitest";
import { cellAddress, columnLetter, sheetOfRef, sheetRef } from "../../src/sheets/cellAddress.js";
import { dateFromExcelSerial, excelSerialFromDate } from "../../src/sheets/excelSerial.js";
import { parseCsv } from "../../src/sheets/parseCsv.js";
import { parseTime } from "../../src/sheets/parseTime.js";
import { parseDuration } from "../../src/sheets/parseDuration.js";
import { parseCoordinate } from "../../src/sheets/parseCoordinate.js";
import { parseLatLon } from "../../src/sheets/parseLatLon.js";
import { excelError, readNumber } from "../../src/sheets/cellValue.js";

const require = createRequire(import.meta.url);
// exceljs' own serial conversion (reference library); it uses one epoch, 1899-12-30, for all
// serials, which matches the 1900 system from serial 61 (1900-03-01) on.
const exceljsUtils = require("exceljs/lib/utils/utils.js") as {
  dateToExcel(d: Date): number;
  excelToDate(v: number): Date;
};

describe("Excel serial dates (ECMA-376 Part 1, §18.17.4, 1900 date system; values from memory)", () => {
  it("serial 45658 is 2025-01-01 and 0.5 is 12:00", () => {
    expect(dateFromExcelSerial(45658).toISOString()).toBe("2025-01-01T00:00:00.000Z");
    expect(excelSerialFromDate(new Date(Date.UTC(2025, 0, 1)))).toBe(45658);
    expect(dateFromExcelSerial(0.5).getUTCHours()).toBe(12);
    expect(excelSerialFromDate(new Date(Date.UTC(2025, 0, 1, 12)))).toBe(45658.5);
  });
  it("serial 1 is 1900-01-01, 59 is 1900-02-28, 60 is the fictitious 1900-02-29, 61 is 1900-03-01", () => {
    expect(dateFromExcelSerial(1).toISOString()).toBe("1900-01-01T00:00:00.000Z");
    expect(excelSerialFromDate(new Date(Date.UTC(1900, 0, 1)))).toBe(1);
    expect(dateFromExcelSerial(59).toISOString()).toBe("1900-02-28T00:00:00.000Z");
    expect(excelSerialFromDate(new Date(Date.UTC(1900, 1, 28)))).toBe(59);
    // No Date can hold 1900-02-29: it normalises the way Date.UTC(1900, 1, 29) does.
    expect(dateFromExcelSerial(60).getTime()).toBe(Date.UTC(1900, 1, 29));
    expect(dateFromExcelSerial(61).toISOString()).toBe("1900-03-01T00:00:00.000Z");
    expect(excelSerialFromDate(new Date(Date.UTC(1900, 2, 1)))).toBe(61);
  });
  it("agrees with exceljs' conversion from serial 61 on (reference library)", () => {
    for (const serial of [61, 367, 25569, 36526.25, 45658, 45658.75, 47000.123456]) {
      expect(dateFromExcelSerial(serial).getTime()).toBe(exceljsUtils.excelToDate(serial).getTime());
      const d = new Date(exceljsUtils.excelToDate(serial).getTime());
      expect(excelSerialFromDate(d)).toBeCloseTo(exceljsUtils.dateToExcel(d), 9);
    }
  });
  it("throws RangeError on a negative serial or an invalid date (programming mistakes)", () => {
    expect(() => dateFromExcelSerial(-1)).toThrow(RangeError);
    expect(() => excelSerialFromDate(new Date(NaN))).toThrow(RangeError);
  });
});

describe("parseTime", () => {
  it("reads 0.354 as 08:30 to the minute and 0.354166666 as exactly 510 (common practice: typed 08:30)", () => {
    expect(Math.round(parseTime(0.354)!)).toBe(510);
    expect(parseTime(0.354166666)).toBe(510);
    expect(parseTime(0.5)).toBe(720);
  });
  it("reads a date-time serial 45658.75 (ECMA-376 serial of 2025-01-01 18:00) as 18:00", () => {
    expect(parseTime(45658.75)).toBe(1080);
  });
  it("reads 24 h and 12 h text with or without seconds", () => {
    expect(parseTime("8:30")).toBe(510);
    expect(parseTime("08:30")).toBe(510);
    expect(parseTime("8:30 PM")).toBe(1230);
    expect(parseTime("8:30pm")).toBe(1230);
    expect(parseTime("14:05:30")).toBe(14 * 60 + 5.5);
    expect(parseTime("12:00 AM")).toBe(0);
    expect(parseTime("12:30 PM")).toBe(750);
    expect(parseTime("24:00")).toBe(1440);
    expect(parseTime("2025-01-01T08:30")).toBe(510);
  });
  it("rejects 25:00, 8:75, 13:00 PM, abc, negatives and empty cells", () => {
    for (const bad of ["25:00", "8:75", "13:00 PM", "abc", -0.1, "", null, "8"]) {
      expect(parseTime(bad)).toBeUndefined();
    }
  });
});

describe("parseDuration", () => {
  it("reads minutes as numbers and h:mm text", () => {
    expect(parseDuration(12)).toBe(12);
    expect(parseDuration("12")).toBe(12);
    expect(parseDuration("15 min")).toBe(15);
    expect(parseDuration("1:30")).toBe(90);
    expect(parseDuration("0:05:30")).toBe(5.5);
  });
  it("rejects negative and unreadable durations", () => {
    for (const bad of [-5, "-5", "1:75", "ten", ""]) expect(parseDuration(bad)).toBeUndefined();
  });
});

describe("parseCoordinate (degrees-minutes-seconds: 1° = 60' = 3600\", common practice)", () => {
  it(`reads 45°45'36"N as 45.76 and 4°50'W as -4.8333`, () => {
    expect(parseCoordinate(`45°45'36"N`, "lat")).toBeCloseTo(45.76, 10);
    expect(parseCoordinate(`4°50'W`, "lon")).toBeCloseTo(-4.8333, 4);
  });
  it("reads DMS with spaces, prime signs, a leading hemisphere letter and decimal text", () => {
    expect(parseCoordinate(`45° 45' 36" N`, "lat")).toBeCloseTo(45.76, 10);
    expect(parseCoordinate(`45°45′36″N`, "lat")).toBeCloseTo(45.76, 10);
    expect(parseCoordinate(`S 33°52'`, "lat")).toBeCloseTo(-(33 + 52 / 60), 10);
    expect(parseCoordinate("45 45 36 N", "lat")).toBeCloseTo(45.76, 10);
    expect(parseCoordinate("-4.83", "lon")).toBe(-4.83);
    expect(parseCoordinate(151.2, "lon")).toBe(151.2);
  });
  it("rejects out-of-range values, letters of the other axis and minutes of 60 or more", () => {
    expect(parseCoordinate(123.4, "lat")).toBeUndefined();
    expect(parseCoordinate(-180.5, "lon")).toBeUndefined();
    expect(parseCoordinate(`45°10'E`, "lat")).toBeUndefined();
    expect(parseCoordinate(`45°60'N`, "lat")).toBeUndefined();
    expect(parseCoordinate("north", "lat")).toBeUndefined();
  });
  it("reads one cell holding lat, lon", () => {
    expect(parseLatLon("45.76, 4.83")).toEqual({ lat: 45.76, lon: 4.83 });
    expect(parseLatLon("45.76 4.83")).toEqual({ lat: 45.76, lon: 4.83 });
    const dms = parseLatLon(`45°45'36"N, 4°50'W`)!;
    expect(dms.lat).toBeCloseTo(45.76, 10);
    expect(dms.lon).toBeCloseTo(-4.8333, 4);
    expect(parseLatLon("here")).toBeUndefined();
  });
});

describe("cell addresses (A1 notation of ECMA-376 Part 1, §18.3.1.4 cell references)", () => {
  it("names columns A..Z, AA.., and cells", () => {
    expect(columnLetter(0)).toBe("A");
    expect(columnLetter(25)).toBe("Z");
    expect(columnLetter(26)).toBe("AA");
    expect(columnLetter(701)).toBe("ZZ");
    expect(columnLetter(702)).toBe("AAA");
    expect(columnLetter(16383)).toBe("XFD"); // Excel's last column
    expect(cellAddress(6, 4)).toBe("E7");
    expect(() => columnLetter(-1)).toThrow(RangeError);
  });

  it("reads the sheet name back out of a reference, quoted as Excel quotes it (names with spaces or quotes in single quotes, a quote doubled; common practice)", () => {
    expect(sheetOfRef("Km!A1:E5")).toBe("Km");
    expect(sheetOfRef("'Road km'!A1:K11")).toBe("Road km");
    expect(sheetOfRef("'Bob''s van'!B2")).toBe("Bob's van");
    expect(sheetOfRef("'Bob''s van'")).toBe("Bob's van");
    expect(sheetOfRef("Km")).toBe("Km");
    for (const name of ["Km", "Road km", "Bob's van", "a!b", "'quoted'", "Plan 2 (3)"])
      expect(sheetOfRef(`${sheetRef(name)}!A1:C3`), name).toBe(name);
  });
});

describe("cell values", () => {
  it("recognises Excel error values as text and as exceljs error objects", () => {
    for (const e of ["#N/A", "#VALUE!", "#REF!", "#DIV/0!", "#NAME?", "#NUM!", "#NULL!"]) {
      expect(excelError(e)).toBe(e);
    }
    expect(excelError({ error: "#N/A" })).toBe("#N/A");
    expect(excelError("#hashtag")).toBeUndefined();
    expect(readNumber("1e3")).toBe(1000);
    expect(readNumber("12 kg")).toBeUndefined();
  });
});

describe("parseCsv (RFC 4180)", () => {
  it("reads the RFC 4180 §2 examples: CRLF lines, optional final line break, quoted fields", () => {
    expect(parseCsv("aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n")).toEqual([
      ["aaa", "bbb", "ccc"],
      ["zzz", "yyy", "xxx"],
    ]);
    expect(parseCsv("aaa,bbb,ccc\r\nzzz,yyy,xxx")).toEqual([
      ["aaa", "bbb", "ccc"],
      ["zzz", "yyy", "xxx"],
    ]);
    expect(parseCsv('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx')).toEqual([
      ["aaa", "b\r\nbb", "ccc"],
      ["zzz", "yyy", "xxx"],
    ]);
    expect(parseCsv('"aaa","b""bb","ccc"')).toEqual([["aaa", 'b"bb', "ccc"]]);
  });
  it("reads LF lines, empty fields, a leading BOM and ;-separated files", () => {
    expect(parseCsv("\uFEFFa,b\n1,\n")).toEqual([
      ["a", "b"],
      ["1", ""],
    ]);
    expect(parseCsv('Stop;Name;Lat\n1;"A; B";45,5\n')).toEqual([
      ["Stop", "Name", "Lat"],
      // A ';' separator is a decimal-comma locale's: its 45,5 is the number 45.5.
      ["1", "A; B", "45.5"],
    ]);
    expect(parseCsv("")).toEqual([]);
  });
});
