import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, eq, gt, inArray, isNotNull, ne, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { flags, rounds, submissionMembers, submissions, user } from "~db/schema";
import { env } from "~/config/env.server";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { groupDigests, type DigestEvent, type DigestFrequency } from "./digest-grouping";

const PERIOD_MS = { daily: 86_400_000, weekly: 7 * 86_400_000 } as const;

/** What happened on one submission since `since`: new flags, released remarks and decisions. */
async function eventsOf(db: Database, sub: { id: string; title: string }, since: Date): Promise<Omit<DigestEvent, "email">[]> {
  const base = { submissionId: sub.id, submissionTitle: sub.title };
  const flagCounts = await db
    .select({ round: rounds.number, severity: flags.severity, n: sql<number>`count(*)::int`, at: sql<Date>`max(${flags.createdAt})` })
    .from(flags)
    .innerJoin(rounds, eq(rounds.id, flags.roundId))
    .where(and(eq(rounds.submissionId, sub.id), gt(flags.createdAt, since)))
    .groupBy(rounds.number, flags.severity);
  const decided = await db
    .select({ id: rounds.id, round: rounds.number, decision: rounds.decision, at: rounds.releasedAt, remarks: sql<number>`(select count(*)::int from remarks m join reviews v on v.id = m.review_id where v.round_id = "rounds"."id" and v.state = 'submitted')` })
    .from(rounds)
    .where(and(eq(rounds.submissionId, sub.id), isNotNull(rounds.releasedAt), gt(rounds.releasedAt, since)));
  return [
    ...flagCounts.map((f) => ({ ...base, kind: "flags" as const, text: `Round ${f.round}: ${f.n} ${f.severity} flag(s) raised or recomputed.`, at: new Date(f.at) })),
    ...decided.flatMap((d) => [
      { ...base, kind: "decision" as const, text: `Round ${d.round}: decision released (${d.decision}).`, at: d.at! },
      ...(d.remarks ? [{ ...base, kind: "remarks" as const, text: `Round ${d.round}: ${d.remarks} reviewer remark(s) released.`, at: d.at! }] : []),
    ]),
  ];
}

/**
 * One digest mail per person per period across all their submissions. Safe to run as often as
 * the scheduler likes: the dedupe key names the person and the period.
 */
export async function runDigests(db: Database, now = new Date(), only?: DigestFrequency) {
  const people = await db
    .selectDistinct({ id: user.id, email: user.email, name: user.name, digest: user.digest, sentAt: user.digestSentAt })
    .from(user)
    .innerJoin(submissionMembers, eq(submissionMembers.userId, user.id))
    .where(and(inArray(submissionMembers.role, ["author", "co-author"]), ne(user.digest, "none"), only ? eq(user.digest, only) : undefined));
  let queued = 0;
  for (const person of people) {
    const freq = person.digest as "daily" | "weekly";
    const since = person.sentAt ?? new Date(now.getTime() - PERIOD_MS[freq]);
    const subs = await db
      .selectDistinct({ id: submissions.id, title: submissions.title })
      .from(submissionMembers)
      .innerJoin(submissions, eq(submissions.id, submissionMembers.submissionId))
      .where(and(eq(submissionMembers.userId, person.id), inArray(submissionMembers.role, ["author", "co-author"])));
    const events = (await Promise.all(subs.map((s) => eventsOf(db, s, since)))).flat().map((e) => ({ ...e, email: person.email }));
    const [message] = groupDigests(events, new Map([[person.email, freq]]), now);
    if (!message) continue;
    await db.transaction(async (tx) => {
      const id = await enqueueMail(
        tx,
        person.email,
        compose({
          subject: `Your ${freq} Runproof digest (${message.period})`,
          greeting: `Hello ${person.name},`,
          paragraphs: message.bySubmission.flatMap((s) => [`${s.title}:`, ...s.lines.map((l) => `• ${l}`)]),
          action: { label: "Open your dashboard", url: absoluteUrl(href("/dashboard")) },
          footer: "You get this digest because you are listed on these submissions; change how often on your account page.",
        }),
        { dedupeKey: `digest:${person.email}:${message.period}` },
      );
      if (id) queued++;
      await tx.update(user).set({ digestSentAt: now }).where(eq(user.id, person.id));
    });
  }
  return { queued };
}
