/**
 * The optional background under the route map: web map tiles from a server the user named,
 * handled by Leaflet (tile addressing, Web Mercator projection, fitting the view), which is
 * loaded only when a background is chosen, so the default map loads no library and requests
 * nothing. The routes stay on Kiln's own canvas above; Leaflet's projection places them.
 */
import type { LatLon } from "../core/index.js";
import type { FittedProjection } from "./fitEquirectangular.js";
import type { MapBackground } from "./mapBackgroundSetting.js";
import type { MapProjector } from "./RouteMap.js";

type Leaflet = typeof import("leaflet");

/** Tile events, for the pane's status line. */
export interface TileEvents {
  /** Called after each tile loads or fails, with the running counts. */
  onTiles(loaded: number, failed: number): void;
}

/** A Leaflet map inside `container`, fitted to the routes on each draw. */
export class TileBackground implements MapProjector {
  private constructor(
    private readonly L: Leaflet,
    private readonly map: import("leaflet").Map,
    private readonly container: HTMLElement,
  ) {}

  /**
   * Load Leaflet and show `background`'s tiles in `container` (which must sit exactly under the map's canvas).
   *
   * @param container - an empty element the size of the canvas
   * @param background - the checked tile template and attribution
   * @param events - tile load and error counts
   * @returns the background, ready to be passed to `RouteMap.setProjector`
   * @example map.setProjector(await TileBackground.create(dom.mapTiles, bg, { onTiles: () => {} }))
   */
  static async create(container: HTMLElement, background: MapBackground, events: TileEvents): Promise<TileBackground> {
    // One chunk named "leaflet", fetched from the pane's own origin only when a background is chosen.
    const [mod, css] = await Promise.all([
      import(/* webpackChunkName: "leaflet" */ "leaflet"),
      import(/* webpackChunkName: "leaflet" */ "leaflet/dist/leaflet.css"),
    ]);
    const L = ((mod as { default?: Leaflet }).default ?? mod) as Leaflet;
    addStyle(css.default);
    container.hidden = false;
    container.replaceChildren();
    // A still picture: the routes' canvas takes the pointer, and the view follows the plan.
    const map = L.map(container, {
      zoomControl: false,
      attributionControl: false,
      dragging: false,
      touchZoom: false,
      scrollWheelZoom: false,
      doubleClickZoom: false,
      boxZoom: false,
      keyboard: false,
      zoomSnap: 0,
      zoomAnimation: false,
      fadeAnimation: false,
      markerZoomAnimation: false,
      inertia: false,
    });
    let loaded = 0;
    let failed = 0;
    L.tileLayer(background.template, { maxZoom: 19, minZoom: 0 })
      .on("tileload", () => events.onTiles(++loaded, failed))
      .on("tileerror", () => events.onTiles(loaded, ++failed))
      .addTo(map);
    return new TileBackground(L, map, container);
  }

  /**
   * Fit the view to `points` with `paddingPx` to spare and return Leaflet's projection of it.
   *
   * @param points - the depots and stops, decimal degrees
   * @param width - canvas width, px (the container has the same size)
   * @param height - canvas height, px
   * @param paddingPx - margin on every side
   * @returns container pixel positions and the scale along the map's middle
   * @example background.fit([{ lat: 53.96, lon: -1.08 }], 350, 260, 26).project({ lat: 53.96, lon: -1.08 }) // => { x: 175, y: 130 }
   */
  fit(points: readonly LatLon[], width: number, height: number, paddingPx: number): FittedProjection {
    const { L, map } = this;
    map.invalidateSize({ animate: false, pan: false });
    const bounds = L.latLngBounds(points.map((p) => L.latLng(p.lat, p.lon)));
    // One point (or all on one spot): about a street's width around it rather than the deepest zoom.
    map.fitBounds(bounds, { padding: L.point(paddingPx, paddingPx), animate: false, maxZoom: 16 });
    const size = map.getSize();
    const mid = size.y / 2;
    const metres = map.distance(map.containerPointToLatLng(L.point(0, mid)), map.containerPointToLatLng(L.point(size.x || width, mid)));
    return {
      project: (p) => {
        const pt = map.latLngToContainerPoint(L.latLng(p.lat, p.lon));
        return { x: pt.x, y: pt.y };
      },
      pxPerKm: metres > 0 ? (size.x || width) / (metres / 1000) : 1,
    };
  }

  /** Remove the map and hide its container. */
  destroy(): void {
    this.map.remove();
    this.container.replaceChildren();
    this.container.hidden = true;
  }
}

/**
 * Leaflet's stylesheet, once, as a constructed stylesheet adopted by the document (a `<style>`
 * element would need `'unsafe-inline'` in the page's `style-src`); image references dropped (no
 * marker or layer control is used, so nothing is fetched).
 */
let leafletSheet: CSSStyleSheet | undefined;
function addStyle(css: string): void {
  if (leafletSheet) return;
  leafletSheet = new CSSStyleSheet();
  leafletSheet.replaceSync(css.replace(/url\([^)]*\)/g, "none"));
  document.adoptedStyleSheets = [...document.adoptedStyleSheets, leafletSheet];
}
