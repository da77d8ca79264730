import { and, eq, ne } from "drizzle-orm";
import { data } from "react-router";
import { rounds, submissionMembers } from "~db/schema";
import { requireSubmissionAccess } from "~/auth/guards.server";
import { roundOf } from "./rounds.server";

type Args = Parameters<typeof requireSubmissionAccess>[0];

/**
 * The workspace's guard, called by every loader and action itself. Authors and co-authors see
 * everything of their submission; editors only rounds that were sent — a draft
 * is private to its authors, and to anyone else it looks like it does not exist (404).
 */
export async function requireWorkspace(args: Args, submissionId: string, opts: { round?: string | number; write?: boolean } = {}) {
  // Reviewers read a round through their own workspace (review/…), which checks that they hold a
  // report on that round and applies the venue's blinding; the authors' pages are not theirs.
  const roles = opts.write ? (["author", "co-author"] as const) : (["author", "co-author", "editor"] as const);
  const found = await requireSubmissionAccess(args, submissionId, [...roles]);
  // A URL naming the submission under another venue is as unknown as a wrong id.
  const venueParam = (args as { params?: { venueId?: string } }).params?.venueId;
  if (venueParam !== undefined && venueParam !== found.submission.venueId) throw data("Not found", { status: 404 });
  const isAuthor = found.roles.includes("author") || found.roles.includes("co-author");
  let round: Awaited<ReturnType<typeof roundOf>> | null = null;
  if (opts.round !== undefined) {
    const n = Number(opts.round);
    if (!Number.isInteger(n) || n < 1) throw data("Not found", { status: 404 });
    round = await roundOf(found.db, submissionId, n);
    if (!isAuthor && round.state === "draft") throw data("Not found", { status: 404 });
  } else if (!isAuthor) {
    const [sent] = await found.db
      .select({ id: rounds.id })
      .from(rounds)
      .where(and(eq(rounds.submissionId, submissionId), ne(rounds.state, "draft")))
      .limit(1);
    if (!sent) throw data("Not found", { status: 404 });
  }
  return { ...found, round, isAuthor };
}

/** Only the corresponding author sends a round. */
export async function isCorresponding(db: Parameters<typeof roundOf>[0], submissionId: string, userId: string) {
  const [row] = await db
    .select({ c: submissionMembers.corresponding })
    .from(submissionMembers)
    .where(and(eq(submissionMembers.submissionId, submissionId), eq(submissionMembers.userId, userId), eq(submissionMembers.role, "author")));
  return row?.c === true;
}

/** The round a short link opens: the latest one the person may see. */
export async function currentRoundNumber(db: Parameters<typeof roundOf>[0], submissionId: string, isAuthor: boolean) {
  const rows = await db.select({ number: rounds.number, state: rounds.state }).from(rounds).where(eq(rounds.submissionId, submissionId));
  const visible = rows.filter((r) => isAuthor || r.state !== "draft").map((r) => r.number);
  if (!visible.length) throw data("Not found", { status: 404 });
  return Math.max(...visible);
}
