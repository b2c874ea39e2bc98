import type { Plan, Problem } from "../core/index.js";
import type { StopRow } from "../sheets/ReadResult.js";

/** What every file for navigation and other tools (GPX, GeoJSON, CSV) is written from. */
export interface RouteFilesInput {
  readonly problem: Problem;
  readonly plan: Plan;
  /** The stops' addresses and carried columns (from `readProblem`); may be empty. */
  readonly stopRows?: readonly StopRow[];
  /** Headers of the carried columns in sheet order (from `readProblem`); may be empty. */
  readonly extraHeaders?: readonly string[];
  /** The scenario name: the GPX `<metadata><name>` and the downloads' file name. */
  readonly scenario?: string;
}
