/**
 * The result's "Download GPX" and "Download GeoJSON" links: the files are written in the page
 * by the pure writers of `src/exports` and offered as Blob URLs; nothing is sent anywhere.
 */
import type { RouteFilesInput } from "../exports/RouteFilesInput.js";
import { safeFileStem } from "../exports/safeFileStem.js";
import { writeGeoJson } from "../exports/writeGeoJson.js";
import { writeGpx } from "../exports/writeGpx.js";

/** Media types: GPX as registered by its authors, GeoJSON by RFC 7946 §12. */
const GPX_TYPE = "application/gpx+xml";
const GEOJSON_TYPE = "application/geo+json";

/** Keeps the two links and the Blob URLs behind them (revoked when replaced). */
export class NavigationDownloads {
  private urls: string[] = [];

  /**
   * @param gpx - the "Download GPX" link
   * @param geojson - the "Download GeoJSON" link
   */
  constructor(
    private readonly gpx: HTMLAnchorElement,
    private readonly geojson: HTMLAnchorElement,
  ) {}

  /**
   * Write both files for a run and show the links.
   *
   * @param input - problem, plan, stop rows, carried headers and scenario name
   * @example downloads.show({ problem, plan, stopRows, extraHeaders, scenario: "Plan 1" })
   */
  show(input: RouteFilesInput & { readonly scenario: string }): void {
    this.clear();
    const stem = safeFileStem(input.scenario, "routes");
    this.offer(this.gpx, new Blob([writeGpx(input)], { type: GPX_TYPE }), `${stem}.gpx`);
    this.offer(this.geojson, new Blob([JSON.stringify(writeGeoJson(input), null, 1) + "\n"], { type: GEOJSON_TYPE }), `${stem}.geojson`);
  }

  /** Hide the links and release the files (a new workbook was opened). */
  clear(): void {
    for (const url of this.urls) URL.revokeObjectURL(url);
    this.urls = [];
    for (const a of [this.gpx, this.geojson]) {
      a.hidden = true;
      a.removeAttribute("href");
    }
  }

  private offer(link: HTMLAnchorElement, blob: Blob, name: string): void {
    const url = URL.createObjectURL(blob);
    this.urls.push(url);
    link.href = url;
    link.download = name;
    link.hidden = false;
  }
}
