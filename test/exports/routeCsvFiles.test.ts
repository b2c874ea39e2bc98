// CSV files read back by an outside RFC 4180 reader (csv-parse from the npm registry). RFC 4180 §2:
// CRLF after every record, fields with comma, quote, CR or LF enclosed in quotes, quotes doubled.
import { parse } from "csv-parse/sync";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { UTF8_BOM, csvText } from "../../src/exports/csvText.js";
import { routeCsvFiles } from "../../src/exports/routeCsvFiles.js";
import { formatClock } from "../../src/sheets/formatClock.js";
import * as fixture from "../fixtures/writerPlan.js";
import { STOP_TEXTS, exportScenario } from "./exportScenario.js";

/** csv-parse with RFC 4180 defaults; `bom` drops the leading byte order mark. */
const readCsv = (text: string): string[][] => parse(text, { bom: true, relax_column_count: false }) as string[][];

/** True when every record ends with CRLF: outside quoted fields there is no bare CR or LF (RFC 4180 §2 rules 1-2). */
function crlfOnly(text: string): boolean {
  const outside = text.replace(/"(?:[^"]|"")*"/g, "");
  return outside.endsWith("\r\n") && !/\r(?!\n)|(?<!\r)\n/.test(outside);
}

describe("csvText (RFC 4180)", () => {
  it("round-trips any text, with commas, quotes, CR and LF, through csv-parse", () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.array(fc.string({ unit: fc.constantFrom("a", "é", ",", '"', "\r", "\n", " ", "=", "🚚") }), { minLength: 2, maxLength: 4 }),
          {
            minLength: 1,
            maxLength: 5,
          },
        ),
        (rows) => {
          const width = rows[0]!.length;
          const table = rows.map((r) => Array.from({ length: width }, (_, i) => r[i] ?? ""));
          const text = csvText(table);
          expect(crlfOnly(text)).toBe(true);
          expect(readCsv(text)).toEqual(table);
        },
      ),
    );
  });

  it("writes the RFC's own shapes: quoted comma, doubled quote, CRLF inside quotes; numbers and booleans plain", () => {
    expect(csvText([["a,b", 'say "hi"', "x\r\ny", 12.5, true, null]])).toBe('"a,b","say ""hi""","x\r\ny",12.5,TRUE,\r\n');
  });
});

describe("routeCsvFiles", () => {
  const s = exportScenario();
  const files = routeCsvFiles({ problem: s.problem, plan: s.plan, stopRows: s.stopRows, extraHeaders: s.extraHeaders });
  const used = s.plan.routes.filter((r) => r.visits.length > 0);

  it("writes one file per used vehicle, CRLF records, a byte order mark, parsed by csv-parse with equal column counts", () => {
    expect(files.map((f) => f.vehicle)).toEqual(used.map((r) => s.problem.vehicles[r.vehicle]!.id));
    expect(files.map((f) => f.fileName)).toEqual(["Van 1.csv", "Van 2.csv", "Truck _West_.csv"]);
    for (const f of files) {
      expect(f.text.startsWith(UTF8_BOM)).toBe(true);
      expect(crlfOnly(f.text)).toBe(true);
      expect(() => readCsv(f.text)).not.toThrow(); // relax_column_count false: every record has the header's width
    }
  });

  it("lists the depot, every stop in plan order with arrival, window, address, drops and own columns, then the depot; text exact", () => {
    files.forEach((f, i) => {
      const route = used[i]!;
      const [header, ...rows] = readCsv(f.text);
      const col = (name: string) => header!.indexOf(name);
      expect(header).toEqual(
        expect.arrayContaining([
          "Seq",
          "Arrival",
          "Window",
          "Stop",
          "Name",
          "Address",
          "Drop kg",
          "Drop crates",
          "Service min",
          "Phone",
          "Note",
        ]),
      );
      expect(rows.map((r) => Number(r[col("Seq")]))).toEqual(Array.from({ length: route.visits.length + 2 }, (_, k) => k));
      expect(rows[0]![col("Departure")]).toBe(formatClock(route.departureMin));
      expect(rows[rows.length - 1]![col("Arrival")]).toBe(formatClock(route.returnMin));
      route.visits.forEach((v, k) => {
        const stop = s.problem.stops[v.stop]!;
        const r = rows[k + 1]!;
        const sheetRow = s.stopRows.find((x) => x.stop === v.stop)!;
        expect(r[col("Stop")]).toBe(stop.id);
        expect(r[col("Name")]).toBe(stop.name);
        expect(r[col("Address")]).toBe(sheetRow.address ?? "");
        expect(r[col("Arrival")]).toBe(formatClock(v.arrivalMin));
        expect([Number(r[col("Drop kg")]), Number(r[col("Drop crates")])]).toEqual(stop.demand);
        expect(Number(r[col("Service min")])).toBe(stop.serviceMin);
        expect(Number(r[col("Latitude")])).toBe(s.problem.locations[stop.location]!.lat);
        for (const h of s.extraHeaders) expect(r[col(h)]).toBe(sheetRow.extra[h] === null ? "" : String(sheetRow.extra[h]));
      });
      // Drops add up to the load leaving the depot (no stop collects here), per dimension.
      const sum = (c: string) => rows.slice(1, -1).reduce((t, r) => t + Number(r[col(c)]), 0);
      expect([sum("Drop kg"), sum("Drop crates")]).toEqual(route.load);
    });
    const all = files.flatMap((f) => readCsv(f.text).flat());
    // User text unchanged: no apostrophe before formula-like text (the chosen policy, see csvText).
    for (const t of [STOP_TEXTS.name, STOP_TEXTS.address, STOP_TEXTS.note, STOP_TEXTS.formula, STOP_TEXTS.astral, "+33 1 00 00 00 01", "-"])
      expect(all).toContain(t);
  });

  it("gives each vehicle its own safe file name: unsafe characters replaced, case-insensitive duplicates numbered, Windows device names avoided", () => {
    const ids = ["A/B", "a/b", "CON", "..", "Van:1?"];
    const problem = {
      ...fixture.problem,
      vehicles: ids.map((id, i) => ({ ...fixture.problem.vehicles[0]!, id: `${id}`, ...(i > 0 ? {} : {}) })),
    };
    const visits = fixture.plan.routes[0]!.visits;
    const plan = {
      ...fixture.plan,
      routes: ids.map((_, i) => ({ ...fixture.plan.routes[0]!, vehicle: i, visits: i === 0 ? visits : visits.slice(0, 1) })),
    };
    const names = routeCsvFiles({ problem, plan }).map((f) => f.fileName);
    expect(names).toEqual(["A_B.csv", "a_b-2.csv", "vehicle_CON.csv", "vehicle_.csv", "Van_1_.csv"]);
  });

  it("adds Collect columns when a stop collects, and writes the fixture's formula-like names unchanged", () => {
    const problem = { ...fixture.problem, stops: fixture.problem.stops.map((st, i) => (i === 0 ? { ...st, pickup: [5, 1] } : st)) };
    const [van1] = routeCsvFiles({ problem, plan: fixture.plan, stopRows: fixture.stopRows, extraHeaders: fixture.extraHeaders });
    const [header, , first] = readCsv(van1!.text);
    expect(header).toContain("Collect kg");
    expect(first![header!.indexOf("Collect kg")]).toBe("5");
    expect(first![header!.indexOf("Name")]).toBe("=SUM(A1)");
  });
});
