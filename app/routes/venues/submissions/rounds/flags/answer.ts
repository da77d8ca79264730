import { and, eq } from "drizzle-orm";
import { flags } from "~db/schema";
import { notFound, requireRound } from "~/access/page-guards.server";
import { isId } from "~/access/relation.server";
import type { Route } from "./+types/answer";

/** An author's explanation for one flag (empty clears it); kept across re-checks by fingerprint. */
export async function action(args: Route.ActionArgs) {
  const { db, user, access } = await requireRound(args, "answer-flags");
  const { round } = access;
  if (!isId(args.params.flagId)) throw notFound();
  const answer = String((await args.request.formData()).get("answer") ?? "").trim().slice(0, 4000);
  const [row] = await db
    .update(flags)
    .set({ authorAnswer: answer || null, answeredBy: answer ? user.id : null })
    .where(and(eq(flags.id, args.params.flagId), eq(flags.roundId, round.id)))
    .returning({ id: flags.id });
  if (!row) return Response.json({ error: { message: "This flag is gone: the checker re-ran since you opened the page. Reload it." } }, { status: 404 });
  return Response.json({ ok: true });
}
