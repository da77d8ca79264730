import { useEffect } from "react";
import { decodeClaimOverlay } from "~/workspace/plot-columns";
import { ComparisonChart } from "./lazy-plots";
import { PlotsLoadState, usePlotsRoute } from "./plots-route";

/**
 * The claim page's comparison chart: the series of the claim's runs overlaid, read from the
 * claim's plots route (…/claims/:claimId/plots) once the page is hydrated, and again when the
 * analysed files change (`overlayKey`), with a status until they arrive and a clear message if
 * they cannot be read.
 */
export function ClaimOverlayPanel({ plotsHref, overlayKey }: { plotsHref: string; overlayKey: string }) {
  const { load, plots, error, loading } = usePlotsRoute(decodeClaimOverlay);
  useEffect(() => {
    load(plotsHref);
  }, [load, plotsHref, overlayKey]);
  if (error || !plots) return <PlotsLoadState error={error} loading={loading} retry={() => load(plotsHref)} />;
  if (plots.runs.length < 2) return null;
  return <ComparisonChart runs={plots.runs} title={`The claim's runs overlaid: ${plots.runs.map((o) => o.label).join(", ")} (downsampled series)`} />;
}
