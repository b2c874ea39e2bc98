import type { Issue } from "../model.js";

/** One row of the CUSTOMER table of a Solomon file; customer 0 is the depot. */
export interface SolomonCustomer {
  /** CUST NO. as written. */
  readonly id: number;
  readonly x: number;
  readonly y: number;
  readonly demand: number;
  /** READY TIME: earliest start of service. */
  readonly readyTime: number;
  /** DUE DATE: latest start of service (the depot's: latest return). */
  readonly dueDate: number;
  readonly serviceTime: number;
}

/** A VRPTW instance in Solomon's (1987) text layout. */
export interface SolomonInstance {
  /** The first line of the file, e.g. "C101" ("" when absent). */
  readonly name: string;
  /** VEHICLE NUMBER: identical vehicles available. */
  readonly vehicleCount: number;
  /** CAPACITY of each vehicle. */
  readonly capacity: number;
  /** The depot first (customer 0), then the customers in file order. */
  readonly customers: readonly SolomonCustomer[];
  /** Problems in the file; the instance is usable only when this is empty. */
  readonly issues: readonly Issue[];
}

const NUMBER_ROW = /^[-+\d.eE\s]+$/;

/**
 * Reads a VRPTW instance in the text layout of Solomon's benchmark (M. M. Solomon,
 * Operations Research 35(2), 1987): the name, the VEHICLE block (NUMBER, CAPACITY) and the
 * CUSTOMER table (CUST NO., XCOORD., YCOORD., DEMAND, READY TIME, DUE DATE, SERVICE TIME).
 *
 * Problems in the file never throw: they are listed in `issues` as
 * `{ sheet: "solomon", cell: "line 12", message }`.
 *
 * @param text - the whole file
 * @returns the instance, with `issues` empty when it can be used
 * @example parseSolomon(c101Text).capacity // => 200
 */
export function parseSolomon(text: string): SolomonInstance {
  const issues: Issue[] = [];
  const at = (line: number, message: string): void => {
    issues.push({ sheet: "solomon", cell: line > 0 ? `line ${line}` : "", message });
  };
  const lines = text.split(/\r?\n/).map((l) => l.trim());
  const firstLine = lines.findIndex((l) => l !== "");
  const name = firstLine >= 0 ? lines[firstLine]! : "";
  let vehicleCount = 0;
  let capacity = 0;
  const customers: SolomonCustomer[] = [];
  let part: "start" | "vehicle" | "customer" = "start";
  let sawVehicleNumbers = false;
  for (let i = firstLine + 1; i < lines.length && firstLine >= 0; i++) {
    const line = lines[i]!;
    const lineNo = i + 1;
    if (line === "") continue;
    const upper = line.toUpperCase();
    if (upper.startsWith("VEHICLE")) {
      part = "vehicle";
      continue;
    }
    if (upper.startsWith("CUSTOMER")) {
      part = "customer";
      continue;
    }
    if (!NUMBER_ROW.test(line)) {
      if (part === "start") at(lineNo, `"${line.slice(0, 40)}" is not part of the Solomon layout (expected the VEHICLE block)`);
      continue; // column headings such as "NUMBER CAPACITY" and "CUST NO. XCOORD. ..."
    }
    const values = line.split(/\s+/).map(Number);
    if (values.some((v) => !Number.isFinite(v))) {
      at(lineNo, `"${line}" holds a value that is not a number`);
    } else if (part === "vehicle" && !sawVehicleNumbers) {
      if (values.length !== 2) at(lineNo, `expected "NUMBER CAPACITY" (two numbers), got "${line}"`);
      else [vehicleCount, capacity] = values as [number, number];
      sawVehicleNumbers = true;
    } else if (part === "customer") {
      if (values.length !== 7) {
        at(lineNo, `expected 7 numbers (CUST NO., XCOORD., YCOORD., DEMAND, READY TIME, DUE DATE, SERVICE TIME), got ${values.length}`);
        continue;
      }
      const [id, x, y, demand, readyTime, dueDate, serviceTime] = values as [number, number, number, number, number, number, number];
      if (id !== customers.length)
        at(lineNo, `customer number ${id} out of order: expected ${customers.length} (the depot is 0, then 1, 2, ...)`);
      if (demand < 0 || serviceTime < 0) at(lineNo, `customer ${id}: DEMAND and SERVICE TIME must not be negative`);
      if (dueDate < readyTime) at(lineNo, `customer ${id}: DUE DATE ${dueDate} is before READY TIME ${readyTime}`);
      customers.push({ id, x, y, demand, readyTime, dueDate, serviceTime });
    } else {
      at(lineNo, `"${line}" is outside the VEHICLE and CUSTOMER blocks`);
    }
  }
  if (!sawVehicleNumbers) at(0, "the VEHICLE block (NUMBER and CAPACITY) is missing");
  else if (!(Number.isInteger(vehicleCount) && vehicleCount >= 1) || !(capacity > 0)) {
    at(0, `VEHICLE NUMBER must be a whole number >= 1 and CAPACITY > 0, got ${vehicleCount} and ${capacity}`);
  }
  if (customers.length < 2) at(0, "the CUSTOMER table needs the depot (customer 0) and at least one customer");
  return { name, vehicleCount, capacity, customers, issues };
}
