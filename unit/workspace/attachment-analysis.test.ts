import { LTTB } from "downsample";
import { describe, expect, it } from "vitest";
import { parseCsvTyped } from "~/checker/csv";
import { analyseSeries } from "~/checker/series";
import { analyseColumns, downsampleXY } from "~/workspace/attachment-analysis";

function noisy(n: number, seed = 11) {
  let s = seed;
  const r = () => (s = (s * 48271) % 2147483647) / 2147483647;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let v = 0;
  for (let i = 0; i < n; i++) {
    v = 0.9 * v + (r() - 0.5);
    x[i] = i * 0.01;
    y[i] = 5 + v + Math.sin(i / 50);
  }
  return { x, y };
}

describe("downsampling for plots (LTTB, Steinarsson 2013)", () => {
  it("picks the same points as the downsample package's LTTB (reference implementation)", () => {
    for (const [n, k] of [[10_000, 600], [1_234, 97], [601, 600], [50_003, 300]] as const) {
      const { x, y } = noisy(n);
      const reference = LTTB(Array.from(x, (xi, i) => [xi, y[i]!] as [number, number]), k) as [number, number][];
      const ours = downsampleXY(x, y, k);
      expect(ours.map((p) => [p.x, p.y])).toEqual(reference.map((p) => [p[0], p[1]]));
    }
  });
  it("keeps every point of a short series", () => {
    const { x, y } = noisy(20);
    expect(downsampleXY(x, y)).toHaveLength(20);
  });
});

describe("the analysis stored at upload", () => {
  it("equals the checker's own analysis of the same columns, with a plot copy of at most 600 points per column", () => {
    const rows = ["t,Re,Nu", ...Array.from({ length: 5000 }, (_, i) => `${i / 100},${80 + Math.sin(i / 7) + 3 * Math.exp(-i / 200)},${2 + Math.cos(i / 11) / 10}`)];
    const cols = parseCsvTyped(rows.join("\n"), "series");
    const { analysis, plot } = analyseColumns("series", cols, 5);
    expect(analysis).toEqual({ kind: "series", batch: 5, stats: analyseSeries(cols, 5) });
    // The same statistics from plain arrays (typed arrays are views, never a different result).
    const plain = Object.fromEntries(Object.entries(cols).map(([k, v]) => [k, Array.from(v)]));
    expect(analyseSeries(plain, 5)).toEqual(analyseSeries(cols, 5));
    expect(plot.columns).toEqual(["Re", "Nu"]);
    expect(plot.points.Re).toHaveLength(600);
    expect(plot.points.Re![0]).toEqual({ x: 0, y: cols.Re![0] });
    expect(plot.points.Re![599]).toEqual({ x: 49.99, y: cols.Re![4999] });
    if (analysis.kind !== "series" || !analysis.stats) throw new Error("expected series statistics");
    // Median step of t = 0, 0.01, …: 0.01; the span is the first and last t.
    expect(analysis.stats.dt).toBeCloseTo(0.01, 12);
    expect([analysis.stats.tStart, analysis.stats.tEnd, analysis.stats.rows]).toEqual([0, 49.99, 5000]);
  });
});
