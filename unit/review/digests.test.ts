import { eq, like } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { demoPeople } from "~db/demo-data";
import { outbox, user } from "~db/schema";
import { periodKey } from "~/review/digest-grouping";
import { runDigests } from "~/review/digest.server";
import { makeSentRound } from "../../e2e/support/make-sent-round";
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
