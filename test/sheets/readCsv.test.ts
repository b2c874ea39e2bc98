import { describe, expect, it } from "vitest";
import { readCsv } from "../../src/sheets/parseCsv.js";
import { readProblem } from "../../src/sheets/readProblem.js";

describe("readCsv: the small holes of CSV input", () => {
  it("says where an unclosed quote opens (RFC 4180 §2: a quoted field ends with a closing quote), LF and CRLF line ends", () => {
    expect(readCsv('Stop,Name\nS1,"Bakery\nS2,Deli\n').unclosedQuote).toEqual({ line: 2, column: 4 });
    expect(readCsv('Stop,Name\r\nS1,Bakery\r\nS2,"Deli\r\nS3,x').unclosedQuote).toEqual({ line: 3, column: 4 });
    expect(readCsv('Stop,Name\r\n"S1\r\nstill",ok\r\nS2,"x').unclosedQuote).toEqual({ line: 4, column: 4 });
    expect(readCsv('a,"b ""x"""\r\n1,2').unclosedQuote).toBeUndefined();
  });

  it("a ';' file from a decimal-comma locale reads 45,5 and 1.234,5 as numbers; a ',' file is left alone", () => {
    const semi = readCsv("Stop;Latitude;Longitude;Demand\nS1;53,958;-1,08;1.234,5\nS2;53,96;-1,1;2 000,25\nS3;a,b;12:30;3");
    expect(semi.separator).toBe(";");
    expect(semi.rows[1]).toEqual(["S1", "53.958", "-1.08", "1234.5"]);
    expect(semi.rows[2]).toEqual(["S2", "53.96", "-1.1", "2000.25"]);
    expect(semi.rows[3]).toEqual(["S3", "a,b", "12:30", "3"]);
    expect(readCsv('Stop,Demand\nS1,"45,5"').rows[1]).toEqual(["S1", "45,5"]);
  });

  it("such a file is read as a problem without a single input error", () => {
    const stops = readCsv("Stop;Latitude;Longitude;Demand kg\nS1;53,958;-1,08;45,5\nS2;53,96;-1,1;12,25");
    const fleet = readCsv("Vehicle;Capacity kg;Start latitude;Start longitude\nVan;500,5;53,95;-1,09");
    const r = readProblem({
      stops: { sheet: "stops", row: 0, col: 0, values: stops.rows },
      fleet: { sheet: "fleet", row: 0, col: 0, values: fleet.rows },
    });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.problem.stops.map((s) => s.demand[0])).toEqual([45.5, 12.25]);
    expect(r.problem.vehicles[0]!.capacity[0]).toBe(500.5);
  });
});
