import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { createHash, randomBytes } from "node:crypto";
import { and, eq, isNull, max } from "drizzle-orm";
import { contributors, submissionMembers, submissions, user } from "~db/schema";
import type { Database } from "~db/client";
import { env } from "~/config/env.server";
import { parseOrcid } from "~/lib/orcid";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { InvalidInput } from "./types";

const hashToken = (t: string) => createHash("sha256").update(t).digest("hex");

/**
 * Lists a co-author and mails them a link that attaches their account (an existing one, or
 * one they create with that address) to the submission. Only the token's hash is stored.
 */
export async function inviteContributor(
  db: Database,
  opts: { submissionId: string; invitedBy: string; name: string; email: string; affiliation: string; orcid?: string; creditRoles: string[] },
) {
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

/** Attaches the signed-in person to the contributor row the token names; returns false if it names none. */
export async function acceptContributorInvite(db: Database, opts: { submissionId: string; token: string; userId: string }) {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(contributors)
      .set({ userId: opts.userId, inviteTokenHash: null })
      .where(and(eq(contributors.submissionId, opts.submissionId), eq(contributors.inviteTokenHash, hashToken(opts.token)), isNull(contributors.userId)))
      .returning({ id: contributors.id });
    if (!row) return false;
    await tx.insert(submissionMembers).values({ submissionId: opts.submissionId, userId: opts.userId, role: "co-author" }).onConflictDoNothing();
    return true;
  });
}
