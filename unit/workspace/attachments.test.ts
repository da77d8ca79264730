import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import { and, eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { attachments, flags, rounds, storedFiles, submissions, user, venues } from "~db/schema";
import { env } from "~/config/env.server";
import { attachCsv } from "~/workspace/attachments.server";
import { recheckRound } from "~/workspace/recheck.server";
import { addRun, editRun } from "~/workspace/run-edits.server";
import { roundRunList } from "~/workspace/runs.server";
import { createSubmission } from "~/workspace/submissions.server";
import { InvalidInput, PayloadTooLarge } from "~/workspace/types";
import { testDatabase } from "../support/test-db";

// Integration: the test database and the local S3 fake (`bash scripts/services.sh up`).
const { db, sql } = testDatabase();
const s3 = new S3Client({
  endpoint: env.S3_ENDPOINT,
  region: env.S3_REGION,
  forcePathStyle: env.S3_FORCE_PATH_STYLE,
  credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
});
let ctx: { submissionId: string; roundId: string; runId: string; userId: string };

const stream = (text: string, chunk = 7) =>
  new ReadableStream<Uint8Array>({
    start(c) {
      const bytes = new TextEncoder().encode(text);
      for (let i = 0; i < bytes.length; i += chunk) c.enqueue(bytes.slice(i, i + chunk));
      c.close();
    },
  });

async function objectsOfRound() {
  const out = await s3.send(new ListObjectsV2Command({ Bucket: env.S3_BUCKET, Prefix: `attachments/${ctx.roundId}/` }));
  return out.Contents?.length ?? 0;
}
const attachmentRows = () => db.select().from(attachments).innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId)).where(like(storedFiles.key, `attachments/${ctx.roundId}/%`));

const series = (rows: number) => ["t,kineticEnergy", ...Array.from({ length: rows }, (_, i) => `${i / 10},${100 + Math.sin(i)}`)].join("\r\n") + "\r\n";

beforeAll(async () => {
  const [author] = await db.select({ id: user.id }).from(user).where(eq(user.email, "author@demo.runproof.example"));
  const [venue] = await db.select({ id: venues.id }).from(venues).where(eq(venues.slug, "corvane-annals"));
  const created = await createSubmission(db, {
    venueId: venue!.id,
    userId: author!.id,
    fields: { title: `attachCsv test ${Date.now()}`, abstract: "", keywords: [], availability: "", dois: [] },
  });
  const [round] = await db.select({ id: rounds.id }).from(rounds).where(eq(rounds.submissionId, created.submissionId));
  const { run } = await addRun(db, {
    submissionId: created.submissionId,
    roundId: round!.id,
    origin: "form",
    userId: author!.id,
    input: {
      format: "runproof.run/1",
      label: "csv-run",
      geometry: { radiusRatio: 0.35 },
      conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
      controls: { E: 1e-4, Ra: 1e7, Pr: 1 },
      time: { start: 0, end: 4.9 },
    },
  });
  ctx = { submissionId: created.submissionId, roundId: round!.id, runId: run.id, userId: author!.id };
});

afterAll(async () => {
  if (ctx) await db.delete(submissions).where(eq(submissions.id, ctx.submissionId));
  await sql.end({ timeout: 5 });
});

describe("attachCsv", () => {
  const opts = () => ({ roundId: ctx.roundId, runId: ctx.runId, kind: "series" as const, filename: "s.csv", userId: ctx.userId, limitBytes: 1_000_000 });

  it("refuses a bad row with its line number and leaves nothing behind", async () => {
    const bad = "t,kineticEnergy\r\n0,1\r\n0.1,2\r\n0.2,x\r\n";
    const err = await attachCsv(db, { ...opts(), body: stream(bad) }).catch((e) => e);
    expect(err).toBeInstanceOf(InvalidInput);
    expect((err as InvalidInput).issues[0]!.path).toBe("line 4");
    expect(await attachmentRows()).toHaveLength(0);
    expect(await objectsOfRound()).toBe(0);
  });

  it("stops reading at the size limit and leaves nothing behind", async () => {
    const err = await attachCsv(db, { ...opts(), limitBytes: 200, body: stream(series(100)) }).catch((e) => e);
    expect(err).toBeInstanceOf(PayloadTooLarge);
    expect((err as Error).message).toMatch(/larger than the upload limit/);
    expect(await attachmentRows()).toHaveLength(0);
    expect(await objectsOfRound()).toBe(0);
  });

  it("stores the file and the parsed columns, keeps one active per kind, and re-checks the round", async () => {
    const first = await attachCsv(db, { ...opts(), body: stream(series(50)) });
    expect(first).toMatchObject({ rowCount: 50, columns: ["t", "kineticEnergy"] });
    const second = await attachCsv(db, { ...opts(), body: stream(series(60), 4096) });
    expect(second.rowCount).toBe(60);
    const rows = await attachmentRows();
    expect(rows).toHaveLength(2);
    expect(rows.filter((r) => r.attachments.active).map((r) => r.attachments.id)).toEqual([second.attachmentId]);
    expect(rows.find((r) => r.attachments.id === second.attachmentId)!.stored_files.size).toBe(new TextEncoder().encode(series(60)).byteLength);
    expect(await objectsOfRound()).toBe(2);
    // The upload only queued the check; the worker's pass analyses the active file once.
    expect(rows.every((r) => r.attachments.analysis === null)).toBe(true);
    await recheckRound(db, ctx.roundId);
    const [analysed] = await db.select().from(attachments).where(eq(attachments.id, second.attachmentId));
    expect(analysed!.analysis).toMatchObject({ kind: "series", stats: { rows: 60, tStart: 0, tEnd: 5.9 } });
    expect(analysed!.plot!.points.kineticEnergy).toHaveLength(60);
    // The series (t = 0 … 5.9) disagrees with the record's time (0 … 4.9): the checker saw the upload.
    const spans = await db.select().from(flags).where(and(eq(flags.roundId, ctx.roundId), eq(flags.rule, "D.series-span")));
    expect(spans).toHaveLength(1);
  });

  it("streams a large series through storage and the parser in one pass", async () => {
    const text = series(200_000);
    const t0 = Date.now();
    const out = await attachCsv(db, { ...opts(), limitBytes: 50 * 1024 * 1024, body: stream(text, 64 * 1024) });
    expect(out.rowCount).toBe(200_000);
    expect(Date.now() - t0).toBeLessThan(15_000);
    const [row] = (await attachmentRows()).filter((r) => r.attachments.id === out.attachmentId);
    expect(row!.stored_files.size).toBe(new TextEncoder().encode(text).byteLength);
    // Put the smaller one back as the active series for the next case.
    await attachCsv(db, { ...opts(), body: stream(series(60), 4096) });
  });

  it("a new version of the run keeps the active attachments, and the round points at it", async () => {
    const [before] = await roundRunList(db, ctx.roundId);
    const record = { ...(before!.record as Record<string, unknown>), time: { start: 0, end: 5.9 } };
    await editRun(db, { runId: ctx.runId, roundId: ctx.roundId, input: record, origin: "form", userId: ctx.userId, expectedVersion: 1 });
    const [after] = await roundRunList(db, ctx.roundId);
    expect(after!.version).toBe(2);
    const kept = await db.select().from(attachments).where(and(eq(attachments.runVersionId, after!.versionId), eq(attachments.active, true)));
    expect(kept.map((k) => k.rowCount)).toEqual([60]);
    // The time now matches the series, so the span flag is gone after the re-check.
    await recheckRound(db, ctx.roundId);
    expect(await db.select().from(flags).where(and(eq(flags.roundId, ctx.roundId), eq(flags.rule, "D.series-span")))).toHaveLength(0);
  });
});
