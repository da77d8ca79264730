import { requireRoundOrNull } from "~/access/page-guards.server";
import { jsonWithEtag } from "~/lib/conditional-get.server";
import { claimRunLabels, roundClaim } from "~/workspace/claims.server";
import { claimOverlayColumns } from "~/workspace/round-data.server";
import { roundRunsLabelled } from "~/workspace/runs.server";
import type { Route } from "./+types/claim-plot-data";

const notFound = () => Response.json({ error: { message: "This claim is not in the round, or you may not see it." } }, { status: 404 });

/**
 * GET …/rounds/:round/claims/:claimId/plots — the stored series copies of the runs a claim names,
 * column-wise (app/workspace/plot-columns.ts), read by the claim page's comparison chart once the
 * page is on screen, so the page's own data carries no points. Whoever may open the claim page may
 * read these; anyone else gets the same 404 as for a claim that does not exist (returned, not
 * thrown, so the chart's place can say it could not be loaded). With an entity tag: a repeat view
 * is answered 304.
 */
export async function loader(args: Route.LoaderArgs) {
  const guard = await requireRoundOrNull(args, "read-claims");
  if (!guard) return notFound();
  const { db, access } = guard;
  const claim = await roundClaim(db, access.round.id, args.params.claimId);
  if (!claim) return notFound();
  const named = claimRunLabels(claim.record);
  const runs = named.length > 1 ? await roundRunsLabelled(db, access.round.id, named) : [];
  const overlay = runs.length > 1 ? await claimOverlayColumns(db, runs.map((r) => ({ versionId: r.versionId, label: r.label, record: r.record }))) : { runs: [], analysing: false };
  return jsonWithEtag(args.request, overlay);
}

/** A fetcher reads this route through its `.data` address: the tag and caching rule go there too. */
export const headers: Route.HeadersFunction = ({ loaderHeaders }) => loaderHeaders;
