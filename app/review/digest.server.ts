import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, eq, gt, inArray, isNotNull, ne, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { flags, rounds, submissionMembers, submissions, user } from "~db/schema";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { groupDigests, type DigestEvent, type DigestFrequency, type DigestMessage } from "./digest-grouping";
import { decisionLabel } from "./labels";

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
      { ...base, kind: "decision" as const, text: `Round ${d.round}: decision released: ${decisionLabel(d.decision)}.`, at: d.at! },
      ...(d.remarks ? [{ ...base, kind: "remarks" as const, text: `Round ${d.round}: ${d.remarks} reviewer remark(s) released.`, at: d.at! }] : []),
    ]),
  ];
}

type Person = { id: string; email: string; name: string; digest: string; sentAt: Date | null };

/** The person's submissions as author or co-author, optionally only one of them. */
async function submissionsOf(db: Database, userId: string, only?: string) {
  return db
    .selectDistinct({ id: submissions.id, title: submissions.title })
    .from(submissionMembers)
    .innerJoin(submissions, eq(submissions.id, submissionMembers.submissionId))
    .where(and(eq(submissionMembers.userId, userId), inArray(submissionMembers.role, ["author", "co-author"]), only ? eq(submissions.id, only) : undefined));
}

/** What the person's next digest holds: events since their last digest (or one period back). */
async function digestOf(db: Database, person: Person, freq: "daily" | "weekly", now: Date, onlySubmission?: string) {
  const since = person.sentAt ?? new Date(now.getTime() - PERIOD_MS[freq]);
  const subs = await submissionsOf(db, person.id, onlySubmission);
  const events = (await Promise.all(subs.map((s) => eventsOf(db, s, since)))).flat().map((e) => ({ ...e, email: person.email }));
  const [message] = groupDigests(events, new Map([[person.email, freq]]), now);
  return { since, message: message ?? null };
}

function digestMail(person: Person, freq: string, message: DigestMessage) {
  return compose({
    subject: `Your ${freq} Runproof digest (${message.period})`,
    greeting: `Hello ${person.name},`,
    paragraphs: message.bySubmission.map((s) => `${s.title}:\n${s.lines.map((l) => `• ${l}`).join("\n")}`),
    action: { label: "Open your dashboard", url: absoluteUrl(href("/dashboard")) },
    footer: "You get this digest because you are listed on these submissions; change how often on your account page.",
  });
}

const personColumns = { id: user.id, email: user.email, name: user.name, digest: user.digest, sentAt: user.digestSentAt };

/**
 * The next digest of one person, as it would be sent now, without sending it: for the account
 * page. A person who chose no digest sees what a weekly one would hold.
 */
export async function previewDigest(db: Database, userId: string, now = new Date()) {
  const [person] = await db.select(personColumns).from(user).where(eq(user.id, userId));
  if (!person) return null;
  const freq = person.digest === "daily" ? "daily" : "weekly";
  const { since, message } = await digestOf(db, person, freq, now);
  return { frequency: person.digest as DigestFrequency, since, period: message?.period ?? null, bySubmission: message?.bySubmission ?? [] };
}

/**
 * "Send now" for one submission (editors and admins; the page checks who may): each author and
 * co-author who wants digests gets this submission's events since their last digest at once.
 * Their regular digest still comes, so nothing they asked for is skipped. A second click within
 * the same minute sends nothing more.
 */
export async function sendDigestNow(db: Database, opts: { submissionId: string; now?: Date }) {
  const now = opts.now ?? new Date();
  const people = await digestPeople(db, opts.submissionId);
  return db.transaction(async (tx) => {
    let queued = 0;
    const sentTo: { name: string; email: string }[] = [];
    const nothingNew: { name: string; email: string }[] = [];
    for (const person of people) {
      const freq = person.digest as "daily" | "weekly";
      const { message } = await digestOf(tx as unknown as Database, person, freq, now, opts.submissionId);
      if (!message) {
        nothingNew.push({ name: person.name, email: person.email });
        continue;
      }
      const id = await enqueueMail(tx, person.email, digestMail(person, freq, message), { dedupeKey: `digest-now:${opts.submissionId}:${person.email}:${now.toISOString().slice(0, 16)}` });
      if (id) {
        queued++;
        sentTo.push({ name: person.name, email: person.email });
      }
    }
    return { queued, people: people.length, sentTo, nothingNew };
  });
}

/** The authors and co-authors of a submission who get digests (the ones "send now" would mail). */
function digestPeople(db: Database, submissionId: string) {
  return db
    .selectDistinct(personColumns)
    .from(user)
    .innerJoin(submissionMembers, eq(submissionMembers.userId, user.id))
    .where(and(eq(submissionMembers.submissionId, submissionId), inArray(submissionMembers.role, ["author", "co-author"]), ne(user.digest, "none")));
}

/** Who "send now" would mail, by name and address (for the confirmation the editor sees first). */
export async function digestRecipients(db: Database, submissionId: string) {
  return (await digestPeople(db, submissionId)).map((p) => ({ name: p.name, email: p.email }));
}

/**
 * One digest mail per person per period across all their submissions. Safe to run as often as
 * the scheduler likes: the dedupe key names the person and the period.
 */
export async function runDigests(db: Database, now = new Date(), only?: DigestFrequency) {
  const people = await db
    .selectDistinct(personColumns)
    .from(user)
    .innerJoin(submissionMembers, eq(submissionMembers.userId, user.id))
    .where(and(inArray(submissionMembers.role, ["author", "co-author"]), ne(user.digest, "none"), only ? eq(user.digest, only) : undefined));
  let queued = 0;
  for (const person of people) {
    const freq = person.digest as "daily" | "weekly";
    const { message } = await digestOf(db, person, freq, now);
    if (!message) continue;
    await db.transaction(async (tx) => {
      const id = await enqueueMail(tx, person.email, digestMail(person, freq, message), { dedupeKey: `digest:${person.email}:${message.period}` });
      if (id) queued++;
      await tx.update(user).set({ digestSentAt: now }).where(eq(user.id, person.id));
    });
  }
  return { queued };
}
