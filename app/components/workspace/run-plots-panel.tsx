import { useCallback, useEffect, useMemo } from "react";
import { useFetcher } from "react-router";
import { decodeRunPlots, type RunPlotColumns, type RunPlotPoints } from "~/workspace/plot-columns";
import { preloadCharts, SeriesChart, SpectrumChart } from "./lazy-plots";

/** What the plots route answers: the plots, or why not (a run gone from the round, or not yours to see). */
type PlotsAnswer = RunPlotColumns | { error: { message: string } };

/**
 * One run's plots read from the plots route (…/runs/:runId/plots) with a fetcher: the page's own
 * data carries no points. `load` asks again when called again; the route answers 304 when the
 * browser already holds the same plots, so a repeat costs a round trip and no body.
 */
export function useRunPlots() {
  const fetcher = useFetcher<PlotsAnswer>();
  const answer = fetcher.data;
  const plots = useMemo<RunPlotPoints | null>(() => (answer && !("error" in answer) ? decodeRunPlots(answer) : null), [answer]);
  const { load: fetch } = fetcher;
  const load = useCallback(
    (plotsHref: string) => {
      preloadCharts();
      void fetch(plotsHref);
    },
    [fetch],
  );
  return { load, plots, error: answer && "error" in answer ? answer.error.message : null, loading: fetcher.state !== "idle" };
}

/**
 * The run page's series and spectrum: fetched once the page is hydrated (and again when the
 * analysed files change), with a status until they arrive and a clear message if they cannot be
 * read. `has` says which plots the stored files give, so a run without any asks for nothing.
 */
export function RunPlotsPanel({ plotsHref, has, plotKey, analysing }: { plotsHref: string; has: { series: boolean; spectrum: boolean }; plotKey: string; analysing: boolean }) {
  const { load, plots, error, loading } = useRunPlots();
  const wanted = has.series || has.spectrum;
  useEffect(() => {
    if (wanted) load(plotsHref);
  }, [load, plotsHref, plotKey, wanted]);
  if (wanted && error) {
    return (
      <div role="alert" className="text-caption text-ember" data-testid="plots-error">
        The plots could not be loaded: {error}{" "}
        <button type="button" className="btn-quiet" disabled={loading} onClick={() => load(plotsHref)}>
          {loading ? "Trying again…" : "Try again"}
        </button>
      </div>
    );
  }
  // Charts already drawn stay while the plots are read again (a revalidation, a changed file):
  // swapping them for a status would lose the reader's zoom and scale.
  if (wanted && !plots) {
    return (
      <p role="status" className="text-caption" data-testid="plots-loading">
        Loading the plots…
      </p>
    );
  }
  const series = wanted ? plots?.series : null;
  const spectrum = wanted ? plots?.spectrum : null;
  return (
    <>
      {series ? <SeriesChart plot={series} title="Time series" showStats={false} /> : analysing ? null : <p className="text-caption">No time series attached.</p>}
      {spectrum ? <SpectrumChart plot={spectrum} title="Spectrum" /> : <p className="text-caption">No spectrum attached.</p>}
    </>
  );
}
