/**
 * The pane's elements, looked up once by id (a missing id is a programming mistake and throws),
 * and the settings form read into / written from a `PaneForm`.
 */
import { PANE_FORM_FIELDS, type PaneForm } from "./settingsFromForm.js";

/**
 * Look up the pane's elements in `document`.
 *
 * @returns every element the controller uses
 * @throws TypeError naming the first id that is missing from taskpane.html
 * @example paneDom().optimize.disabled = true
 */
export function paneDom() {
  const $ = <T extends HTMLElement = HTMLElement>(id: string): T => {
    const el = document.getElementById(id);
    if (!el) throw new TypeError(`taskpane.html has no element #${id}`);
    return el as T;
  };
  const formInputs = PANE_FORM_FIELDS.map((id) => $<HTMLInputElement | HTMLSelectElement>(id));
  return {
    modeBadge: $("mode-badge"),
    error: $("pane-error"),
    errorText: $("pane-error-text"),
    errorClose: $<HTMLButtonElement>("pane-error-close"),
    fileSection: $("file-section"),
    fileInput: $<HTMLInputElement>("file-input"),
    fileName: $("file-name"),
    stopsUseSelection: $<HTMLButtonElement>("stops-use-selection"),
    fleetUseSelection: $<HTMLButtonElement>("fleet-use-selection"),
    stopsSheet: $<HTMLSelectElement>("stops-sheet"),
    fleetSheet: $<HTMLSelectElement>("fleet-sheet"),
    stopsSummary: $("stops-summary"),
    fleetSummary: $("fleet-summary"),
    stopsIssues: $("stops-issues"),
    fleetIssues: $("fleet-issues"),
    scenario: $<HTMLInputElement>("scenario"),
    workers: $<HTMLInputElement>("workers"),
    settingsSource: $("settings-source"),
    matrixSheet: $<HTMLSelectElement>("matrix-sheet"),
    matrixSummary: $("matrix-summary"),
    matrixIssues: $("matrix-issues"),
    fromPlanSheet: $<HTMLSelectElement>("from-plan-sheet"),
    stabilityCost: $<HTMLInputElement>("stability-cost"),
    lockedRoutes: $("locked-routes"),
    lockedRoutesList: $("locked-routes-list"),
    fromPlanSummary: $("from-plan-summary"),
    fromPlanIssues: $("from-plan-issues"),
    formInputs,
    scheduleParams: [...document.querySelectorAll<HTMLElement>("#cooling-section [data-for]")],
    temperatureParams: [...document.querySelectorAll<HTMLElement>("#cooling-section [data-temps]")],
    t0: $<HTMLInputElement>("t0"),
    tEnd: $<HTMLInputElement>("t-end"),
    coolingPlot: $("cooling-plot"),
    coolingReading: $("cooling-reading"),
    optimizeSection: $("optimize-section"),
    optimize: $<HTMLButtonElement>("optimize"),
    stop: $<HTMLButtonElement>("stop"),
    progressBar: $("progress-bar"),
    statElapsed: $("stat-elapsed"),
    statRemaining: $("stat-remaining"),
    statCurrent: $("stat-current"),
    statBest: $("stat-best"),
    statAccept: $("stat-accept"),
    statTemp: $("stat-temp"),
    statPhase: $("stat-phase"),
    statWorkers: $("stat-workers"),
    statMemory: $("stat-memory"),
    convergencePlot: $("convergence-plot"),
    result: $("result-section"),
    resultStatus: $("result-status"),
    map: $<HTMLCanvasElement>("route-map"),
    mapTooltip: $("map-tooltip"),
    legend: $("map-legend"),
    mapLabels: $("map-labels"),
    mapText: $("map-text"),
    mapTiles: $("map-tiles"),
    mapAttribution: $("map-attribution"),
    mapTileTemplate: $<HTMLInputElement>("map-tile-template"),
    mapTileAttribution: $<HTMLInputElement>("map-tile-attribution"),
    mapBackgroundApply: $<HTMLButtonElement>("map-background-apply"),
    mapBackgroundClear: $<HTMLButtonElement>("map-background-clear"),
    mapBackgroundStatus: $("map-background-status"),
    totals: $("totals"),
    violations: $("violations"),
    sheetPerVehicle: $<HTMLInputElement>("sheet-per-vehicle"),
    write: $<HTMLButtonElement>("write"),
    download: $<HTMLAnchorElement>("download"),
    writeStatus: $("write-status"),
    downloadGpx: $<HTMLAnchorElement>("download-gpx"),
    downloadGeoJson: $<HTMLAnchorElement>("download-geojson"),
    rerunSheet: $<HTMLSelectElement>("rerun-sheet"),
    rerun: $<HTMLButtonElement>("rerun"),
    rerunStatus: $("rerun-status"),
    caution: $("caution"),
  };
}

/** The pane's elements. */
export type PaneDom = ReturnType<typeof paneDom>;

/**
 * The settings fields' current texts.
 *
 * @param dom - the pane's elements
 * @returns the form
 * @example readForm(dom).schedule // => "timeFraction"
 */
export function readForm(dom: PaneDom): PaneForm {
  const entries = PANE_FORM_FIELDS.map((id, i) => [id, dom.formInputs[i]?.value ?? ""] as const);
  return Object.fromEntries(entries) as unknown as PaneForm;
}

/**
 * Put `form` into the settings fields.
 *
 * @param dom - the pane's elements
 * @param form - the texts to show
 * @example writeForm(dom, { ...readForm(dom), seed: "7" })
 */
export function writeForm(dom: PaneDom, form: PaneForm): void {
  PANE_FORM_FIELDS.forEach((id, i) => {
    const el = dom.formInputs[i];
    if (el) el.value = form[id];
  });
}
