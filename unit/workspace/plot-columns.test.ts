import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { etagMatches, etagOf, jsonWithEtag } from "~/lib/conditional-get.server";
import { analyseColumns } from "~/workspace/attachment-analysis";
import { decodeClaimOverlay, decodeRunPlots, decodeSeries, decodeSpectrum, encodeClaimOverlay, encodeRunPlots, encodeSeries, encodeSpectrum } from "~/workspace/plot-columns";
import type { SeriesPlot, SpectrumPlot } from "~/workspace/view-types";

/** As the plots travel: encoded on the server, through JSON, decoded in the browser. */
const travel = <T,>(value: T): T => JSON.parse(JSON.stringify(value)) as T;

/** A noisy series of `n` rows and three columns, downsampled as the check job stores it (LTTB, 600 points). */
function storedSeries(n: number): SeriesPlot {
  let s = 7;
  const r = () => (s = (s * 48271) % 2147483647) / 2147483647;
  const t = new Float64Array(n);
  const cols: Record<string, Float64Array> = { Re: new Float64Array(n), Nu: new Float64Array(n), Ekin: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    t[i] = i * 1e-3;
    cols.Re![i] = 80 + Math.sin(i / 70) + r();
    cols.Nu![i] = 2 + r() / 10;
    cols.Ekin![i] = 1e5 * (1 + r());
  }
  const { plot } = analyseColumns("series", { t, ...cols }, 5);
  return { ...plot, tStart: 0, windowStart: 0.1, tEnd: (n - 1) * 1e-3, rows: n, stats: { Re: { mean: 80.5, stderr: 0.01, tauInt: 3.2, effectiveSamples: 120, transientEnd: 0.1 } } };
}

// What a stored copy can hold: finite numbers, and no -0 (JSON, and PostgreSQL's jsonb, write it as 0).
const finite = fc.double({ noNaN: true, noDefaultInfinity: true }).map((v) => (Object.is(v, -0) ? 0 : v));
const point = fc.record({ x: finite, y: finite });

describe("plot copies sent column-wise (encode on the server, decode in the browser)", () => {
  it("gives back the stored series exactly, through JSON, for a long series whose columns keep different rows", () => {
    const plot = storedSeries(20_000);
    const sent = travel(encodeSeries(plot));
    // LTTB keeps different rows per column, so each column carries its own times.
    expect(Array.isArray(sent.x)).toBe(false);
    expect(sent.y.Re).toHaveLength(600);
    expect(decodeSeries(sent)).toEqual(plot);
  });

  it("sends the times once when every column has the same (a short file kept whole), and still gives back every point", () => {
    const plot = storedSeries(300);
    const sent = travel(encodeSeries(plot));
    expect(sent.x).toEqual(plot.points.Re!.map((p) => p.x));
    expect(decodeSeries(sent)).toEqual(plot);
  });

  it("does not share times that differ in a single point", () => {
    const plot = storedSeries(300);
    plot.points.Nu![150] = { ...plot.points.Nu![150]!, x: plot.points.Nu![150]!.x + 1e-9 };
    const sent = travel(encodeSeries(plot));
    expect(Array.isArray(sent.x)).toBe(false);
    expect(decodeSeries(sent)).toEqual(plot);
  });

  it("round-trips any series of finite numbers (generated)", () => {
    fc.assert(
      fc.property(fc.dictionary(fc.stringMatching(/^[A-Za-z][A-Za-z0-9_]{0,7}$/), fc.array(point, { maxLength: 40 }), { minKeys: 1, maxKeys: 4 }), (points) => {
        const plot: SeriesPlot = { columns: Object.keys(points), points, tStart: 0, windowStart: 1, tEnd: 2, rows: 99 };
        expect(decodeSeries(travel(encodeSeries(plot)))).toEqual(plot);
      }),
      { numRuns: 200 },
    );
  });

  it("gives back a spectrum exactly: the degrees once, a list of energies per column", () => {
    const columns = ["kinetic", "magnetic"];
    const plot: SpectrumPlot = { columns, truncationDegree: 40, points: Array.from({ length: 41 }, (_, l) => ({ l, kinetic: 1 / (l + 1) ** 2, magnetic: Math.exp(-l / 7) })) };
    const sent = travel(encodeSpectrum(plot));
    expect(sent.l).toEqual(plot.points.map((p) => p.l));
    expect(sent.y.magnetic).toHaveLength(41);
    expect(decodeSpectrum(sent)).toEqual(plot);
    expect(decodeRunPlots(travel(encodeRunPlots({ series: null, spectrum: plot, analysing: true })))).toEqual({ series: null, spectrum: plot, analysing: true });
  });

  it("gives back a claim's overlay exactly: each run's series with its label, in order", () => {
    const overlay = { runs: [{ label: "ref-A", plot: storedSeries(20_000) }, { label: "strat-B", plot: storedSeries(300) }], analysing: false };
    const sent = travel(encodeClaimOverlay(overlay));
    expect(sent.runs.map((r) => r.label)).toEqual(["ref-A", "strat-B"]);
    expect(JSON.stringify(sent)).not.toContain('"points"');
    expect(decodeClaimOverlay(sent)).toEqual(overlay);
    expect(decodeClaimOverlay(travel(encodeClaimOverlay({ runs: [], analysing: true })))).toEqual({ runs: [], analysing: true });
  });

  it("is far smaller than one object per point (the reason for it)", () => {
    const plot = storedSeries(200_000);
    const objects = JSON.stringify(plot).length;
    const compact = JSON.stringify(encodeSeries(plot)).length;
    // Two keys and braces per point against two commas: measured 0.73 here (three columns of 600 points); 0.8 is the bound.
    expect(compact / objects).toBeLessThan(0.8);
  });
});

describe("entity tags of the plots route (RFC 9110 §8.8.3, §13.1.2)", () => {
  const tag = etagOf('{"series":null}');
  it("match by weak comparison, in a list, and for *; not for another tag or none", () => {
    const opaque = tag.slice(2);
    expect(tag.startsWith('W/"')).toBe(true);
    // RFC 9110 §8.8.3.2: W/"1" and "1" match under weak comparison.
    expect(etagMatches(tag, tag)).toBe(true);
    expect(etagMatches(opaque, tag)).toBe(true);
    expect(etagMatches(`"xyzzy", ${tag}`, tag)).toBe(true);
    expect(etagMatches("*", tag)).toBe(true);
    expect(etagMatches('"xyzzy", W/"r2d2xxxx"', tag)).toBe(false);
    expect(etagMatches(null, tag)).toBe(false);
    expect(etagOf('{"series":null,"analysing":true}')).not.toBe(tag);
  });

  it("answer 304 with no body to a browser holding the same plots, 200 with them otherwise", async () => {
    const value = encodeRunPlots({ series: storedSeries(1000), spectrum: null, analysing: false });
    const first = jsonWithEtag(new Request("http://x/plots"), value);
    expect(first.status).toBe(200);
    expect(first.headers.get("cache-control")).toBe("private, no-cache");
    expect(decodeSeries((await first.json()).series)).toEqual(storedSeries(1000));
    const again = jsonWithEtag(new Request("http://x/plots", { headers: { "if-none-match": first.headers.get("etag")! } }), value);
    expect(again.status).toBe(304);
    expect(await again.text()).toBe("");
    const changed = jsonWithEtag(new Request("http://x/plots", { headers: { "if-none-match": first.headers.get("etag")! } }), { ...value, analysing: true });
    expect(changed.status).toBe(200);
  });
});
