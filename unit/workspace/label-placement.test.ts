/**
 * Labels of the parameter-space chart: whatever the points, no two placed label boxes overlap,
 * none covers a marker, and every placed box stays inside the plot (property test, fast-check).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { overlap, placeLabels, type LabelRequest } from "~/components/workspace/label-placement";

const bounds = { x: 0, y: 0, width: 600, height: 300 };
const request = fc.record({
  x: fc.double({ min: 0, max: 600, noNaN: true }),
  y: fc.double({ min: 0, max: 300, noNaN: true }),
  width: fc.integer({ min: 10, max: 120 }),
  height: fc.integer({ min: 8, max: 20 }),
});

describe("label placement", () => {
  it("never places two labels on top of each other, nor on a marker, nor outside the plot", () => {
    fc.assert(
      fc.property(fc.array(request, { maxLength: 60 }), (raw) => {
        const reqs: LabelRequest[] = raw.map((r, i) => ({ id: String(i), ...r }));
        const out = placeLabels(reqs, bounds, { marker: 5 });
        expect(out).toHaveLength(reqs.length);
        const boxes = out.flatMap((o) => (o.box ? [o.box] : []));
        for (let i = 0; i < boxes.length; i++) {
          const b = boxes[i]!;
          expect(b.x).toBeGreaterThanOrEqual(bounds.x);
          expect(b.y).toBeGreaterThanOrEqual(bounds.y);
          expect(b.x + b.width).toBeLessThanOrEqual(bounds.x + bounds.width);
          expect(b.y + b.height).toBeLessThanOrEqual(bounds.y + bounds.height);
          for (let j = i + 1; j < boxes.length; j++) expect(overlap(b, boxes[j]!), `labels ${i} and ${j}`).toBe(false);
          for (const r of reqs) expect(overlap(b, { x: r.x - 5, y: r.y - 5, width: 10, height: 10 })).toBe(false);
        }
      }),
      { numRuns: 300 },
    );
  });

  it("places every label of well-separated points, next to its point without a leader", () => {
    const reqs = [0, 1, 2, 3].map((i) => ({ id: String(i), x: 80 + i * 140, y: 150, width: 50, height: 14 }));
    const out = placeLabels(reqs, bounds);
    expect(out.every((o) => o.box && !o.leader)).toBe(true);
  });

  it("moves the labels of runs at nearly the same point apart (leader lines) or hides them, never stacks them", () => {
    // Five runs within two pixels of each other: the stacking the old chart showed.
    const reqs = [0, 1, 2, 3, 4].map((i) => ({ id: String(i), x: 300 + i * 0.5, y: 150 + i * 0.3, width: 60, height: 14 }));
    const out = placeLabels(reqs, bounds);
    const placed = out.filter((o) => o.box);
    expect(placed.length).toBeGreaterThanOrEqual(4);
    expect(out.some((o) => o.leader)).toBe(true);
  });
});
