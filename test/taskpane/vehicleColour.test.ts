/**
 * The route palette against its published source and against an independent simulation of
 * colour-vision deficiency: every pair of route colours must stay clearly apart for protan,
 * deutan and tritan viewers.
 */
import { describe, expect, it } from "vitest";
import { ROUTE_PALETTE, vehicleColour, vehicleStyle } from "../../src/taskpane/vehicleColour.js";

// Okabe & Ito (2008), "Color Universal Design", the eight colours as 0-255 sRGB triples (from memory).
const OKABE_ITO: Record<string, [number, number, number]> = {
  black: [0, 0, 0],
  orange: [230, 159, 0],
  "sky blue": [86, 180, 233],
  "bluish green": [0, 158, 115],
  yellow: [240, 228, 66],
  blue: [0, 114, 178],
  vermillion: [213, 94, 0],
  "reddish purple": [204, 121, 167],
};

// Machado, Oliveira & Fernandes (2009), "A physiologically-based model for simulation of color
// vision deficiency", matrices for severity 1.0, applied to linear RGB (from memory).
const CVD: Record<string, number[][]> = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

/** IEC 61966-2-1 sRGB decoding to linear light. */
function linear(c: number): number {
  const v = c / 255;
  return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
}

/** CIE 1976 L*a*b* (D65) of linear sRGB, through the sRGB -> XYZ matrix of IEC 61966-2-1. */
function lab([r, g, b]: number[]): [number, number, number] {
  const x = (0.4124564 * r! + 0.3575761 * g! + 0.1804375 * b!) / 0.95047;
  const y = 0.2126729 * r! + 0.7151522 * g! + 0.072175 * b!;
  const z = (0.0193339 * r! + 0.119192 * g! + 0.9503041 * b!) / 1.08883;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}

function rgbOf(hex: string): [number, number, number] {
  return [1, 3, 5].map((i) => Number.parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];
}

describe("route palette", () => {
  it("is the eight Okabe & Ito colours, each with its published sRGB value", () => {
    expect(ROUTE_PALETTE.map((c) => c.name).sort()).toEqual(Object.keys(OKABE_ITO).sort());
    for (const c of ROUTE_PALETTE) expect(rgbOf(c.hex)).toEqual(OKABE_ITO[c.name]);
  });

  it.each(Object.keys(CVD))("keeps every pair of route colours apart under simulated %s (CIE76 ΔE ≥ 10)", (kind) => {
    const m = CVD[kind]!;
    const simulated = ROUTE_PALETTE.map((c) => {
      const rgb = rgbOf(c.hex).map(linear);
      return lab(m.map((row) => Math.min(1, Math.max(0, row[0]! * rgb[0]! + row[1]! * rgb[1]! + row[2]! * rgb[2]!))));
    });
    // 10 is several times the just-noticeable difference of about 2.3 (Sharma 2003, from memory).
    for (let i = 0; i < simulated.length; i++)
      for (let j = i + 1; j < simulated.length; j++) {
        const d = Math.hypot(...simulated[i]!.map((v, k) => v - simulated[j]![k]!));
        expect(d, `${ROUTE_PALETTE[i]!.name} vs ${ROUTE_PALETTE[j]!.name}`).toBeGreaterThanOrEqual(10);
      }
  });

  it("gives the first 32 routes 32 different colour and dash pairs; colour repeats only with a new dash", () => {
    const seen = new Set<string>();
    for (let i = 0; i < 32; i++) {
      const s = vehicleStyle(i);
      seen.add(`${s.colour}|${s.dash.join(",")}`);
      expect(vehicleColour(i)).toBe(s.colour);
    }
    expect(seen.size).toBe(32);
    expect(vehicleStyle(8).colour).toBe(vehicleStyle(0).colour);
    expect(vehicleStyle(8).dash).not.toEqual(vehicleStyle(0).dash);
  });

  it("rejects a negative or fractional index", () => {
    expect(() => vehicleStyle(-1)).toThrow(RangeError);
    expect(() => vehicleStyle(1.5)).toThrow(RangeError);
  });
});
