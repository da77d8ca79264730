/** The run page's series statistics table shows derived.series as the checker computes it, to 4 significant figures. */
import { createElement } from "react";
import { renderToString } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { check } from "~/checker";
import { SeriesChart } from "~/components/workspace/plots";
import { ar1, baseRun, times } from "../checker/helpers";

describe("series statistics on the run page", () => {
  it("lists every column with mean, standard error, τ_int, effective samples, transient end and z", () => {
    const n = 2000;
    const Re = ar1(n, 0.5, 9).map((x) => 100 + x);
    const stats = check({ runs: [baseRun()], series: { "ref-A": { t: times(n, 0, 20), Re } } }).runs[0]!.derived.series!;
    const html = renderToString(createElement(SeriesChart, { title: "Time series", plot: { columns: ["Re"], points: { Re: [] }, tStart: 0, windowStart: 0, tEnd: 20, rows: n, stats } }));
    expect(html).toContain('data-testid="series-stats"');
    expect(html).toContain(`<td>${Number(stats.Re!.mean.toPrecision(4))}</td>`);
    expect(html).toContain(`<td>${Number(stats.Re!.tauInt.toPrecision(4))}</td>`);
  });
});
