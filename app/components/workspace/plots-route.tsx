import { useCallback, useMemo } from "react";
import { useFetcher } from "react-router";
import { preloadCharts } from "./lazy-plots";

/** What a plots route answers: the plots column-wise, or why not (gone from the round, or not yours to see). */
type PlotsAnswer<Columns> = Columns | { error: { message: string } };

/**
 * Plots read from a plots route (a run's …/runs/:runId/plots, a claim's …/claims/:claimId/plots)
 * with a fetcher: the page's own data carries no points. `decode` turns the column-wise answer
 * back into points (a module-level function, so the decoded plots are kept between renders).
 * `load` asks again when called again; the route answers 304 when the browser already holds the
 * same plots, so a repeat costs a round trip and no body.
 */
export function usePlotsRoute<Columns extends object, Points>(decode: (columns: Columns) => Points) {
  const fetcher = useFetcher();
  // The routes answer plain JSON (a Response), so the data is what they wrote.
  const answer = fetcher.data as PlotsAnswer<Columns> | undefined;
  const plots = useMemo<Points | null>(() => (answer && !("error" in answer) ? decode(answer) : null), [answer, decode]);
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
 * The charts' place while their plots are read: "Loading the plots…", or why they could not be
 * read with a button to try again.
 */
export function PlotsLoadState({ error, loading, retry }: { error: string | null; loading: boolean; retry: () => void }) {
  if (error) {
    return (
      <div role="alert" className="text-caption text-ember" data-testid="plots-error">
        The plots could not be loaded: {error}{" "}
        <button type="button" className="btn-quiet" disabled={loading} onClick={retry}>
          {loading ? "Trying again…" : "Try again"}
        </button>
      </div>
    );
  }
  return (
    <p role="status" className="text-caption" data-testid="plots-loading">
      Loading the plots…
    </p>
  );
}
