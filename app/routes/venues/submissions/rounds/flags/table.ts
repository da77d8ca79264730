import { createHash } from "node:crypto";
import { requireRound } from "~/access/page-guards.server";
import { roundFlagTable } from "~/workspace/flags-query.server";
import type { Route } from "./+types/table";

/**
 * GET …/rounds/:round/flags/table — every flag of the round for the reviewers' and the editor's
 * table, read once the page is on screen (the page itself carries only the count). A round's flags
 * change only when its check lands, so a repeat visit is answered 304 from the entity tag.
 */
export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-flags");
  const body = JSON.stringify(await roundFlagTable(db, access.round.id));
  const tag = `"${createHash("sha1").update(body).digest("base64url")}"`;
  const headers = { "content-type": "application/json; charset=utf-8", "cache-control": "private, no-cache", etag: tag, vary: "cookie" };
  const asked = args.request.headers.get("if-none-match");
  if (asked && asked.split(",").some((t) => t.trim().replace(/^W\//, "") === tag)) return new Response(null, { status: 304, headers });
  return new Response(body, { headers });
}
