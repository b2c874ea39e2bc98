import type { Issue, Problem } from "../core/index.js";
import type { CellValue } from "./grid.js";
import type { PlanSettings } from "./PlanSettings.js";

/** A header the reader recognised: the user's text, the field it maps to, the column letter. */
export interface ColumnMatch {
  readonly header: string;
  /** Canonical field, e.g. "latitude", "earliest", "extra" for a carried-through column, "ignored" for one left out. */
  readonly field: string;
  /** Column letter in the sheet, e.g. "E". */
  readonly column: string;
  /** Set when the user's column mapping decided the field ("ignored" is only ever set by one). */
  readonly mapped?: true;
}

/** Where a stop came from and the user's own columns carried through to the plan. */
export interface StopRow {
  /** Index into `Problem.stops`. */
  readonly stop: number;
  /** 1-based sheet row number. */
  readonly sheetRow: number;
  /** Unrecognised columns of this row, keyed by header text (order as in `extraHeaders`). */
  readonly extra: Readonly<Record<string, CellValue>>;
  /** The stop's Address cell as typed ("" when blank); absent when the stops table has no Address column. */
  readonly address?: string;
}

/** A vehicle the Fleet's Lock column locks, and the cell that says so. */
export interface LockedVehicle {
  /** Vehicle id as in `Problem.vehicles`. */
  readonly vehicle: string;
  readonly sheet: string;
  /** A1 address of its Lock cell. */
  readonly cell: string;
}

/** Result of reading the input tables. */
export type ReadResult =
  | {
      readonly ok: true;
      readonly problem: Problem;
      readonly settings: PlanSettings;
      readonly stopRows: readonly StopRow[];
      /** Headers of carried-through stop columns, in sheet order. */
      readonly extraHeaders: readonly string[];
      readonly stopColumns: readonly ColumnMatch[];
      readonly fleetColumns: readonly ColumnMatch[];
      /** Non-blocking notes (e.g. a stop no vehicle can carry: it will be reported unassigned). */
      readonly warnings: readonly Issue[];
      /**
       * Vehicles whose Fleet `Lock` cell says yes, with that cell: their routes are kept exactly
       * when re-planning from a plan sheet (`withEarlierPlan`); empty when the Fleet has no Lock column.
       */
      readonly lockedVehicles: readonly LockedVehicle[];
    }
  | {
      readonly ok: false;
      /** Every defect found, all at once. Nothing is solved or written. */
      readonly issues: readonly Issue[];
      readonly stopColumns: readonly ColumnMatch[];
      readonly fleetColumns: readonly ColumnMatch[];
    };
