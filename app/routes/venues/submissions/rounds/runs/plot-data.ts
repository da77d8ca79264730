import { requireRoundOrNull } from "~/access/page-guards.server";
import type { RunRecord } from "~/checker/schema";
import { jsonWithEtag } from "~/lib/conditional-get.server";
import { runPlotColumns } from "~/workspace/round-data.server";
import { roundRun } from "~/workspace/runs.server";
import type { Route } from "./+types/plot-data";

const notFound = () => Response.json({ error: { message: "This run is not in the round, or you may not see it." } }, { status: 404 });

/**
 * GET …/rounds/:round/runs/:runId/plots — one run's stored plot copies as column-wise JSON
 * (app/workspace/plot-columns.ts), read by the run page and the reviewer's workspace once they are
 * on screen, so the pages' own data carries no points. Whoever may open the run page may read
 * these; anyone else gets the same 404 as for a run that does not exist. The 404 is returned, not
 * thrown: a fetcher's thrown error would replace the whole page with the error view, while the
 * charts' place can say that they could not be loaded.
 */
export async function loader(args: Route.LoaderArgs) {
  const guard = await requireRoundOrNull(args, "read-runs");
  if (!guard) return notFound();
  const { db, access } = guard;
  const run = await roundRun(db, access.round.id, args.params.runId);
  if (!run) return notFound();
  return jsonWithEtag(args.request, await runPlotColumns(db, run.versionId, run.record as RunRecord));
}

/** A fetcher reads this route through its `.data` address: the tag and caching rule go there too. */
export const headers: Route.HeadersFunction = ({ loaderHeaders }) => loaderHeaders;
