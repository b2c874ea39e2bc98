/**
 * Draws the add-in's icons (a kiln dome under a three-stop route) as PNG files in
 * `assets/` at 16, 32, 64, 80 and 128 px. Run with `npx tsx scripts/drawIcons.ts`.
 *
 * The PNG encoder is the minimal one of the PNG specification (W3C, 2nd ed., 2003):
 * signature, IHDR (8-bit RGBA, colour type 6), one zlib-deflated IDAT with filter
 * byte 0 on every scanline, IEND; each chunk carries a CRC-32 (ISO 3309 polynomial).
 * Shapes are drawn as signed distances and supersampled 4x4 per pixel for smooth edges.
 */
import { writeFileSync, mkdirSync } from "node:fs";
import { deflateSync } from "node:zlib";
import { fileURLToPath } from "node:url";

/** Icon sizes in pixels: 16/32/80 for the ribbon, 32/64 for the manifest, 128 for the page. */
export const ICON_SIZES_PX = [16, 32, 64, 80, 128] as const;

type Rgba = readonly [number, number, number, number];

// Our own palette: deep slate ground, ember orange kiln, cream route.
const SLATE: Rgba = [31, 58, 77, 255];
const EMBER: Rgba = [217, 101, 43, 255];
const MOUTH: Rgba = [70, 32, 20, 255];
const CREAM: Rgba = [246, 231, 193, 255];
const CLEAR: Rgba = [0, 0, 0, 0];

const ROUTE: readonly (readonly [number, number])[] = [
  [0.2, 0.36],
  [0.42, 0.18],
  [0.62, 0.34],
  [0.82, 0.17],
];

/**
 * Colour of the icon at a point of the unit square (y grows downwards).
 * @param x - horizontal position, 0..1
 * @param y - vertical position, 0..1
 * @returns the RGBA colour of the topmost shape there
 */
export function iconColourAt(x: number, y: number): Rgba {
  const dot = Math.min(...ROUTE.map(([px, py]) => Math.hypot(x - px, y - py)));
  if (dot < 0.075) return dot < 0.035 ? SLATE : CREAM;
  let line = Infinity;
  for (let i = 1; i < ROUTE.length; i++) {
    const a = ROUTE[i - 1]!;
    const b = ROUTE[i]!;
    line = Math.min(line, segmentDistance(x, y, a[0], a[1], b[0], b[1]));
  }
  if (line < 0.03) return CREAM;
  // Kiln: a dome (half disc) on a short base, with an arched mouth.
  const inDome = Math.hypot(x - 0.5, y - 0.68) < 0.3 && y <= 0.68;
  const inBase = x >= 0.2 && x <= 0.8 && y > 0.68 && y <= 0.86;
  const inMouth = (Math.hypot(x - 0.5, y - 0.74) < 0.11 && y <= 0.74) || (Math.abs(x - 0.5) < 0.11 && y > 0.74 && y <= 0.86);
  if (inMouth) return MOUTH;
  if (inDome || inBase) return EMBER;
  return roundedSquare(x, y, 0.18) ? SLATE : CLEAR;
}

/**
 * Renders the icon as straight (non-premultiplied) RGBA bytes, row by row.
 * @param sizePx - width and height in pixels (positive integer)
 * @returns `sizePx * sizePx * 4` bytes
 * @throws RangeError when `sizePx` is not a positive integer
 * @example renderIcon(16).length // 1024
 */
export function renderIcon(sizePx: number): Uint8Array {
  if (!Number.isInteger(sizePx) || sizePx <= 0) throw new RangeError(`sizePx must be a positive integer, got ${sizePx}`);
  const samples = 4;
  const out = new Uint8Array(sizePx * sizePx * 4);
  for (let py = 0; py < sizePx; py++) {
    for (let px = 0; px < sizePx; px++) {
      let r = 0,
        g = 0,
        b = 0,
        a = 0;
      for (let sy = 0; sy < samples; sy++) {
        for (let sx = 0; sx < samples; sx++) {
          const c = iconColourAt((px + (sx + 0.5) / samples) / sizePx, (py + (sy + 0.5) / samples) / sizePx);
          const alpha = c[3] / 255;
          r += c[0] * alpha;
          g += c[1] * alpha;
          b += c[2] * alpha;
          a += alpha;
        }
      }
      const o = (py * sizePx + px) * 4;
      const n = samples * samples;
      out[o] = a > 0 ? Math.round(r / a) : 0;
      out[o + 1] = a > 0 ? Math.round(g / a) : 0;
      out[o + 2] = a > 0 ? Math.round(b / a) : 0;
      out[o + 3] = Math.round((a / n) * 255);
    }
  }
  return out;
}

/**
 * Encodes RGBA pixels as a PNG file (PNG specification, W3C 2003).
 * @param widthPx - image width in pixels
 * @param heightPx - image height in pixels
 * @param rgba - `widthPx * heightPx * 4` bytes, rows top to bottom
 * @returns the PNG file bytes
 * @throws RangeError when `rgba` has the wrong length
 * @example encodePng(1, 1, new Uint8Array([255, 0, 0, 255])) // a one-pixel red PNG
 */
export function encodePng(widthPx: number, heightPx: number, rgba: Uint8Array): Uint8Array {
  if (rgba.length !== widthPx * heightPx * 4) throw new RangeError(`rgba must hold ${widthPx * heightPx * 4} bytes, got ${rgba.length}`);
  const raw = new Uint8Array((widthPx * 4 + 1) * heightPx);
  for (let y = 0; y < heightPx; y++) {
    raw[y * (widthPx * 4 + 1)] = 0; // filter type None
    raw.set(rgba.subarray(y * widthPx * 4, (y + 1) * widthPx * 4), y * (widthPx * 4 + 1) + 1);
  }
  const ihdr = new Uint8Array(13);
  const view = new DataView(ihdr.buffer);
  view.setUint32(0, widthPx);
  view.setUint32(4, heightPx);
  ihdr.set([8, 6, 0, 0, 0], 8); // bit depth 8, colour type RGBA, deflate, adaptive filtering, no interlace
  const signature = new Uint8Array([137, 80, 78, 71, 13, 10, 26, 10]);
  return concat([signature, chunk("IHDR", ihdr), chunk("IDAT", new Uint8Array(deflateSync(raw))), chunk("IEND", new Uint8Array(0))]);
}

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const view = new DataView(out.buffer);
  view.setUint32(0, data.length);
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i);
  out.set(data, 8);
  view.setUint32(8 + data.length, crc32(out.subarray(4, 8 + data.length)));
  return out;
}

const CRC_TABLE = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const byte of bytes) c = CRC_TABLE[(c ^ byte) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function concat(parts: readonly Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

function segmentDistance(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax,
    dy = by - ay;
  const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)));
  return Math.hypot(x - (ax + t * dx), y - (ay + t * dy));
}

function roundedSquare(x: number, y: number, radius: number): boolean {
  const cx = Math.min(Math.max(x, radius), 1 - radius);
  const cy = Math.min(Math.max(y, radius), 1 - radius);
  return Math.hypot(x - cx, y - cy) <= radius;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const dir = fileURLToPath(new URL("../assets/", import.meta.url));
  mkdirSync(dir, { recursive: true });
  for (const size of ICON_SIZES_PX) {
    writeFileSync(`${dir}icon-${size}.png`, encodePng(size, size, renderIcon(size)));
    console.log(`assets/icon-${size}.png (${size}x${size})`);
  }
}
