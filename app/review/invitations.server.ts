import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, eq, inArray, max, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { invitations, reviews, rounds, submissionMembers, submissions, user } from "~db/schema";
import { env } from "~/config/env.server";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { audit } from "~/workspace/audit.server";
import { InvalidInput, StateConflict, type Db } from "~/workspace/types";
import { listedPeople, roundContext, venueEditors } from "./context.server";
import { calendarAttachment, reviewDueCalendar } from "./ical";
import { hashToken, newToken } from "./tokens.server";

const LINK_DAYS = 14;
import { OPEN_STATES } from "./states";
export { OPEN_STATES };

const norm = (s: string | null | undefined) => (s ?? "").trim().toLowerCase();

/** Authors and co-authors cannot review their own paper; a shared affiliation only warns. */
export async function conflictCheck(db: Db, submissionId: string, email: string) {
  const listed = await listedPeople(db, submissionId);
  if (listed.some((p) => norm(p.email) === norm(email))) {
    return { blocked: "This person is an author or co-author of the submission and cannot review it.", warnings: [] as string[] };
  }
  const [person] = await db.select({ affiliation: user.affiliation }).from(user).where(sql`lower(${user.email}) = ${norm(email)}`);
  const aff = norm(person?.affiliation);
  const shared = aff ? listed.filter((p) => norm(p.affiliation) === aff) : [];
  const warnings = shared.length ? [`Shares the affiliation "${person!.affiliation}" with ${shared.map((p) => p.name).join(", ")}.`] : [];
  return { blocked: null, warnings };
}

/** Invites one person to review a sent round: the invitation, the audit entry and the mail together. */
export async function inviteReviewer(db: Database, opts: { roundId: string; email: string; dueAt: Date; editorId: string }) {
  const ctx = await roundContext(db, { roundId: opts.roundId });
  if (!OPEN_STATES.includes(ctx.round.state as never)) throw new StateConflict(`Round ${ctx.round.number} is ${ctx.round.state}; reviewers can be invited only to a sent round that is not decided.`);
  if (opts.dueAt.getTime() <= Date.now()) throw new InvalidInput("The due date is in the past.", [{ path: "dueAt", message: "Choose a date after today." }]);
  const email = norm(opts.email);
  const { blocked } = await conflictCheck(db, ctx.submission.id, email);
  if (blocked) throw new InvalidInput(blocked, [{ path: "email", message: blocked }]);
  const open = await db
    .select({ id: invitations.id })
    .from(invitations)
    .where(and(eq(invitations.roundId, opts.roundId), eq(invitations.email, email), inArray(invitations.state, ["pending", "accepted"])));
  if (open.length) throw new InvalidInput("This person already has an invitation to this round.", [{ path: "email", message: "Already invited to this round." }]);
  const [account] = await db.select({ id: user.id, name: user.name }).from(user).where(sql`lower(${user.email}) = ${email}`);
  const { token, hash } = newToken();
  return db.transaction(async (tx) => {
    const [inv] = await tx
      .insert(invitations)
      .values({
        roundId: opts.roundId,
        email,
        userId: account?.id ?? null,
        invitedBy: opts.editorId,
        dueAt: opts.dueAt,
        tokenHash: hash,
        tokenExpiresAt: new Date(Date.now() + LINK_DAYS * 86_400_000),
      })
      .returning();
    if (ctx.round.state === "sent") await tx.update(rounds).set({ state: "under-review" }).where(eq(rounds.id, opts.roundId));
    await tx.update(submissions).set({ stage: "in-review", updatedAt: new Date() }).where(eq(submissions.id, ctx.submission.id));
    await audit(tx, ctx.submission.id, opts.editorId, "reviewer.invited", { round: ctx.round.number, email });
    const link = absoluteUrl(href("/invitations/:token", { token }));
    const due = opts.dueAt.toISOString().slice(0, 10);
    const ics = reviewDueCalendar({ uid: inv!.id, title: ctx.submission.title, dueAt: opts.dueAt, url: link, venueName: ctx.venue.name });
    const message = compose({
      subject: `Invitation to review "${ctx.submission.title}" for ${ctx.venue.name}`,
      greeting: `Hello${account ? ` ${account.name}` : ""},`,
      paragraphs: [
        `The editor of ${ctx.venue.name} asks whether you would review round ${ctx.round.number} of "${ctx.submission.title}".`,
        `The review would be due on ${due}; the attached calendar entry carries the date.`,
        `Accept: ${link}?answer=accept`,
        `Decline: ${link}?answer=decline`,
        `Each link works once and expires in ${LINK_DAYS} days.`,
      ],
      action: { label: "Answer the invitation", url: link },
    });
    await enqueueMail(tx, email, message, { attachments: [calendarAttachment(ics)], dedupeKey: `invite:${inv!.id}` });
    return inv!;
  });
}

/** The invitation a link points at, if the link is still good (pending and not expired). */
export async function invitationByToken(db: Db, token: string) {
  const [inv] = await db.select().from(invitations).where(eq(invitations.tokenHash, hashToken(token)));
  if (!inv) return { inv: null, problem: "This invitation link is not valid." };
  if (inv.state !== "pending") return { inv, problem: `This invitation link was already used (the invitation is ${inv.state}).` };
  if (inv.tokenExpiresAt.getTime() < Date.now()) return { inv, problem: "This invitation link has expired; ask the editor for a new one." };
  return { inv, problem: null };
}

/**
 * Accepts or declines. The update only applies while the invitation is pending, so a link used
 * twice (or by two tabs at once) changes the state once.
 */
export async function respondToInvitation(db: Database, opts: { token: string; answer: "accept" | "decline"; userId: string | null }) {
  const { inv, problem } = await invitationByToken(db, opts.token);
  if (!inv || problem) throw new StateConflict(problem ?? "This invitation link is not valid.");
  return answerInvitation(db, inv, opts);
}

/** The invited person answers from the round's review page, signed in with the invited address. */
export async function respondAsInvitee(db: Database, opts: { invitation: typeof invitations.$inferSelect; answer: "accept" | "decline"; userId: string }) {
  if (opts.invitation.state !== "pending") throw new StateConflict(`This invitation was already answered (it is ${opts.invitation.state}).`);
  return answerInvitation(db, opts.invitation, opts);
}

async function answerInvitation(db: Database, inv: typeof invitations.$inferSelect, opts: { answer: "accept" | "decline"; userId: string | null }) {
  const ctx = await roundContext(db, { roundId: inv.roundId });
  if (!OPEN_STATES.includes(ctx.round.state as never)) throw new StateConflict(`Round ${ctx.round.number} was decided; this invitation is no longer needed.`);
  if (opts.answer === "accept" && !opts.userId) throw new StateConflict("Sign in with the invited address to accept.");
  return db.transaction(async (tx) => {
    const [done] = await tx
      .update(invitations)
      .set({ state: opts.answer === "accept" ? "accepted" : "declined", respondedAt: new Date(), userId: opts.userId ?? inv.userId })
      .where(and(eq(invitations.id, inv.id), eq(invitations.state, "pending")))
      .returning();
    if (!done) throw new StateConflict("This invitation link was already used.");
    let reviewNumber: number | null = null;
    if (opts.answer === "accept") {
      await tx.execute(sql`select id from rounds where id = ${inv.roundId} for update`);
      const [{ last } = { last: 0 }] = await tx.select({ last: max(reviews.number) }).from(reviews).where(eq(reviews.roundId, inv.roundId));
      reviewNumber = (last ?? 0) + 1;
      await tx.insert(reviews).values({ roundId: inv.roundId, reviewerId: opts.userId!, invitationId: inv.id, number: reviewNumber, dueAt: inv.dueAt });
      await tx.insert(submissionMembers).values({ submissionId: ctx.submission.id, userId: opts.userId!, role: "reviewer" }).onConflictDoNothing();
      if (ctx.round.state === "reviews-in") await tx.update(rounds).set({ state: "under-review" }).where(eq(rounds.id, inv.roundId));
    }
    await audit(tx, ctx.submission.id, opts.userId, opts.answer === "accept" ? "invitation.accepted" : "invitation.declined", { round: ctx.round.number, email: inv.email });
    for (const editor of await venueEditors(tx, ctx.venue.id)) {
      await enqueueMail(
        tx,
        editor.email,
        compose({
          subject: `Invitation ${opts.answer === "accept" ? "accepted" : "declined"}: ${ctx.submission.title}`,
          greeting: `Hello ${editor.name},`,
          paragraphs: [`${inv.email} ${opts.answer === "accept" ? "accepted" : "declined"} the invitation to review round ${ctx.round.number} of "${ctx.submission.title}".`],
          action: { label: "Open the round", url: absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", { venueId: ctx.venue.id, submissionId: ctx.submission.id, round: String(ctx.round.number) })) },
        }),
        { dedupeKey: `invite-answer:${inv.id}:${editor.email}` },
      );
    }
    return { invitation: done, ctx, reviewNumber };
  });
}

/** One click: invites round N-1's reviewers (who submitted) to round N with a new due date. */
export async function reinvitePrevious(db: Database, opts: { roundId: string; dueAt: Date; editorId: string }) {
  const ctx = await roundContext(db, { roundId: opts.roundId });
  if (ctx.round.number < 2) throw new StateConflict("Round 1 has no earlier reviewers to invite again.");
  const prev = await roundContext(db, { submissionId: ctx.submission.id, number: ctx.round.number - 1 });
  const earlier = await db
    .select({ email: user.email })
    .from(reviews)
    .innerJoin(user, eq(user.id, reviews.reviewerId))
    .where(eq(reviews.roundId, prev.round.id));
  const already = new Set(
    (await db.select({ email: invitations.email }).from(invitations).where(and(eq(invitations.roundId, opts.roundId), inArray(invitations.state, ["pending", "accepted"])))).map((r) => r.email),
  );
  const invited: string[] = [];
  for (const r of earlier) {
    if (already.has(norm(r.email))) continue;
    await inviteReviewer(db, { roundId: opts.roundId, email: r.email, dueAt: opts.dueAt, editorId: opts.editorId });
    invited.push(r.email);
  }
  return invited;
}
