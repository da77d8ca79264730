/** The run page's series statistics table (derived panel) shows derived.series as the checker computes it, to 4 significant figures. */
import { createElement } from "react";
import { renderToString } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { check } from "~/checker";
import { SeriesStatsTable } from "~/components/workspace/series-stats";
import { sig4 } from "~/lib/sig-figs";
import { ar1, baseRun, times } from "../checker/helpers";

describe("series statistics on the run page", () => {
  it("lists every column with mean, standard error, τ_int, effective samples, transient end and z", () => {
    const n = 2000;
    const Re = ar1(n, 0.5, 9).map((x) => 100 + x);
    const stats = check({ runs: [baseRun()], series: { "ref-A": { t: times(n, 0, 20), Re } } }).runs[0]!.derived.series!;
    const html = renderToString(createElement(SeriesStatsTable, { stats }));
    expect(html).toContain('data-testid="series-stats"');
    const cell = (v: number) => `<td class="pr-2">${sig4(v)}</td>`;
    expect(html).toContain(cell(stats.Re!.mean));
    expect(html).toContain(cell(stats.Re!.tauInt));
    expect(html).toContain(cell(stats.Re!.effectiveSamples));
    // Symbols with their definitions on hover.
    expect(html).toContain('<abbr title="Integrated autocorrelation time');
    expect(html).toContain(">τ_int</abbr>");
  });
});
