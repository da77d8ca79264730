import { sig4 } from "~/lib/sig-figs";
import type { SeriesPlot } from "~/workspace/view-types";

type Stats = NonNullable<SeriesPlot["stats"]>;

/** The columns of derived.series: symbol, words, and the definition shown on hover. */
export const SERIES_STAT_COLUMNS = [
  { key: "mean", symbol: "⟨x⟩", name: "mean", definition: "Mean of the column after the initial transient" },
  { key: "stderr", symbol: "σ⟨x⟩", name: "standard error", definition: "Batch-means standard error of that mean" },
  { key: "tauInt", symbol: "τ_int", name: "autocorrelation time (samples)", definition: "Integrated autocorrelation time 1 + 2 Σ ρ_k, in samples" },
  { key: "effectiveSamples", symbol: "N_eff", name: "effective samples", definition: "Samples after the transient divided by τ_int (τ_int = 1 + 2 Σ ρ_k, Sokal’s windowed estimate)" },
  { key: "transientEnd", symbol: "t_trans", name: "end of transient", definition: "End of the initial transient found by the Marginal Standard Error Rule (MSER-5, White 1997), in the run's time unit" },
  { key: "z", symbol: "z", name: "two-halves z score", definition: "Difference of the means of the two halves in units of their standard errors (Geweke-style); |z| > 3 suggests the run is not yet statistically steady" },
] as const;

/** derived.series as a table: one row per column, each statistic with its symbol, words on hover, 4 significant figures. */
export function SeriesStatsTable({ stats }: { stats: Stats }) {
  return (
    <table className="mt-2 w-full text-left text-caption" data-testid="series-stats" aria-label="Statistics of each series column after the transient">
      <thead>
        <tr className="border-b border-rule">
          <th scope="col" className="pr-2">column</th>
          {SERIES_STAT_COLUMNS.map((c) => (
            <th key={c.key} scope="col" className="pr-2 font-semibold">
              <abbr title={c.definition} className="cursor-help">{c.symbol}</abbr>
              <span className="block font-normal text-basalt-soft">{c.name}</span>
            </th>
          ))}
        </tr>
      </thead>
      <tbody className="font-mono">
        {Object.entries(stats).map(([column, s]) => (
          <tr key={column} className="border-b border-rule">
            <th scope="row" className="pr-2 text-left font-normal">{column}</th>
            {SERIES_STAT_COLUMNS.map((c) => {
              const v = s[c.key as keyof typeof s];
              return <td key={c.key} className="pr-2">{typeof v === "number" && Number.isFinite(v) ? sig4(v) : "—"}</td>;
            })}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
