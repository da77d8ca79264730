import ICAL from "ical.js";
import { and, desc, eq, like } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { demoPeople } from "~db/demo-data";
import { auditLog, outbox, user } from "~db/schema";
import { env } from "~/config/env.server";
import { conflictCheck, invitationByToken, inviteReviewer, resendInvitation, respondToInvitation, withdrawInvitation } from "~/review/invitations.server";
import { auditEntryLabel } from "~/review/labels";
import { StateConflict } from "~/workspace/types";
import { makeSentRound } from "../../e2e/support/make-sent-round";
import { testDatabase } from "../support/test-db";
import { dropQueuedMail } from "./outbox-cleanup";

const { db, sql } = testDatabase();
const title = `Invitation lifecycle ${Date.now()}`;
afterAll(async () => {
  await dropQueuedMail(db, title);
  await sql.end({ timeout: 5 });
});

const person = (key: string) => demoPeople.find((p) => p.key === key)!;
const tokenIn = (text: string) => /\/invitations\/([A-Za-z0-9_-]+)\?answer=accept/.exec(text)?.[1];

async function mailFor(dedupeKey: string) {
  const [m] = await db.select().from(outbox).where(eq(outbox.dedupeKey, dedupeKey));
  expect(m, dedupeKey).toBeTruthy();
  return m!;
}

describe("invitations: resend, withdraw, calendar, conflicts", () => {
  it("resends with a fresh link, withdraws so the link says so, and the calendar points at the review page", async () => {
    const fx = await makeSentRound(db, title);
    const [editor] = await db.select().from(user).where(eq(user.email, person("editor").email));
    const email = person("reviewer2").email;
    const inv = await inviteReviewer(db, { roundId: fx.roundId, email, dueAt: new Date(Date.now() + 14 * 86_400_000), editorId: editor!.id });

    const first = await mailFor(`invite:${inv.id}`);
    const oldToken = tokenIn(first.textBody);
    expect(oldToken).toBeTruthy();
    // The calendar entry, read with ical.js (an independent RFC 5545 parser), links to the stable review page.
    const ics = Buffer.from(first.attachments[0]!.contentBase64, "base64").toString("utf8");
    const event = new ICAL.Event(new ICAL.Component(ICAL.parse(ics)).getFirstSubcomponent("vevent")!);
    const reviewUrl = `${env.APP_URL}/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/review`;
    expect(event.component.getFirstPropertyValue("url")).toBe(reviewUrl);
    expect(event.description).toContain(reviewUrl);
    expect(ics).not.toContain("/invitations/");

    await resendInvitation(db, { roundId: fx.roundId, invitationId: inv.id, editorId: editor!.id });
    const [again] = await db.select().from(outbox).where(and(eq(outbox.toAddress, email), like(outbox.subject, `Reminder: invitation to review "${title}"%`)));
    expect(again, "the resent mail").toBeTruthy();
    const newToken = tokenIn(again!.textBody)!;
    expect(newToken).not.toBe(oldToken);
    expect((await invitationByToken(db, oldToken!)).problem).toMatch(/not valid.*most recent mail/);
    expect((await invitationByToken(db, newToken)).problem).toBeNull();

    await withdrawInvitation(db, { roundId: fx.roundId, invitationId: inv.id, editorId: editor!.id });
    expect((await invitationByToken(db, newToken)).problem).toMatch(/withdrew this invitation/);
    await expect(respondToInvitation(db, { token: newToken, answer: "decline", userId: null })).rejects.toThrow(/withdrew/);
    await expect(withdrawInvitation(db, { roundId: fx.roundId, invitationId: inv.id, editorId: editor!.id })).rejects.toBeInstanceOf(StateConflict);
    await expect(resendInvitation(db, { roundId: fx.roundId, invitationId: inv.id, editorId: editor!.id })).rejects.toThrow(/withdrawn by the editor/);
    expect((await mailFor(`invite-withdrawn:${inv.id}`)).toAddress).toBe(email);

    const entries = await db.select().from(auditLog).where(eq(auditLog.submissionId, fx.submissionId)).orderBy(desc(auditLog.at));
    const words = entries.map((e) => auditEntryLabel(e.action, e.detail));
    expect(words).toContain(`Invitation to ${email} for round 1 withdrawn`);
    expect(words).toContain(`Invitation to ${email} for round 1 sent again`);
    expect(words).toContain("Round 1 sent to the editor");
  });

  it("refuses to resend or withdraw an invitation of another round", async () => {
    const fx = await makeSentRound(db, `${title} other`);
    const [editor] = await db.select().from(user).where(eq(user.email, person("editor").email));
    const inv = await inviteReviewer(db, { roundId: fx.roundId, email: "someone@elsewhere.example", dueAt: new Date(Date.now() + 7 * 86_400_000), editorId: editor!.id });
    const other = await makeSentRound(db, `${title} third`);
    await expect(withdrawInvitation(db, { roundId: other.roundId, invitationId: inv.id, editorId: editor!.id })).rejects.toThrow(/No such invitation in this round/);
  });

  it("names each person sharing the affiliation once", async () => {
    const fx = await makeSentRound(db, `${title} conflicts`);
    // reviewer1 shares the Quell Observatory with coauthor2, who is both a member and a listed contributor.
    const { blocked, warnings } = await conflictCheck(db, fx.submissionId, person("reviewer1").email);
    expect(blocked).toBeNull();
    expect(warnings).toHaveLength(1);
    expect(warnings[0]!.split(person("coauthor2").name).length - 1).toBe(1);
  });
});
