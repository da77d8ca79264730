import { eq, like } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { demoPeople, demoStages } from "~db/demo-data";
import { outbox, user } from "~db/schema";
import { periodKey } from "~/review/digest-grouping";
import { previewDigest, runDigests, sendDigestNow } from "~/review/digest.server";
import { makeSentRound } from "../../e2e/support/make-sent-round";
import { makeDecidedRound } from "../../e2e/support/make-decided-round";
import { testDatabase } from "../support/test-db";
import { dropQueuedMail } from "./outbox-cleanup";

const { db, sql } = testDatabase();
const title = `Digest ${Date.now()}`;
afterAll(async () => {
  await dropQueuedMail(db, title);
  await sql.end({ timeout: 5 });
});

describe("digest job", () => {
  it("queues one digest per person per period across several submissions, however often it runs", async () => {
    const coauthor = demoPeople.find((p) => p.key === "coauthor1")!;
    // Two submissions with fresh flags, both listing the co-author.
    const a = await makeSentRound(db, `${title}A`);
    const b = await makeSentRound(db, `${title}B`);
    const [before] = await db.select({ digest: user.digest, sentAt: user.digestSentAt }).from(user).where(eq(user.email, coauthor.email));
    await db.update(user).set({ digest: "daily", digestSentAt: new Date(Date.now() - 3600_000) }).where(eq(user.email, coauthor.email));
    // A day in the future, so this period's key is one no other test run used.
    const now = new Date(Date.now() + 400 * 86_400_000 + Math.floor(Math.random() * 1000) * 86_400_000);
    await runDigests(db, now, "daily");
    await runDigests(db, now, "daily");
    const key = `digest:${coauthor.email}:${periodKey("daily", now)}`;
    const rows = await db.select().from(outbox).where(like(outbox.dedupeKey, key));
    expect(rows).toHaveLength(1);
    expect(rows[0]!.textBody).toContain(`${title}A`);
    expect(rows[0]!.textBody).toContain(`${title}B`);
    expect(rows[0]!.textBody).toMatch(/mismatch flag\(s\)/);
    expect(a.submissionId).not.toBe(b.submissionId);
    await db.delete(outbox).where(eq(outbox.dedupeKey, key));
    await db.update(user).set({ digest: before!.digest, digestSentAt: before!.sentAt }).where(eq(user.email, coauthor.email));
  });
});

describe("digest preview and send-now", () => {
  it("previews the next digest without queueing it, and sends one submission's digest once per click", async () => {
    const coauthor = demoPeople.find((p) => p.key === "coauthor2")!;
    const fx = await makeSentRound(db, `${title}P`);
    const [me] = await db.select({ id: user.id, digest: user.digest, sentAt: user.digestSentAt }).from(user).where(eq(user.email, coauthor.email));
    await db.update(user).set({ digest: "weekly", digestSentAt: new Date(Date.now() - 3600_000) }).where(eq(user.id, me!.id));
    const queuedFor = async () => (await db.select({ id: outbox.id }).from(outbox).where(eq(outbox.toAddress, coauthor.email))).length;
    try {
      const before = await queuedFor();
      const preview = await previewDigest(db, me!.id);
      expect(preview!.frequency).toBe("weekly");
      expect(preview!.bySubmission.map((s) => s.title)).toContain(`${title}P`);
      expect(preview!.bySubmission.find((s) => s.title === `${title}P`)!.lines.join(" ")).toMatch(/flag\(s\) raised/);
      expect(await queuedFor()).toBe(before);

      const now = new Date();
      const first = await sendDigestNow(db, { submissionId: fx.submissionId, now });
      expect(first.queued).toBeGreaterThanOrEqual(1);
      // Who got it, by name and address, for the editor's confirmation.
      expect(first.sentTo.map((p) => p.email)).toContain(coauthor.email);
      const again = await sendDigestNow(db, { submissionId: fx.submissionId, now });
      expect(again.queued).toBe(0);
      const [mail] = await db.select().from(outbox).where(like(outbox.dedupeKey, `digest-now:${fx.submissionId}:${coauthor.email}:%`));
      expect(mail!.textBody).toContain(`${title}P`);
      // Only the one submission: the co-author's other submissions stay for the regular digest.
      expect(mail!.textBody).not.toContain(demoStages.sent.title);
    } finally {
      await db.update(user).set({ digest: me!.digest, digestSentAt: me!.sentAt }).where(eq(user.id, me!.id));
    }
  });
});

describe("what a digest holds", () => {
  it("lists new flags, released remarks and the decision since the person's last digest, and nothing from before it", async () => {
    const coauthor = demoPeople.find((p) => p.key === "coauthor1")!;
    const fx = await makeDecidedRound(db, `${title}D`);
    const [me] = await db.select({ id: user.id, digest: user.digest, sentAt: user.digestSentAt }).from(user).where(eq(user.email, coauthor.email));
    try {
      // Last digest an hour ago: the round's flags, its released remarks and the decision are all news.
      await db.update(user).set({ digest: "daily", digestSentAt: new Date(Date.now() - 3600_000) }).where(eq(user.id, me!.id));
      const fresh = await previewDigest(db, me!.id);
      const lines = fresh!.bySubmission.find((s) => s.submissionId === fx.submissionId)!.lines.join("\n");
      expect(lines).toMatch(/flag\(s\) raised/);
      expect(lines).toMatch(/reviewer remark\(s\) released/);
      expect(lines).toContain("decision released: Major revision");
      // Last digest after all of it: this submission has nothing new.
      await db.update(user).set({ digestSentAt: new Date(Date.now() + 1000) }).where(eq(user.id, me!.id));
      const later = await previewDigest(db, me!.id);
      expect(later!.bySubmission.find((s) => s.submissionId === fx.submissionId)).toBeUndefined();
    } finally {
      await db.update(user).set({ digest: me!.digest, digestSentAt: me!.sentAt }).where(eq(user.id, me!.id));
    }
  });

  it("sends one digest per person per period: the regular run marks it sent, and the next run finds nothing new", async () => {
    const coauthor = demoPeople.find((p) => p.key === "coauthor1")!;
    await makeSentRound(db, `${title}Q`);
    const [me] = await db.select({ id: user.id, digest: user.digest, sentAt: user.digestSentAt }).from(user).where(eq(user.email, coauthor.email));
    const now = new Date(Date.now() + 2000 * 86_400_000 + Math.floor(Math.random() * 1000) * 86_400_000);
    try {
      await db.update(user).set({ digest: "weekly", digestSentAt: new Date(Date.now() - 3600_000) }).where(eq(user.id, me!.id));
      await runDigests(db, now, "weekly");
      const [after] = await db.select({ sentAt: user.digestSentAt }).from(user).where(eq(user.id, me!.id));
      expect(after!.sentAt!.getTime()).toBe(now.getTime());
      // Later in the same period, with nothing new since: no second mail.
      const later = new Date(now.getTime() + 3600_000);
      await runDigests(db, later, "weekly");
      const rows = await db.select().from(outbox).where(like(outbox.dedupeKey, `digest:${coauthor.email}:${periodKey("weekly", now)}`));
      expect(rows).toHaveLength(1);
      await db.delete(outbox).where(eq(outbox.id, rows[0]!.id));
    } finally {
      await db.update(user).set({ digest: me!.digest, digestSentAt: me!.sentAt }).where(eq(user.id, me!.id));
    }
  });
});
