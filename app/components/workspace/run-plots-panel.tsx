import { useEffect } from "react";
import { decodeRunPlots } from "~/workspace/plot-columns";
import { SeriesChart, SpectrumChart } from "./lazy-plots";
import { PlotsLoadState, usePlotsRoute } from "./plots-route";

/** One run's plots read from its plots route (…/runs/:runId/plots); see `usePlotsRoute`. */
export const useRunPlots = () => usePlotsRoute(decodeRunPlots);

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
  // Charts already drawn stay while the plots are read again (a revalidation, a changed file):
  // swapping them for a status would lose the reader's zoom and scale.
  if (wanted && (error || !plots)) return <PlotsLoadState error={error} loading={loading} retry={() => load(plotsHref)} />;
  const series = wanted ? plots?.series : null;
  const spectrum = wanted ? plots?.spectrum : null;
  return (
    <>
      {series ? <SeriesChart plot={series} title="Time series" showStats={false} /> : analysing ? null : <p className="text-caption">No time series attached.</p>}
      {spectrum ? <SpectrumChart plot={spectrum} title="Spectrum" /> : <p className="text-caption">No spectrum attached.</p>}
    </>
  );
}
