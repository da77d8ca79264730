import { and, eq } from "drizzle-orm";
import { flags } from "~db/schema";
import { requireWorkspace } from "~/workspace/access.server";
import { assertDraft } from "~/workspace/rounds.server";
import { StateConflict } from "~/workspace/types";
import type { Route } from "./+types/flag-answer";

/** An author's explanation for one flag (empty clears it); kept across re-checks by fingerprint. */
export async function action(args: Route.ActionArgs) {
  const { db, user, round } = await requireWorkspace(args, args.params.submissionId, { round: args.params.round, write: true });
  try {
    assertDraft(round!);
  } catch (e) {
    if (e instanceof StateConflict) return Response.json({ error: { message: e.message } }, { status: 409 });
    throw e;
  }
  const answer = String((await args.request.formData()).get("answer") ?? "").trim().slice(0, 4000);
  const [row] = await db
    .update(flags)
    .set({ authorAnswer: answer || null, answeredBy: answer ? user.id : null })
    .where(and(eq(flags.id, args.params.flagId), eq(flags.roundId, round!.id)))
    .returning({ id: flags.id });
  if (!row) return Response.json({ error: { message: "This flag is gone: the checker re-ran since you opened the page. Reload it." } }, { status: 404 });
  return Response.json({ ok: true });
}
