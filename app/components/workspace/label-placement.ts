/**
 * Labels beside the points of a scatter plot without two of them on top of each other: greedy
 * placement, point by point, trying positions around the marker at growing distances (a leader
 * line joins a label set further out); a label with no free position is hidden and shown on hover.
 * Pure: pixel boxes in, boxes out (unit/workspace/label-placement.test.ts checks no overlap).
 */
export type Box = { x: number; y: number; width: number; height: number };
export type LabelRequest = { id: string; x: number; y: number; width: number; height: number };
export type PlacedLabel = { id: string; anchorX: number; anchorY: number; box: Box | null; leader: boolean };

export const overlap = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

const inside = (a: Box, bounds: Box) => a.x >= bounds.x && a.y >= bounds.y && a.x + a.width <= bounds.x + bounds.width && a.y + a.height <= bounds.y + bounds.height;

/** Directions tried, nearest first: above, right, below, left, then the diagonals. */
const DIRECTIONS: [number, number][] = [[0, -1], [1, 0], [0, 1], [-1, 0], [1, -1], [1, 1], [-1, 1], [-1, -1]];

/** At most this many labels are placed (the rest are hidden): keeps the work bounded whatever the input. */
export const MAX_LABELS = 500;

/**
 * Places each label in order. `marker` is the radius kept free around every point; `rings`
 * the distances tried (in pixels from the marker's edge). Returns one entry per request.
 */
export function placeLabels(requests: LabelRequest[], bounds: Box, opts: { marker?: number; rings?: number[] } = {}): PlacedLabel[] {
  const marker = opts.marker ?? 5;
  const rings = opts.rings ?? [2, 14, 28];
  const markers: Box[] = requests.map((r) => ({ x: r.x - marker, y: r.y - marker, width: 2 * marker, height: 2 * marker }));
  const placed: Box[] = [];
  return requests.map((r, i) => {
    const hidden = { id: r.id, anchorX: r.x, anchorY: r.y, box: null, leader: false };
    if (i >= MAX_LABELS || !(r.width > 0) || !(r.height > 0)) return hidden;
    for (const [ri, gap] of rings.entries()) {
      for (const [dx, dy] of DIRECTIONS) {
        // The label's box next to the marker on the chosen side, `gap` pixels beyond its edge.
        const cx = r.x + dx * (marker + gap + r.width / 2);
        const cy = r.y + dy * (marker + gap + r.height / 2);
        const box = { x: cx - r.width / 2, y: cy - r.height / 2, width: r.width, height: r.height };
        if (!inside(box, bounds)) continue;
        if (placed.some((p) => overlap(p, box))) continue;
        if (markers.some((m) => overlap(m, box))) continue;
        placed.push(box);
        return { id: r.id, anchorX: r.x, anchorY: r.y, box, leader: ri > 0 };
      }
    }
    return hidden;
  });
}
