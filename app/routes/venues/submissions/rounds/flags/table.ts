import { requireRound } from "~/access/page-guards.server";
import { jsonWithEtag } from "~/lib/conditional-get.server";
import { roundFlagTable } from "~/workspace/flags-query.server";
import type { Route } from "./+types/table";

/**
 * GET …/rounds/:round/flags/table — every flag of the round for the reviewers' and the editor's
 * table, read once the page is on screen (the page itself carries only the count). A round's flags
 * change only when its check lands, so a repeat visit is answered 304 from the entity tag.
 */
export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-flags");
  return jsonWithEtag(args.request, await roundFlagTable(db, access.round.id));
}
