/**
 * The geocoding options of `kiln geocode` and `kiln plan`, declared once with their help, and
 * their parsing into a `GeocoderSetup`. Nothing is preset: without `--geocoder` no address is sent
 * anywhere.
 */
import { Option, type Command } from "commander";
import { checkGeocoderTemplate, parseHeaderLine, type GeocodeProgress } from "../geocode/index.js";
import type { GeocoderSetup } from "../workbook/geocodeWorkbook.js";
import type { CliIO } from "./CliIO.js";

/** The geocoding options as commander gives them. */
export interface GeocodeOptionValues {
  readonly geocoder?: string;
  readonly rate?: string;
  readonly header?: readonly string[];
  readonly again?: boolean;
}

/**
 * Declare `--geocoder`, `--rate`, `--header` (repeatable) and `--again` on a command.
 *
 * @param cmd - a commander command
 * @param required - whether `--geocoder` must be given (`kiln geocode`)
 * @returns the command, for chaining
 * @example addGeocodeOptions(program.command("geocode"), true)
 */
export function addGeocodeOptions(cmd: Command, required = false): Command {
  const geocoder = new Option(
    "--geocoder <URL_TEMPLATE>",
    "geocoding service of your choice: a URL with {address} where the address goes, answering GeoJSON (the addresses are sent there)",
  );
  if (required) geocoder.makeOptionMandatory();
  cmd.addOption(geocoder);
  cmd.addOption(new Option("--rate <PER_SECOND>", "geocoding requests per second at most (default 1)"));
  cmd.addOption(
    new Option(
      '--header <"NAME: VALUE">',
      "extra request header for the geocoder, such as an API key (repeatable; never stored)",
    ).argParser((v: string, prev: string[] | undefined) => [...(prev ?? []), v]),
  );
  cmd.addOption(new Option("--again", "look every address up again, ignoring the answers kept in the workbook"));
  return cmd;
}

/**
 * The geocoder setup from the options, or every mistake at once.
 *
 * @param v - the option values
 * @param io - for the progress line on stderr (a terminal only)
 * @returns `undefined` without `--geocoder`, the setup, or the errors
 * @example geocoderSetup({ geocoder: "https://g.example/s?q={address}", rate: "2" }, io) // => { setup: { template, ratePerSecond: 2, ... } }
 */
export function geocoderSetup(v: GeocodeOptionValues, io: CliIO): { setup?: GeocoderSetup; errors: string[] } {
  const errors: string[] = [];
  if (v.geocoder === undefined) {
    for (const [given, flag] of [
      [v.rate, "--rate"],
      [v.header, "--header"],
      [v.again, "--again"],
    ] as const)
      if (given !== undefined) errors.push(`${flag}: applies only with --geocoder URL_TEMPLATE; add it or leave ${flag} out`);
    return { errors };
  }
  const problem = checkGeocoderTemplate(v.geocoder);
  if (problem !== undefined) errors.push(`--geocoder: ${problem}`);
  let ratePerSecond = 1;
  if (v.rate !== undefined) {
    ratePerSecond = Number(v.rate);
    if (!(ratePerSecond > 0 && ratePerSecond <= 50)) {
      errors.push(
        `--rate: "${v.rate}" is not valid; type requests per second above 0 and up to 50, such as 1 (check the service's usage policy)`,
      );
    }
  }
  const headers: Record<string, string> = {};
  for (const line of v.header ?? []) {
    const h = parseHeaderLine(line);
    if ("message" in h) errors.push(`--header: ${h.message}`);
    else headers[h.name] = h.value;
  }
  if (errors.length > 0) return { errors };
  return {
    setup: { template: v.geocoder.trim(), headers, ratePerSecond, again: v.again === true, onProgress: geocodeProgressLine(io) },
    errors,
  };
}

/**
 * A one-line geocoding progress on stderr (terminal only), like the run's progress bar.
 *
 * @param io - the CLI's streams
 * @returns the progress callback
 * @example geocodeProgressLine(io)({ done: 3, total: 10, requests: 3, secondsLeft: 7 }) // "\rGeocoding [#######-----------------]   3/10  about 7 s left"
 */
export function geocodeProgressLine(io: CliIO, width = 24): (p: GeocodeProgress) => void {
  if (!io.isTTY) return () => undefined;
  return (p) => {
    const f = p.total === 0 ? 1 : p.done / p.total;
    const filled = Math.round(f * width);
    const line = `Geocoding [${"#".repeat(filled)}${"-".repeat(width - filled)}] ${String(p.done).padStart(String(p.total).length)}/${p.total}  about ${Math.ceil(p.secondsLeft)} s left`;
    io.stderr(p.done === p.total ? `\r\x1b[2K` : `\r${line}`);
  };
}
