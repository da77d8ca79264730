import { requireRound } from "~/access/page-guards.server";
import { flagPanelRows, panelRowsQuerySchema } from "~/workspace/flag-panel.server";
import type { Route } from "./+types/rows";

/**
 * GET …/rounds/:round/flags?group=&key=&severity=&family=&run=&claim=&limit= — the rows of one
 * group of the flags panel, read when someone opens it (the page itself carries only counts).
 */
export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-flags");
  const parsed = panelRowsQuerySchema.safeParse(Object.fromEntries(new URL(args.request.url).searchParams));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return Response.json({ error: { message: `The ${issue?.path.join(".") || "query"} of this address is not valid: ${issue?.message ?? "unknown"}.` } }, { status: 400 });
  }
  return Response.json(await flagPanelRows(db, access.round.id, parsed.data), { headers: { "cache-control": "private, no-store" } });
}
