import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { createHash, randomBytes } from "node:crypto";
import { and, eq, isNotNull, isNull, max } from "drizzle-orm";
import { contributors, submissionMembers, submissions, user } from "~db/schema";
import type { Database } from "~db/client";
import { env } from "~/config/env.server";
import { parseOrcid } from "~/lib/orcid";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { RULES, takeAttempt, waitInWords } from "~/throttle/limits.server";
import { InvalidInput, TooManyRequests } from "./types";

const hashToken = (t: string) => createHash("sha256").update(t).digest("hex");

/** How long a co-author invitation link works (common practice: days, not forever). */
export const INVITE_VALID_DAYS = 14;
const INVITE_VALID_MS = INVITE_VALID_DAYS * 24 * 60 * 60 * 1000;

export type InviteAnswer =
  | { ok: true }
  | { ok: false; reason: "unknown" | "expired" | "other-address"; message: string };

const ANSWERS = {
  unknown: "This invitation was already used, withdrawn or is not valid. Ask the corresponding author to invite you again.",
  expired: `This invitation is older than ${INVITE_VALID_DAYS} days and no longer works. Ask the corresponding author to invite you again.`,
  "other-address": "This invitation was sent to another e-mail address. Sign in with the account of the address the invitation was sent to, or ask the corresponding author to invite this address.",
} as const;

/**
 * Lists a co-author and mails them a link that attaches their account (an existing one, or
 * one they create with that address) to the submission. Only the token's hash is stored.
 */
export async function inviteContributor(
  db: Database,
  opts: {
    submissionId: string;
    invitedBy: string;
    name: string;
    email: string;
    affiliation: string;
    orcid?: string;
    creditRoles: string[];
    /** The inviting client's address: invitation mails are limited per address. */
    fromAddress?: string;
  },
) {
  if (opts.fromAddress && env.AUTH_RATE_LIMIT) {
    const wait = await takeAttempt(db, [{ rule: RULES.invitationMailPerAddress, key: opts.fromAddress }]);
    if (wait !== null) throw new TooManyRequests(`Too many invitations sent in the last hour; nothing was sent. Wait ${waitInWords(wait)} and try again.`);
  }
  const token = randomBytes(24).toString("base64url");
  return db.transaction(async (tx) => {
    const [dupe] = await tx
      .select({ id: contributors.id })
      .from(contributors)
      .where(and(eq(contributors.submissionId, opts.submissionId), eq(contributors.email, opts.email)));
    if (dupe) throw new InvalidInput("This person is already listed.", [{ path: "email", message: "Already listed on this submission." }]);
    const [{ last } = { last: 0 }] = await tx.select({ last: max(contributors.position) }).from(contributors).where(eq(contributors.submissionId, opts.submissionId));
    const orcid = opts.orcid ? parseOrcid(opts.orcid) : null;
    await tx.insert(contributors).values({
      submissionId: opts.submissionId,
      position: (last ?? 0) + 1,
      name: opts.name,
      email: opts.email,
      affiliation: opts.affiliation,
      orcid: orcid?.ok ? orcid.value : null,
      creditRoles: opts.creditRoles,
      inviteTokenHash: hashToken(token),
      invitedAt: new Date(),
    });
    const [sub] = await tx.select({ title: submissions.title }).from(submissions).where(eq(submissions.id, opts.submissionId));
    const [inviter] = await tx.select({ name: user.name }).from(user).where(eq(user.id, opts.invitedBy));
    await enqueueMail(
      tx,
      opts.email,
      compose({
        subject: `You are listed as a co-author: ${sub!.title}`,
        greeting: `Hello ${opts.name},`,
        paragraphs: [
          `${inviter!.name} listed you as a co-author of "${sub!.title}" on Runproof.`,
          `Open the link to attach your account to the submission. If you have no account yet, create one with this address (${opts.email}) first, then open the link again.`,
        ],
        action: { label: "Join the submission", url: `${absoluteUrl(href("/submissions/:submissionId/join", { submissionId: opts.submissionId }))}?token=${token}` },
      }),
    );
  });
}

/**
 * Attaches the signed-in person to the contributor row the token names. The link works once, for
 * INVITE_VALID_DAYS, and only for an account with the confirmed address it was sent to; the
 * corresponding author can withdraw it. Nothing changes when it is refused.
 */
export async function acceptContributorInvite(
  db: Database,
  opts: { submissionId: string; token: string; userId: string; now?: Date },
): Promise<InviteAnswer> {
  const now = opts.now ?? new Date();
  const refuse = (reason: keyof typeof ANSWERS): InviteAnswer => ({ ok: false, reason, message: ANSWERS[reason] });
  if (!opts.token || opts.token.length > 200) return refuse("unknown");
  return db.transaction(async (tx) => {
    const [row] = await tx
      .select({ id: contributors.id, email: contributors.email, invitedAt: contributors.invitedAt })
      .from(contributors)
      .where(and(eq(contributors.submissionId, opts.submissionId), eq(contributors.inviteTokenHash, hashToken(opts.token)), isNull(contributors.userId)))
      .for("update");
    if (!row) return refuse("unknown");
    if (!row.invitedAt || now.getTime() - row.invitedAt.getTime() > INVITE_VALID_MS) return refuse("expired");
    const [person] = await tx.select({ email: user.email, verified: user.emailVerified }).from(user).where(eq(user.id, opts.userId));
    if (!person?.verified || person.email.trim().toLowerCase() !== row.email.trim().toLowerCase()) return refuse("other-address");
    const [claimed] = await tx
      .update(contributors)
      .set({ userId: opts.userId, inviteTokenHash: null })
      .where(and(eq(contributors.id, row.id), isNotNull(contributors.inviteTokenHash)))
      .returning({ id: contributors.id });
    if (!claimed) return refuse("unknown");
    await tx.insert(submissionMembers).values({ submissionId: opts.submissionId, userId: opts.userId, role: "co-author" }).onConflictDoNothing();
    return { ok: true };
  });
}

/** Withdraws a co-author's pending invitation: the link stops working; the person stays listed. */
export async function revokeContributorInvite(db: Database, opts: { submissionId: string; contributorId: string }): Promise<boolean> {
  const rows = await db
    .update(contributors)
    .set({ inviteTokenHash: null })
    .where(and(eq(contributors.id, opts.contributorId), eq(contributors.submissionId, opts.submissionId), isNotNull(contributors.inviteTokenHash), isNull(contributors.userId)))
    .returning({ id: contributors.id });
  return rows.length > 0;
}
