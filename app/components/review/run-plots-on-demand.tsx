import { useFetcher } from "react-router";
import { SeriesChart, SpectrumChart } from "~/components/workspace/lazy-plots";
import type { SeriesPlot, SpectrumPlot } from "~/workspace/view-types";

type RunPageData = { plots?: { series: SeriesPlot | null; spectrum: SpectrumPlot | null; analysing?: boolean } };

/**
 * One run's plots, loaded when asked for (from the run page's own loader, so the same access
 * rules apply): a round of sixty runs does not send sixty plot copies with the reviewer's page.
 */
export function RunPlotsOnDemand({ label, runHref, kinds }: { label: string; runHref: string; kinds: string }) {
  const fetcher = useFetcher<RunPageData>();
  const plots = fetcher.data?.plots;
  return (
    <li className="py-2" data-testid="run-plots">
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-mono font-semibold">{label}</span>
        <span className="text-caption text-basalt-soft">{kinds}</span>
        {plots ? null : (
          <button type="button" className="btn-quiet" disabled={fetcher.state !== "idle"} onClick={() => fetcher.load(runHref)}>
            {fetcher.state !== "idle" ? "Loading the plots…" : `Show the plots of ${label}`}
          </button>
        )}
      </div>
      {plots ? (
        <div className="mt-2">
          {plots.analysing ? <p className="text-caption">The attached files are still being analysed; their plots appear once that is done.</p> : null}
          {plots.series ? <SeriesChart plot={plots.series} title={`${label}: time series`} /> : null}
          {plots.spectrum ? <SpectrumChart plot={plots.spectrum} title={`${label}: spectrum`} /> : null}
        </div>
      ) : null}
    </li>
  );
}
