import { SeriesChart, SpectrumChart } from "~/components/workspace/lazy-plots";
import { useRunPlots } from "~/components/workspace/run-plots-panel";

/**
 * One run's plots, loaded when asked for from the run's plots route (the same access rules as
 * its page): a round of sixty runs does not send sixty plot copies with the reviewer's page, and
 * opening one sends only that run's points, not its whole page.
 */
export function RunPlotsOnDemand({ label, plotsHref, kinds }: { label: string; plotsHref: string; kinds: string }) {
  const { load, plots, error, loading } = useRunPlots();
  return (
    <li className="py-2" data-testid="run-plots">
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-mono font-semibold">{label}</span>
        <span className="text-caption text-basalt-soft">{kinds}</span>
        {plots ? null : (
          <button type="button" className="btn-quiet" disabled={loading} onClick={() => load(plotsHref)}>
            {loading ? "Loading the plots…" : error ? `Try the plots of ${label} again` : `Show the plots of ${label}`}
          </button>
        )}
      </div>
      {error && !plots ? (
        <p role="alert" className="mt-1 text-caption text-ember">
          The plots of {label} could not be loaded: {error}
        </p>
      ) : null}
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
