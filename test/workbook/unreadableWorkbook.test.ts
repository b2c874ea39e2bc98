import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { describeUnreadableWorkbook } from "../../src/workbook/exceljs/unreadableWorkbook.js";

/** The header signature of an OLE2 compound file (MS-CFB §2.2) followed by filler and a stream name. */
function compoundFile(streamName: string): Uint8Array {
  const sig = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];
  const name = Array.from(streamName).flatMap((c) => [c.charCodeAt(0), 0]);
  return Uint8Array.from([...sig, ...new Array<number>(504).fill(0), ...name, 0, 0]);
}

describe("describeUnreadableWorkbook says what the file is and what to do", () => {
  it("an Office-encrypted package (a compound file with an EncryptionInfo stream, MS-OFFCRYPTO §2.3.4): remove the password", () => {
    expect(describeUnreadableWorkbook(compoundFile("EncryptionInfo"), "week.xlsx")).toMatch(
      /^week\.xlsx is password-protected .*remove the password/,
    );
  });

  it("an old .xls compound file: save as .xlsx", () => {
    expect(describeUnreadableWorkbook(compoundFile("Workbook"), "old.xlsx")).toMatch(/Excel 97-2003 \(\.xls\).*save it as "Excel Workbook/);
  });

  it("a truncated .xlsx (a zip cut in half) and an empty file", async () => {
    const book = new ExcelJS.Workbook();
    book.addWorksheet("Stops").addRow(["Stop", "Latitude", "Longitude"]);
    const bytes = new Uint8Array((await book.xlsx.writeBuffer()) as ArrayBuffer);
    expect(describeUnreadableWorkbook(bytes.subarray(0, bytes.length >> 1), "cut.xlsx")).toMatch(/damaged or incomplete/);
    expect(describeUnreadableWorkbook(new Uint8Array(0), "empty.xlsx")).toMatch(/is empty \(0 bytes\)/);
  });

  it("a CSV renamed .xlsx: rename it back", () => {
    expect(describeUnreadableWorkbook(new TextEncoder().encode("Stop,Latitude\nS1,52\n"), "s.xlsx")).toMatch(
      /text file \(CSV or similar\)/,
    );
  });
});
