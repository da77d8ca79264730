import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, eq, inArray, max, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { invitations, reviews, rounds, submissionMembers, submissions, user } from "~db/schema";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { audit } from "~/workspace/audit.server";
import { InvalidInput, StateConflict, type Db } from "~/workspace/types";
import { listedPeople, roundContext, venueEditors, type RoundContext } from "./round-context.server";
import { calendarAttachment, reviewDueCalendar } from "./ical";
import { invitationStateLabel, roundStateLabel } from "./labels";
import { hashToken, newToken } from "./link-tokens.server";

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
  // A person can be both a member and a listed contributor: name each one once.
  const names = [...new Map(shared.map((p) => [norm(p.email) || norm(p.name), p.name])).values()];
  const warnings = names.length ? [`Shares the affiliation "${person!.affiliation}" with ${names.join(", ")}.`] : [];
  return { blocked: null, warnings };
}

/**
 * The reviewer's own page of a round: a stable address that asks to sign in, so it still works
 * after the one-time invitation link has been used.
 */
export function reviewPageUrl(ctx: Pick<RoundContext, "venue" | "submission" | "round">) {
  return absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", { venueId: ctx.venue.id, submissionId: ctx.submission.id, round: String(ctx.round.number) }));
}

function invitationCalendar(ctx: RoundContext, invitationId: string, dueAt: Date) {
  return reviewDueCalendar({ uid: invitationId, title: ctx.submission.title, dueAt, url: reviewPageUrl(ctx), venueName: ctx.venue.name });
}

function invitationMessage(ctx: RoundContext, inv: { id: string; dueAt: Date; token: string; name: string | null }, again = false) {
  const link = absoluteUrl(href("/invitations/:token", { token: inv.token }));
  const due = inv.dueAt.toISOString().slice(0, 10);
  return compose({
    subject: `${again ? "Reminder: i" : "I"}nvitation to review "${ctx.submission.title}" for ${ctx.venue.name}`,
    greeting: `Hello${inv.name ? ` ${inv.name}` : ""},`,
    paragraphs: [
      `The editor of ${ctx.venue.name} asks whether you would review round ${ctx.round.number} of "${ctx.submission.title}".`,
      ...(again ? ["This mail replaces the earlier invitation: its links no longer work, use these."] : []),
      `The review would be due on ${due}; the attached calendar entry carries the date and the address of your review page.`,
      `Accept: ${link}?answer=accept`,
      `Decline: ${link}?answer=decline`,
      `Each link works once and expires in ${LINK_DAYS} days.`,
    ],
    action: { label: "Answer the invitation", url: link },
  });
}

/** Invites one person to review a sent round: the invitation, the audit entry and the mail together. */
export async function inviteReviewer(db: Database, opts: { roundId: string; email: string; dueAt: Date; editorId: string }) {
  const ctx = await roundContext(db, { roundId: opts.roundId });
  if (!OPEN_STATES.includes(ctx.round.state as never)) throw new StateConflict(`Round ${ctx.round.number} is ${roundStateLabel(ctx.round.state).toLowerCase()}; reviewers can be invited only to a sent round that is not decided.`);
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
    await enqueueMail(tx, email, invitationMessage(ctx, { id: inv!.id, dueAt: opts.dueAt, token, name: account?.name ?? null }), {
      attachments: [calendarAttachment(invitationCalendar(ctx, inv!.id, opts.dueAt))],
      dedupeKey: `invite:${inv!.id}`,
    });
    return inv!;
  });
}

/** The invitation a link points at, if the link is still good (pending and not expired). */
export async function invitationByToken(db: Db, token: string) {
  const [inv] = await db.select().from(invitations).where(eq(invitations.tokenHash, hashToken(token)));
  if (!inv) return { inv: null, problem: "This invitation link is not valid. If the editor sent you the invitation again, use the link in the most recent mail." };
  if (inv.state === "withdrawn") return { inv, problem: "The editor withdrew this invitation, so there is nothing left to answer. Thank you all the same." };
  if (inv.state === "accepted") return { inv, problem: "This invitation link was already used: you accepted it. Sign in and open your review from the dashboard." };
  if (inv.state === "declined") return { inv, problem: "This invitation link was already used: you declined it." };
  if (inv.state !== "pending") return { inv, problem: `This invitation is ${invitationStateLabel(inv.state).toLowerCase()}; ask the editor for a new one.` };
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
  if (opts.invitation.state !== "pending") throw new StateConflict(`This invitation was already answered (${invitationStateLabel(opts.invitation.state).toLowerCase()}).`);
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

/** A pending invitation of this round, locked for the change; anything else is a clear conflict. */
async function pendingInvitation(tx: Db, roundId: string, invitationId: string, doing: string) {
  const [inv] = await tx.select().from(invitations).where(and(eq(invitations.id, invitationId), eq(invitations.roundId, roundId))).for("update");
  if (!inv) throw new InvalidInput("No such invitation in this round.", [{ path: "invitationId", message: "Reload the page: the invitation is not in this round." }]);
  if (inv.state !== "pending") throw new StateConflict(`Only an invitation awaiting an answer can be ${doing}; this one is ${invitationStateLabel(inv.state).toLowerCase()}.`);
  return inv;
}

/**
 * Sends a pending invitation again with a fresh link (the old link stops working) and a fresh
 * expiry; the due date stays unless a new one is given. Invitation, audit entry and mail commit together.
 */
export async function resendInvitation(db: Database, opts: { roundId: string; invitationId: string; editorId: string; dueAt?: Date }) {
  const ctx = await roundContext(db, { roundId: opts.roundId });
  if (!OPEN_STATES.includes(ctx.round.state as never)) throw new StateConflict(`Round ${ctx.round.number} is decided; its invitations can no longer be sent.`);
  if (opts.dueAt && opts.dueAt.getTime() <= Date.now()) throw new InvalidInput("The due date is in the past.", [{ path: "dueAt", message: "Choose a date after today." }]);
  const { token, hash } = newToken();
  return db.transaction(async (tx) => {
    const inv = await pendingInvitation(tx, opts.roundId, opts.invitationId, "sent again");
    const dueAt = opts.dueAt ?? inv.dueAt;
    const [updated] = await tx
      .update(invitations)
      .set({ tokenHash: hash, tokenExpiresAt: new Date(Date.now() + LINK_DAYS * 86_400_000), dueAt })
      .where(eq(invitations.id, inv.id))
      .returning();
    const [account] = await tx.select({ name: user.name }).from(user).where(sql`lower(${user.email}) = ${inv.email}`);
    await audit(tx, ctx.submission.id, opts.editorId, "invitation.resent", { round: ctx.round.number, email: inv.email });
    await enqueueMail(tx, inv.email, invitationMessage(ctx, { id: inv.id, dueAt, token, name: account?.name ?? null }, true), {
      attachments: [calendarAttachment(invitationCalendar(ctx, inv.id, dueAt))],
      dedupeKey: `invite:${inv.id}:${hash.slice(0, 16)}`,
    });
    return updated!;
  });
}

/** Withdraws a pending invitation: its link then says so, and the person is told by mail. */
export async function withdrawInvitation(db: Database, opts: { roundId: string; invitationId: string; editorId: string }) {
  const ctx = await roundContext(db, { roundId: opts.roundId });
  return db.transaction(async (tx) => {
    const inv = await pendingInvitation(tx, opts.roundId, opts.invitationId, "withdrawn");
    const [updated] = await tx.update(invitations).set({ state: "withdrawn", respondedAt: new Date() }).where(eq(invitations.id, inv.id)).returning();
    await audit(tx, ctx.submission.id, opts.editorId, "invitation.withdrawn", { round: ctx.round.number, email: inv.email });
    await enqueueMail(
      tx,
      inv.email,
      compose({
        subject: `Invitation withdrawn: "${ctx.submission.title}"`,
        greeting: "Hello,",
        paragraphs: [`The editor of ${ctx.venue.name} withdrew the invitation to review round ${ctx.round.number} of "${ctx.submission.title}". You need not do anything; the earlier links no longer work.`],
      }),
      { dedupeKey: `invite-withdrawn:${inv.id}` },
    );
    return updated!;
  });
}
