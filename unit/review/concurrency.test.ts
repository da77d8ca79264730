import { and, eq, inArray, like } from "drizzle-orm";
import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import { afterAll, describe, expect, it } from "vitest";
import { demoPeople } from "~db/demo-data";
import { attachments, auditLog, claims, invitations, remarks, reviews, rounds, storedFiles, submissions, user, venueMembers } from "~db/schema";
import { env } from "~/config/env.server";
import { releaseDecision } from "~/review/decisions.server";
import { inviteReviewer, respondToInvitation } from "~/review/invitations.server";
import { newToken } from "~/review/link-tokens.server";
import { saveRemark } from "~/review/reviews.server";
import { attachCsv } from "~/workspace/attachments.server";
import { addRun } from "~/workspace/run-edits.server";
import { StateConflict } from "~/workspace/types";
import { makeDraftRound } from "../../e2e/support/make-draft-round";
import { makeSentRound } from "../../e2e/support/make-sent-round";
import { testDatabase } from "../support/test-db";
import { dropQueuedMail } from "./outbox-cleanup";

const { db, sql } = testDatabase();
const title = `Concurrency ${Date.now()}`;
const made: string[] = [];
afterAll(async () => {
  await dropQueuedMail(db, title);
  if (made.length) await db.delete(submissions).where(inArray(submissions.id, made));
  await sql.end({ timeout: 5 });
});

const letter = (text: string) => ({ type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text }] }] });
const idOf = async (key: string) => (await db.select({ id: user.id }).from(user).where(eq(user.email, demoPeople.find((p) => p.key === key)!.email)))[0]!.id;

describe("releasing a decision", () => {
  it("lets exactly one of two simultaneous releases through; the other gets a clear conflict", async () => {
    const fx = await makeSentRound(db, title);
    made.push(fx.submissionId);
    const [round] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
    const [editor] = await db.select({ userId: venueMembers.userId }).from(venueMembers).where(eq(venueMembers.venueId, fx.venueId));
    const attempt = (decision: "accept" | "reject") =>
      releaseDecision(db, { roundId: fx.roundId, decision, letter: letter(`Decision ${decision}`), expectedVersion: round!.version, editorId: editor!.userId });
    const results = await Promise.allSettled([attempt("accept"), attempt("reject")]);
    const ok = results.filter((r) => r.status === "fulfilled");
    const failed = results.filter((r): r is PromiseRejectedResult => r.status === "rejected");
    expect(ok).toHaveLength(1);
    expect(failed).toHaveLength(1);
    expect(failed[0]!.reason).toBeInstanceOf(StateConflict);
    expect((failed[0]!.reason as StateConflict).status).toBe(409);
    expect(String(failed[0]!.reason.message)).toMatch(/Another editor/);
    const [after] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
    expect(after!.state).toBe("decided");
    expect(after!.version).toBe(round!.version + 1);
    const released = await db.select().from(auditLog).where(eq(auditLog.submissionId, fx.submissionId));
    expect(released.filter((a) => a.action === "decision.released")).toHaveLength(1);
  });
});

describe("two reviewers writing on one claim at once", () => {
  it("keeps every remark of both, each with its own text", async () => {
    const fx = await makeSentRound(db, `${title} remarks`);
    made.push(fx.submissionId);
    const editorId = await idOf("editor");
    const [claim] = await db.select({ id: claims.id }).from(claims).where(eq(claims.roundId, fx.roundId)).limit(1);
    const reviewOf = async (key: "reviewer1" | "reviewer2") => {
      const inv = await inviteReviewer(db, { roundId: fx.roundId, email: demoPeople.find((p) => p.key === key)!.email, dueAt: new Date(Date.now() + 7 * 86_400_000), editorId });
      const { token, hash } = newToken();
      await db.update(invitations).set({ tokenHash: hash }).where(eq(invitations.id, inv.id));
      const userId = await idOf(key);
      await respondToInvitation(db, { token, answer: "accept", userId });
      return (await db.select().from(reviews).where(and(eq(reviews.roundId, fx.roundId), eq(reviews.reviewerId, userId))))[0]!;
    };
    const [one, two] = [await reviewOf("reviewer1"), await reviewOf("reviewer2")];
    // Ten remarks each, all sent at the same moment, on the same claim.
    const writes = [one, two].flatMap((review, r) =>
      Array.from({ length: 10 }, (_, i) => saveRemark(db, review, { anchorKind: "claim", anchorRef: claim!.id, body: letter(`reviewer ${r + 1} remark ${i}`) })),
    );
    await Promise.all(writes);
    for (const [r, review] of [one, two].entries()) {
      const rows = await db.select().from(remarks).where(eq(remarks.reviewId, review.id));
      const texts = rows.map((row) => JSON.stringify(row.body).match(/reviewer \d remark \d+/)![0]).sort();
      expect(texts).toEqual(Array.from({ length: 10 }, (_, i) => `reviewer ${r + 1} remark ${i}`).sort());
      expect(rows.every((row) => row.anchorRef === claim!.id)).toBe(true);
    }
  });
});

describe("fifty uploads to one round at once", () => {
  const s3 = new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
  });
  const csv = (n: number) => `t,kineticEnergy\n${Array.from({ length: 40 }, (_, i) => `${i / 10},${n + Math.sin(i)}`).join("\n")}\n`;
  const body = (text: string) => new Blob([text]).stream() as ReadableStream<Uint8Array>;

  it("stores all fifty, and for each run and kind exactly one file is the current one", async () => {
    const fx = await makeDraftRound(db, `${title} uploads`);
    made.push(fx.submissionId);
    const [round] = await db.select().from(rounds).where(eq(rounds.submissionId, fx.submissionId));
    const userId = await idOf("author");
    const runIds: string[] = [];
    for (let i = 0; i < 10; i++) {
      const { run } = await addRun(db, {
        submissionId: fx.submissionId, roundId: round!.id, origin: "form", userId,
        input: { format: "runproof.run/1", label: `up-${i}`, geometry: { radiusRatio: 0.35 }, conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" }, controls: { E: 1e-4, Ra: 1e7, Pr: 1 }, time: { start: 0, end: 3.9 } },
      });
      runIds.push(run.id);
    }
    const [before] = await db.select({ changeSeq: rounds.changeSeq }).from(rounds).where(eq(rounds.id, round!.id));
    // Ten runs, five series each: every upload of a run races the other four for "current".
    const uploads = Array.from({ length: 50 }, (_, n) =>
      attachCsv(db, { roundId: round!.id, runId: runIds[n % 10]!, kind: "series", body: body(csv(n)), filename: `series-${n}.csv`, userId, limitBytes: 1_000_000 }),
    );
    const results = await Promise.allSettled(uploads);
    expect(results.filter((r) => r.status === "rejected").map((r) => String((r as PromiseRejectedResult).reason))).toEqual([]);
    const rows = await db
      .select({ runVersionId: attachments.runVersionId, active: attachments.active, filename: storedFiles.filename })
      .from(attachments)
      .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
      .where(like(storedFiles.key, `attachments/${round!.id}/%`));
    expect(rows).toHaveLength(50);
    expect(new Set(rows.map((r) => r.filename)).size).toBe(50);
    const activePerVersion = new Map<string, number>();
    for (const r of rows) if (r.active) activePerVersion.set(r.runVersionId, (activePerVersion.get(r.runVersionId) ?? 0) + 1);
    expect([...activePerVersion.values()]).toEqual(Array(10).fill(1));
    const listed = await s3.send(new ListObjectsV2Command({ Bucket: env.S3_BUCKET, Prefix: `attachments/${round!.id}/` }));
    expect(listed.Contents?.length ?? 0).toBe(50);
    const [after] = await db.select({ changeSeq: rounds.changeSeq }).from(rounds).where(eq(rounds.id, round!.id));
    expect(after!.changeSeq - before!.changeSeq).toBe(50);
  });
});
