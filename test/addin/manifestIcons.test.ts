/**
 * The committed icons are what scripts/drawIcons.ts draws, and its PNG writer follows the
 * PNG specification (W3C, 2nd ed. 2003): signature, IHDR first (8-bit RGBA = colour type 6),
 * IDAT, IEND, every chunk's CRC-32 as computed by Node's zlib (reference implementation),
 * and scanlines that zlib inflates back to the drawn pixels.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { crc32, inflateSync } from "node:zlib";
import { fileURLToPath } from "node:url";
import { ICON_SIZES_PX, encodePng, renderIcon } from "../../scripts/drawIcons.js";

const ASSETS = fileURLToPath(new URL("../../assets/", import.meta.url));

function chunks(png: Uint8Array): { type: string; data: Uint8Array; crc: number }[] {
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const out: { type: string; data: Uint8Array; crc: number }[] = [];
  for (let at = 8; at < png.length;) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(...png.subarray(at + 4, at + 8));
    out.push({ type, data: png.subarray(at + 8, at + 8 + length), crc: view.getUint32(at + 8 + length) });
    expect(crc32(png.subarray(at + 4, at + 8 + length))).toBe(view.getUint32(at + 8 + length));
    at += 12 + length;
  }
  return out;
}

function pixels(png: Uint8Array, size: number): Uint8Array {
  const raw = inflateSync(
    Buffer.concat(
      chunks(png)
        .filter((c) => c.type === "IDAT")
        .map((c) => c.data),
    ),
  );
  const out = new Uint8Array(size * size * 4);
  for (let y = 0; y < size; y++) {
    expect(raw[y * (size * 4 + 1)]).toBe(0); // filter type None
    out.set(raw.subarray(y * (size * 4 + 1) + 1, (y + 1) * (size * 4 + 1)), y * size * 4);
  }
  return out;
}

describe("icons in assets/ (PNG specification, W3C 2003; CRC-32 by node:zlib)", () => {
  for (const size of ICON_SIZES_PX) {
    it(`icon-${size}.png is a valid ${size}x${size} RGBA PNG holding exactly the drawn pixels`, () => {
      const png = new Uint8Array(readFileSync(`${ASSETS}icon-${size}.png`));
      expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
      const list = chunks(png);
      expect(list.map((c) => c.type)).toEqual(["IHDR", "IDAT", "IEND"]);
      const ihdr = new DataView(list[0]!.data.buffer, list[0]!.data.byteOffset, 13);
      expect([ihdr.getUint32(0), ihdr.getUint32(4), ihdr.getUint8(8), ihdr.getUint8(9)]).toEqual([size, size, 8, 6]);
      expect(pixels(png, size)).toEqual(renderIcon(size));
    });
  }

  it("leaves the corners outside the rounded square transparent and the middle opaque", () => {
    const icon = renderIcon(64);
    expect([...icon.subarray(0, 4)]).toEqual([0, 0, 0, 0]); // the very corner lies outside the rounding
    const centre = (32 * 64 + 32) * 4;
    expect(icon[centre + 3]).toBe(255);
  });

  it("encodePng rejects pixel data of the wrong length", () => {
    expect(() => encodePng(2, 2, new Uint8Array(15))).toThrow(RangeError);
  });
});
