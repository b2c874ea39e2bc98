import type { Issue } from "../core/model.js";
import type { CoolingSpec } from "../core/options.js";
import type { SheetRead } from "./grid.js";
import { excelError, isBlank, plainCell, readNumber, shownValue } from "./cellValue.js";
import { headerWords } from "./matchHeaders.js";
import { parseDuration } from "./parseDuration.js";
import type { PlanSettings } from "./PlanSettings.js";
import { cellIssue } from "./readTable.js";

/** Geometric factor 0.94 (common practice); no moves per level: the levels then fit the run. */
export const GEOMETRIC_DEFAULTS = { alpha: 0.94, movesPerLevel: undefined } as const;
/** Number of levels of the linear schedule when none is given. */
export const LINEAR_DEFAULT_STEPS = 20;

type Key =
  | "detourFactor"
  | "speedKmh"
  | "serviceMin"
  | "windows"
  | "lateCostPerMin"
  | "rule"
  | "schedule"
  | "alpha"
  | "movesPerLevel"
  | "steps"
  | "beta"
  | "t0"
  | "tEnd"
  | "p0"
  | "pEnd"
  | "seed"
  | "seconds"
  | "moves"
  | "objective";

const KEYS: Record<Key, readonly string[]> = {
  detourFactor: ["detourfactor", "detour", "circuity", "circuityfactor", "roadfactor"],
  speedKmh: ["speedkmh", "speed", "averagespeed", "kmh", "speedkph"],
  serviceMin: ["servicemin", "service", "servicetime", "serviceminutes", "dwell", "dwellmin"],
  windows: ["windows", "timewindows", "windowmode", "windowtype", "window"],
  lateCostPerMin: ["latecostpermin", "latecost", "latecostperminute", "latepenalty", "latenesscost"],
  rule: ["acceptance", "acceptancerule", "rule"],
  schedule: ["schedule", "cooling", "coolingschedule"],
  alpha: ["alpha", "coolingfactor"],
  movesPerLevel: ["movesperlevel", "levelmoves", "movesperstep", "l"],
  steps: ["steps", "levels"],
  beta: ["beta"],
  t0: ["t0", "tstart", "starttemperature", "initialtemperature"],
  tEnd: ["tend", "endtemperature", "finaltemperature"],
  p0: ["p0", "initialacceptance", "startacceptance"],
  pEnd: ["pend", "finalacceptance", "endacceptance"],
  seed: ["seed", "randomseed"],
  seconds: ["seconds", "timelimit", "timelimitseconds", "timelimits", "runseconds", "timelimitsec"],
  moves: ["moves", "movebudget", "budgetmoves", "maxmoves"],
  objective: ["objective", "goal"],
};
const HEADER_KEYS = new Set(["setting", "settings", "key", "name", "parameter", "option"]);
const SCHEDULE_PARAMS: Record<CoolingSpec["kind"], readonly Key[]> = {
  geometric: ["alpha", "movesPerLevel", "t0"],
  linear: ["steps", "t0", "tEnd"],
  lundyMees: ["beta", "t0"],
  timeFraction: ["t0", "tEnd"],
};

/**
 * Read an optional two-column Settings sheet (key | value; keys matched like headers):
 * Detour factor, Speed km/h, Service min, Windows (hard/soft), Late cost per min, Acceptance
 * (metropolis/logistic), Schedule (geometric/linear/lundy-mees/time), Alpha, Moves per level,
 * Steps, Beta, T0, T end, P0, P end, Seed, Seconds, Moves, Objective (weighted/hierarchical).
 * A first row "Setting | Value" is skipped. A schedule named without its parameters gets
 * alpha 0.94 and 100 moves per level (geometric) or 20 steps (linear); Lundy-Mees needs Beta.
 *
 * @param read - the settings range
 * @returns the settings given (only those) and an issue per unknown key or bad value
 * @example parseSettingsSheet({ sheet: "Settings", row: 0, col: 0, values: [["Windows", "soft"]] }).settings
 * // => { hardWindows: false }
 */
export function parseSettingsSheet(read: SheetRead): { settings: Partial<PlanSettings>; issues: Issue[] } {
  const issues: Issue[] = [];
  const given = new Map<Key, { value: unknown; row0: number }>();
  read.values.forEach((cells, r) => {
    const row0 = read.row + r;
    const keyRaw = plainCell(cells[0]);
    if (isBlank(keyRaw)) return;
    const word = headerWords(String(keyRaw)).join("");
    if (r === 0 && HEADER_KEYS.has(word)) return;
    const key = (Object.keys(KEYS) as Key[]).find((k) => KEYS[k].includes(word));
    if (key === undefined) {
      issues.push(
        cellIssue(
          read.sheet,
          row0,
          read.col,
          `unknown setting "${String(keyRaw)}"; use one of Detour factor, Speed km/h, Service min, Windows, Late cost per min, Acceptance, Schedule, Alpha, Moves per level, Steps, Beta, T0, T end, P0, P end, Seed, Seconds, Moves, Objective (or clear the row).`,
        ),
      );
      return;
    }
    if (isBlank(cells[1])) return;
    if (given.has(key)) {
      issues.push(
        cellIssue(
          read.sheet,
          row0,
          read.col,
          `setting "${String(keyRaw)}" is given twice (also on row ${given.get(key)!.row0 + 1}); keep one.`,
        ),
      );
      return;
    }
    given.set(key, { value: cells[1], row0 });
  });
  const out: { -readonly [K in keyof PlanSettings]?: PlanSettings[K] } = {};
  const fail = (key: Key, message: string): void => {
    issues.push(cellIssue(read.sheet, given.get(key)!.row0, read.col + 1, message));
  };
  const num = (key: Key, ok: (n: number) => boolean, range: string): number | undefined => {
    const g = given.get(key);
    if (g === undefined) return undefined;
    const e = excelError(g.value);
    const n = readNumber(g.value);
    if (e !== undefined) fail(key, `the cell shows the Excel error ${e}; type the value.`);
    else if (n === undefined || !ok(n)) fail(key, `${shownValue(g.value)} is not a valid ${label(key)}; type ${range}.`);
    else return n;
    return undefined;
  };
  const word = (key: Key, choices: Record<string, string>): string | undefined => {
    const g = given.get(key);
    if (g === undefined) return undefined;
    const w = headerWords(String(plainCell(g.value))).join("");
    const hit = choices[w];
    if (hit === undefined)
      fail(key, `${shownValue(g.value)} is not a valid ${label(key)}; type one of ${[...new Set(Object.values(choices))].join(", ")}.`);
    return hit;
  };
  const set = <K extends keyof PlanSettings>(k: K, v: PlanSettings[K] | undefined): void => {
    if (v !== undefined) out[k] = v;
  };
  set(
    "detourFactor",
    num("detourFactor", (n) => n >= 1, "a number of 1 or more, such as 1.3"),
  );
  set(
    "speedKmh",
    num("speedKmh", (n) => n > 0, "a speed above 0, such as 40"),
  );
  const service = given.get("serviceMin");
  if (service !== undefined) {
    const d = parseDuration(service.value);
    if (d === undefined) fail("serviceMin", `${shownValue(service.value)} is not a valid service time; type minutes such as 5.`);
    else out.serviceMin = d;
  }
  const windows = word("windows", { hard: "hard", soft: "soft", strict: "hard", flexible: "soft" });
  if (windows !== undefined) out.hardWindows = windows === "hard";
  set(
    "lateCostPerMin",
    num("lateCostPerMin", (n) => n >= 0, "a cost of 0 or more, such as 1"),
  );
  set("rule", word("rule", { metropolis: "metropolis", logistic: "logistic", barker: "logistic" }) as PlanSettings["rule"] | undefined);
  set(
    "p0",
    num("p0", (n) => n > 0 && n < 1, "a probability between 0 and 1, such as 0.5"),
  );
  set(
    "pEnd",
    num("pEnd", (n) => n > 0 && n < 1, "a probability between 0 and 1, such as 0.001"),
  );
  set(
    "seed",
    num("seed", (n) => Number.isInteger(n), "a whole number, such as 1"),
  );
  set(
    "seconds",
    num("seconds", (n) => n > 0, "a number of seconds above 0, such as 10"),
  );
  set(
    "moves",
    num("moves", (n) => Number.isInteger(n) && n > 0, "a whole number above 0, such as 200000"),
  );
  set(
    "objective",
    word("objective", { weighted: "weighted", cost: "weighted", hierarchical: "hierarchical", vehiclesfirst: "hierarchical" }) as
      PlanSettings["objective"] | undefined,
  );
  const cooling = readCooling(given, num, word, fail);
  if (cooling !== undefined) out.cooling = cooling;
  return { settings: out, issues };
}

function readCooling(
  given: ReadonlyMap<Key, unknown>,
  num: (key: Key, ok: (n: number) => boolean, range: string) => number | undefined,
  word: (key: Key, choices: Record<string, string>) => string | undefined,
  fail: (key: Key, message: string) => void,
): CoolingSpec | undefined {
  const kind = word("schedule", {
    geometric: "geometric",
    exponential: "geometric",
    linear: "linear",
    linearsteps: "linear",
    lundymees: "lundyMees",
    lundy: "lundyMees",
    time: "timeFraction",
    timefraction: "timeFraction",
  }) as CoolingSpec["kind"] | undefined;
  const params: Key[] = ["alpha", "movesPerLevel", "steps", "beta", "t0", "tEnd"];
  const present = params.filter((k) => given.has(k));
  if (kind === undefined) {
    if (!given.has("schedule"))
      for (const k of present)
        fail(k, `${label(k)} needs a Schedule row (geometric, linear, lundy-mees or time); add one or clear this value.`);
    return undefined;
  }
  for (const k of present) {
    if (!SCHEDULE_PARAMS[kind].includes(k))
      fail(k, `${label(k)} does not apply to the ${kind} schedule; clear it or choose a schedule that uses it.`);
  }
  const t0 = num("t0", (n) => n > 0, "a temperature above 0");
  const tEnd = num("tEnd", (n) => n > 0, "a temperature above 0");
  const opt = <T extends object>(o: T): T => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
  switch (kind) {
    case "geometric":
      return opt({
        kind,
        t0,
        alpha: num("alpha", (n) => n > 0 && n < 1, "a factor between 0 and 1, such as 0.94") ?? GEOMETRIC_DEFAULTS.alpha,
        movesPerLevel: num(
          "movesPerLevel",
          (n) => Number.isInteger(n) && n >= 1,
          "a whole number of 1 or more, such as 10000; leave it out to fit the levels to the run",
        ),
      });
    case "linear":
      return opt({
        kind,
        t0,
        tEnd,
        steps: num("steps", (n) => Number.isInteger(n) && n >= 1, "a whole number of 1 or more, such as 20") ?? LINEAR_DEFAULT_STEPS,
      });
    case "lundyMees": {
      const beta = num("beta", (n) => n > 0, "a number above 0, such as 0.0001");
      if (beta === undefined) {
        if (!given.has("beta"))
          fail(
            "schedule",
            "the lundy-mees schedule needs a Beta row (a number above 0, such as 0.0001); add it or choose another schedule.",
          );
        return undefined;
      }
      return opt({ kind, t0, beta });
    }
    case "timeFraction":
      return opt({ kind, t0, tEnd });
  }
}

function label(key: Key): string {
  const names: Record<Key, string> = {
    detourFactor: "detour factor",
    speedKmh: "speed (km/h)",
    serviceMin: "service time",
    windows: "window mode (hard or soft)",
    lateCostPerMin: "late cost per minute",
    rule: "acceptance rule",
    schedule: "cooling schedule",
    alpha: "Alpha",
    movesPerLevel: "Moves per level",
    steps: "Steps",
    beta: "Beta",
    t0: "T0",
    tEnd: "T end",
    p0: "P0",
    pEnd: "P end",
    seed: "seed",
    seconds: "time limit in seconds",
    moves: "move budget",
    objective: "objective",
  };
  return names[key];
}
