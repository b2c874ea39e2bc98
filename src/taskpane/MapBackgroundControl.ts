/**
 * The pane's "Background map" fields: check the tile template and attribution, keep them in the
 * workbook's settings store, and switch the route map between its offline drawing and tiles.
 * A template found in a workbook is filled in but not loaded until the user presses "Use
 * background": opening a file never makes a request by itself.
 */
import type { WorkbookPort } from "../workbook/WorkbookPort.js";
import { MAP_BACKGROUND_KEY, parseMapBackground, readMapBackground, type MapBackground } from "./mapBackgroundSetting.js";
import type { PaneDom } from "./paneDom.js";
import type { RouteMap } from "./RouteMap.js";
import { TileBackground } from "./TileBackground.js";

/** Wires the background fields to the map. */
export class MapBackgroundControl {
  private active: TileBackground | undefined;

  /**
   * @param dom - the pane's elements
   * @param map - the route map
   * @param port - the current workbook (changes when the standalone page opens another file)
   */
  constructor(
    private readonly dom: PaneDom,
    private readonly map: RouteMap,
    private readonly port: () => WorkbookPort,
  ) {}

  /**
   * Attach the buttons' handlers through the pane's guard.
   *
   * @param guard - the pane's handler guard
   * @example control.wire(this.guard)
   */
  wire(guard: (name: string, handler: () => unknown) => () => void): void {
    this.dom.mapBackgroundApply.addEventListener(
      "click",
      guard("Use background", () => this.apply()),
    );
    this.dom.mapBackgroundClear.addEventListener(
      "click",
      guard("No background", () => this.clear()),
    );
  }

  /**
   * Fill the fields from the workbook's settings store (nothing is loaded from the network) and
   * go back to the offline map.
   *
   * @example await control.load()
   */
  async load(): Promise<void> {
    await this.show(undefined);
    const stored = readMapBackground((await this.port().readSettings())[MAP_BACKGROUND_KEY]);
    const d = this.dom;
    d.mapTileTemplate.value = stored?.template ?? "";
    d.mapTileAttribution.value = stored?.attribution ?? "";
    this.status(stored ? `This workbook names a background from ${hostOf(stored.template)}. Press Use background to load it.` : "");
  }

  private async apply(): Promise<void> {
    const d = this.dom;
    const parsed = parseMapBackground(d.mapTileTemplate.value, d.mapTileAttribution.value);
    if ("message" in parsed) return this.status(parsed.message, true);
    await this.port().writeSetting(MAP_BACKGROUND_KEY, parsed.background ? JSON.stringify(parsed.background) : "");
    await this.show(parsed.background);
  }

  private async clear(): Promise<void> {
    this.dom.mapTileTemplate.value = "";
    await this.port().writeSetting(MAP_BACKGROUND_KEY, "");
    await this.show(undefined);
  }

  private async show(background: MapBackground | undefined): Promise<void> {
    const d = this.dom;
    this.active?.destroy();
    this.active = undefined;
    d.mapAttribution.hidden = !background;
    d.mapAttribution.textContent = background ? `Background: ${background.attribution}` : "";
    if (!background) {
      await this.map.setProjector(undefined);
      this.status("No background: the map is drawn here without any request.");
      return;
    }
    const host = hostOf(background.template);
    this.status(`Loading tiles from ${host}…`);
    this.active = await TileBackground.create(d.mapTiles, background, {
      onTiles: (loaded, failed) => {
        d.mapTiles.dataset.loaded = String(loaded);
        d.mapTiles.dataset.failed = String(failed);
        if (failed > 0)
          this.status(
            `${failed} tile(s) from ${host} could not be loaded (${loaded} loaded); the routes are drawn anyway. Check the Tile URL template and that the server answers, or press No background.`,
            true,
          );
        else this.status(`Background from ${host}: ${loaded} tile(s) loaded.`);
      },
    });
    await this.map.setProjector(this.active);
  }

  private status(text: string, warning = false): void {
    this.dom.mapBackgroundStatus.textContent = text;
    this.dom.mapBackgroundStatus.className = warning ? "warning" : "muted";
  }
}

function hostOf(template: string): string {
  try {
    return new URL(template.replace(/\{[a-z]\}/g, "0")).host;
  } catch {
    return "the tile server";
  }
}
