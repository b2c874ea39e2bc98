import type { TsplibCoordType, TsplibPoint } from "../geo/tsplibDistance.js";
import type { Issue } from "../model.js";

/** A symmetric TSP instance read from a TSPLIB95 file. */
export interface TsplibInstance {
  /** NAME of the file ("" when absent). */
  readonly name: string;
  readonly comment: string;
  /** DIMENSION: the number of nodes, numbered 1..dimension in the file. */
  readonly dimension: number;
  readonly edgeWeightType: TsplibCoordType | "EXPLICIT";
  /**
   * Node coordinates in node order (index = node number - 1): NODE_COORD_SECTION, or
   * DISPLAY_DATA_SECTION for EXPLICIT files; empty when the file has neither.
   */
  readonly nodes: readonly TsplibPoint[];
  /** EXPLICIT only: the full `dimension x dimension` matrix, row-major, symmetric. */
  readonly weights?: Float64Array;
  /** Problems in the file; the instance is usable only when this is empty. */
  readonly issues: readonly Issue[];
}

const COORD_TYPES = new Set(["EUC_2D", "CEIL_2D", "ATT", "GEO"]);
const FORMATS = new Set([
  "FULL_MATRIX",
  "UPPER_ROW",
  "LOWER_ROW",
  "UPPER_DIAG_ROW",
  "LOWER_DIAG_ROW",
  "UPPER_COL",
  "LOWER_COL",
  "UPPER_DIAG_COL",
  "LOWER_DIAG_COL",
]);
const KEYWORD = /^([A-Z_]+)\s*(?::\s*(.*))?$/;

/**
 * Reads a symmetric TSP file in the TSPLIB95 format (Reinelt 1995): the specification part
 * (NAME, TYPE, DIMENSION, EDGE_WEIGHT_TYPE, EDGE_WEIGHT_FORMAT) and the NODE_COORD_SECTION
 * (EUC_2D, CEIL_2D, ATT, GEO) or an EDGE_WEIGHT_SECTION (EXPLICIT, any of the nine
 * triangle/full layouts), with an optional DISPLAY_DATA_SECTION.
 *
 * Problems in the file never throw: they are listed in `issues` as
 * `{ sheet: "tsplib", cell: "line 12", message }`.
 *
 * @param text - the whole file
 * @returns the instance, with `issues` empty when it can be used
 * @example parseTsplib("DIMENSION: 2\nEDGE_WEIGHT_TYPE: EUC_2D\nNODE_COORD_SECTION\n1 0 0\n2 3 4\nEOF").nodes[1] // => { x: 3, y: 4 }
 */
export function parseTsplib(text: string): TsplibInstance {
  const issues: Issue[] = [];
  const at = (line: number, message: string): void => {
    issues.push({ sheet: "tsplib", cell: line > 0 ? `line ${line}` : "", message });
  };
  const spec = new Map<string, string>();
  const lines = text.split(/\r?\n/);
  let coords: { line: number; fields: string[] }[] | undefined;
  let display: { line: number; fields: string[] }[] | undefined;
  let weightTokens: { line: number; token: string }[] | undefined;
  let section: "coord" | "display" | "weight" | "other" | undefined;
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i]!.trim();
    if (raw === "") continue;
    const lineNo = i + 1;
    const keyword = KEYWORD.exec(raw);
    if (keyword) {
      const key = keyword[1]!;
      if (key === "EOF") break;
      if (key.endsWith("_SECTION")) {
        if (key === "NODE_COORD_SECTION") {
          section = "coord";
          coords = [];
        } else if (key === "DISPLAY_DATA_SECTION") {
          section = "display";
          display = [];
        } else if (key === "EDGE_WEIGHT_SECTION") {
          section = "weight";
          weightTokens = [];
        } else {
          section = "other";
          at(lineNo, `${key} is not supported (only symmetric TSP files are read)`);
        }
        continue;
      }
      section = undefined;
      spec.set(key, (keyword[2] ?? "").trim());
      continue;
    }
    const fields = raw.split(/\s+/);
    if (section === "coord") coords!.push({ line: lineNo, fields });
    else if (section === "display") display!.push({ line: lineNo, fields });
    else if (section === "weight") for (const token of fields) weightTokens!.push({ line: lineNo, token });
    else if (section === undefined) at(lineNo, `"${raw.slice(0, 40)}" is neither a KEYWORD: value line nor inside a section`);
  }

  const type = (spec.get("TYPE") ?? "TSP").toUpperCase();
  if (type !== "TSP") at(0, `TYPE ${type} is not supported: only symmetric TSP files (TYPE: TSP) are read`);
  const dimension = Number(spec.get("DIMENSION"));
  if (!Number.isInteger(dimension) || dimension < 2) {
    at(0, `DIMENSION must be a whole number of at least 2, got "${spec.get("DIMENSION") ?? ""}"; add e.g. "DIMENSION: 14"`);
  }
  const n = Number.isInteger(dimension) && dimension >= 2 ? dimension : 0;
  const ewt = (spec.get("EDGE_WEIGHT_TYPE") ?? "").toUpperCase();
  let edgeWeightType: TsplibInstance["edgeWeightType"] = "EUC_2D";
  if (COORD_TYPES.has(ewt) || ewt === "EXPLICIT") edgeWeightType = ewt as TsplibInstance["edgeWeightType"];
  else at(0, `EDGE_WEIGHT_TYPE "${ewt}" is not supported; use EUC_2D, CEIL_2D, ATT, GEO or EXPLICIT`);

  let nodes: TsplibPoint[] = [];
  let weights: Float64Array | undefined;
  if (edgeWeightType === "EXPLICIT") {
    const format = (spec.get("EDGE_WEIGHT_FORMAT") ?? "").toUpperCase();
    if (!FORMATS.has(format))
      at(0, `EDGE_WEIGHT_FORMAT "${format}" is not supported for EXPLICIT; use FULL_MATRIX or a triangle layout such as UPPER_ROW`);
    else if (!weightTokens) at(0, "EDGE_WEIGHT_SECTION is missing");
    else if (n > 0) weights = readWeights(n, format, weightTokens, at);
    if (display && n > 0) nodes = readNodes(n, display, "DISPLAY_DATA_SECTION", at);
  } else if (n > 0) {
    if (!coords) at(0, "NODE_COORD_SECTION is missing");
    else nodes = readNodes(n, coords, "NODE_COORD_SECTION", at);
  }
  const inst = {
    name: spec.get("NAME") ?? "",
    comment: spec.get("COMMENT") ?? "",
    dimension: n,
    edgeWeightType,
    nodes,
    issues,
  };
  return weights ? { ...inst, weights } : inst;
}

function readNodes(
  n: number,
  rows: readonly { line: number; fields: string[] }[],
  section: string,
  at: (line: number, message: string) => void,
): TsplibPoint[] {
  const nodes: (TsplibPoint | undefined)[] = new Array<TsplibPoint | undefined>(n).fill(undefined);
  for (const { line, fields } of rows) {
    const [idText, xText, yText] = fields;
    const id = Number(idText);
    const x = Number(xText);
    const y = Number(yText);
    if (fields.length < 3 || !Number.isFinite(x) || !Number.isFinite(y)) {
      at(line, `${section}: expected "node x y", got "${fields.join(" ")}"`);
    } else if (!Number.isInteger(id) || id < 1 || id > n) {
      at(line, `${section}: node number ${idText} is outside 1..${n} (DIMENSION)`);
    } else if (nodes[id - 1]) {
      at(line, `${section}: node ${id} appears twice; keep one line per node`);
    } else {
      nodes[id - 1] = { x, y };
    }
  }
  const missing = nodes.flatMap((p, i) => (p ? [] : [i + 1]));
  if (missing.length > 0) {
    at(0, `${section}: ${missing.length} of ${n} nodes have no coordinates (first: ${missing.slice(0, 5).join(", ")})`);
  }
  return nodes.map((p) => p ?? { x: 0, y: 0 });
}

/** Fills the full matrix from any TSPLIB95 layout; column layouts mirror the row ones. */
function readWeights(
  n: number,
  format: string,
  tokens: readonly { line: number; token: string }[],
  at: (line: number, message: string) => void,
): Float64Array {
  const w = new Float64Array(n * n);
  const cells: [number, number][] = [];
  // For a symmetric matrix UPPER_COL lists the same numbers as LOWER_ROW, and so on.
  const rowFormat =
    (
      { UPPER_COL: "LOWER_ROW", LOWER_COL: "UPPER_ROW", UPPER_DIAG_COL: "LOWER_DIAG_ROW", LOWER_DIAG_COL: "UPPER_DIAG_ROW" } as Record<
        string,
        string
      >
    )[format] ?? format;
  for (let i = 0; i < n; i++) {
    const [from, to] =
      rowFormat === "FULL_MATRIX"
        ? [0, n - 1]
        : rowFormat === "UPPER_ROW"
          ? [i + 1, n - 1]
          : rowFormat === "UPPER_DIAG_ROW"
            ? [i, n - 1]
            : rowFormat === "LOWER_ROW"
              ? [0, i - 1]
              : [0, i];
    for (let j = from; j <= to; j++) cells.push([i, j]);
  }
  if (tokens.length !== cells.length) {
    at(tokens[0]?.line ?? 0, `EDGE_WEIGHT_SECTION: ${format} of ${n} nodes needs ${cells.length} numbers, found ${tokens.length}`);
    return w;
  }
  cells.forEach(([i, j], k) => {
    const { line, token } = tokens[k]!;
    const v = Number(token);
    if (!Number.isFinite(v) || v < 0) at(line, `EDGE_WEIGHT_SECTION: "${token}" is not a non-negative number`);
    if (format === "FULL_MATRIX") w[i * n + j] = v;
    else w[i * n + j] = w[j * n + i] = v;
  });
  if (format === "FULL_MATRIX") {
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++) {
        if (w[i * n + j] !== w[j * n + i]) {
          at(0, `EDGE_WEIGHT_SECTION: the matrix is not symmetric (node ${i + 1} to ${j + 1}); only symmetric TSP is read`);
          return w;
        }
      }
    }
  }
  return w;
}
