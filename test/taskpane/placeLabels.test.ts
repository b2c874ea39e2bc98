/**
 * Greedy label placement: whatever the anchors, placed labels never overlap each other or an
 * obstacle and stay inside the map. The overlap check here is written independently of
 * `overlaps` (interval arithmetic on the box edges), and fast-check draws the crowded cases.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { overlaps, placeLabels, type Box } from "../../src/taskpane/placeLabels.js";

/** Area shared by two boxes (0 when they only touch). */
function sharedArea(a: Box, b: Box): number {
  const w = Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y);
  return w > 0 && h > 0 ? w * h : 0;
}

describe("placeLabels", () => {
  it("puts a lone label at the first candidate: upper right of its anchor, one gap away (hand-worked)", () => {
    expect(placeLabels([{ x: 50, y: 50, w: 20, h: 10 }], { width: 100, height: 100 })).toEqual([{ x: 56, y: 39, w: 20, h: 10 }]);
  });

  it("moves a label off an obstacle and off an earlier label", () => {
    const obstacle = { x: 56, y: 39, w: 20, h: 10 };
    const [a, b] = placeLabels(
      [
        { x: 50, y: 50, w: 20, h: 10 },
        { x: 50, y: 50, w: 20, h: 10 },
      ],
      { width: 200, height: 200, obstacles: [obstacle] },
    );
    expect(a).toBeDefined();
    expect(b).toBeDefined();
    expect(sharedArea(a!, obstacle)).toBe(0);
    expect(sharedArea(b!, obstacle)).toBe(0);
    expect(sharedArea(a!, b!)).toBe(0);
  });

  it("flips a label left near the right edge", () => {
    const [box] = placeLabels([{ x: 95, y: 50, w: 30, h: 10 }], { width: 100, height: 100 });
    expect(box!.x + box!.w).toBeLessThanOrEqual(95);
  });

  it("leaves a label out when there is no free place, never on top of another", () => {
    const out = placeLabels(
      Array.from({ length: 40 }, () => ({ x: 20, y: 10, w: 30, h: 16 })),
      { width: 60, height: 30 },
    );
    expect(out.filter((b) => b === undefined).length).toBeGreaterThan(0);
  });

  it("never overlaps placed labels or obstacles and keeps them inside the map (property)", () => {
    const point = fc.record({ x: fc.integer({ min: 0, max: 350 }), y: fc.integer({ min: 0, max: 260 }) });
    fc.assert(
      fc.property(
        fc.array(fc.record({ p: point, w: fc.integer({ min: 10, max: 90 }) }), { minLength: 1, maxLength: 30 }),
        fc.array(point, { maxLength: 6 }),
        (labels, depots) => {
          const obstacles = depots.map((d) => ({ x: d.x - 6, y: d.y - 6, w: 12, h: 12 }));
          const boxes = placeLabels(
            labels.map((l) => ({ ...l.p, w: l.w, h: 16 })),
            { width: 350, height: 260, obstacles },
          );
          const placed = boxes.filter((b): b is Box => b !== undefined);
          for (const b of placed) {
            expect(b.x).toBeGreaterThanOrEqual(0);
            expect(b.y).toBeGreaterThanOrEqual(0);
            expect(b.x + b.w).toBeLessThanOrEqual(350);
            expect(b.y + b.h).toBeLessThanOrEqual(260);
            for (const o of obstacles) expect(sharedArea(b, o)).toBe(0);
          }
          for (let i = 0; i < placed.length; i++)
            for (let j = i + 1; j < placed.length; j++) expect(sharedArea(placed[i]!, placed[j]!)).toBe(0);
          boxes.forEach((b, i) => b && expect(b.w).toBe(labels[i]!.w));
        },
      ),
      { numRuns: 300 },
    );
  });

  it("overlaps agrees with the shared area on touching and crossing boxes", () => {
    const a = { x: 0, y: 0, w: 10, h: 10 };
    expect(overlaps(a, { x: 10, y: 0, w: 5, h: 5 })).toBe(false);
    expect(overlaps(a, { x: 9, y: 9, w: 5, h: 5 })).toBe(true);
    expect(overlaps(a, { x: 2, y: 2, w: 2, h: 2 })).toBe(true);
  });

  it("rejects an empty map", () => {
    expect(() => placeLabels([], { width: 0, height: 10 })).toThrow(RangeError);
  });
});
