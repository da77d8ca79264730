/**
 * Checking once at write (integration: test database, local S3 fake). A change marks the round
 * and queues its check; a worker's pass stores the new flags once; until then nothing stale is
 * presented as current; a second pass changes nothing; only what a change touches is re-checked.
 */
import { eq, sql as dsql } from "drizzle-orm";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { flags, rounds, submissions, user, venues } from "~db/schema";
import { env } from "~/config/env.server";
import { startJobs } from "~/jobs/boss.server";
import { QUEUES } from "~/jobs/queues";
import { roundRunRows } from "~/workspace/round-data.server";
import { recheckRound, roundCheckState } from "~/workspace/recheck.server";
import { addClaim, addRun, editRun } from "~/workspace/run-edits.server";
import { roundRunList } from "~/workspace/runs.server";
import { createSubmission } from "~/workspace/submissions.server";
import { testDatabase } from "../support/test-db";

const { db, sql } = testDatabase();
let ctx: { submissionId: string; roundId: string; userId: string };

// Pm = nu / eta = 1e-6 / 0.8e-6 = 1.25 (definition of the magnetic Prandtl number); stating 2 is a mismatch.
const run = (label: string, Pm = 2) => ({
  format: "runproof.run/1",
  label,
  geometry: { radiusRatio: 0.35 },
  conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
  controls: { E: 1e-4, Ra: 2e7, Pr: 1, Pm },
  material: { nu: "1e-6 m^2/s", eta: "0.8e-6 m^2/s", outerRadius: "1800 km" },
  time: { start: 0, end: 0.45 },
});
const claim = (label: string) => ({ record: { format: "runproof.claim/1", title: `About ${label}`, runs: [{ label, part: "reference" }] } });
const pmFlags = (label: string) =>
  db.select().from(flags).where(dsql`${flags.roundId} = ${ctx.roundId} and ${flags.runLabel} = ${label} and ${flags.rule} = 'A.pm-from-diffusivities'`);

beforeAll(async () => {
  const [author] = await db.select({ id: user.id }).from(user).where(eq(user.email, "author@demo.runproof.example"));
  const [venue] = await db.select({ id: venues.id }).from(venues).where(eq(venues.slug, "corvane-annals"));
  const created = await createSubmission(db, {
    venueId: venue!.id,
    userId: author!.id,
    fields: { title: `checks test ${Date.now()}`, abstract: "", keywords: [], availability: "", dois: [] },
  });
  const [round] = await db.select({ id: rounds.id }).from(rounds).where(eq(rounds.submissionId, created.submissionId));
  ctx = { submissionId: created.submissionId, roundId: round!.id, userId: author!.id };
  for (const label of ["R1", "R2"]) await addRun(db, { submissionId: ctx.submissionId, roundId: ctx.roundId, input: run(label), origin: "form", userId: ctx.userId });
  await addClaim(db, ctx.roundId, claim("R1"));
  await addClaim(db, ctx.roundId, claim("R2"));
});

afterAll(async () => {
  if (ctx) await db.delete(submissions).where(eq(submissions.id, ctx.submissionId));
  await sql.end({ timeout: 5 });
});

describe("checks stored once, incrementally", () => {
  it("a change leaves the round 'checking' and its run without numbers until the check lands", async () => {
    expect((await roundCheckState(db, ctx.roundId)).checking).toBe(true);
    const rows = await roundRunRows(db, ctx.roundId);
    expect(rows.map((r) => [r.label, r.checking, r.Pm])).toEqual([["R1", true, null], ["R2", true, null]]);
    expect(await recheckRound(db, ctx.roundId)).toEqual({ runsChecked: 2, claimsChecked: 2, checkError: null });
    expect((await roundCheckState(db, ctx.roundId)).checking).toBe(false);
    const after = await roundRunRows(db, ctx.roundId);
    expect(after.map((r) => [r.label, r.checking, r.Pm, r.mismatch > 0])).toEqual([["R1", false, 2, true], ["R2", false, 2, true]]);
  });

  it("a second pass finds nothing to do and leaves the flags as they are", async () => {
    const before = await db.select({ id: flags.id }).from(flags).where(eq(flags.roundId, ctx.roundId));
    expect(await recheckRound(db, ctx.roundId)).toEqual({ runsChecked: 0, claimsChecked: 0, checkError: null });
    const again = await db.select({ id: flags.id }).from(flags).where(eq(flags.roundId, ctx.roundId));
    expect(again.map((f) => f.id).sort()).toEqual(before.map((f) => f.id).sort());
  });

  it("a run change re-checks that run and only the claims that name it", async () => {
    const [r1] = (await roundRunList(db, ctx.roundId)).filter((r) => r.label === "R1");
    await editRun(db, { runId: r1!.runId, roundId: ctx.roundId, input: run("R1", 1.25), origin: "form", userId: ctx.userId, expectedVersion: 1 });
    expect(await recheckRound(db, ctx.roundId)).toEqual({ runsChecked: 1, claimsChecked: 1, checkError: null });
    expect(await pmFlags("R1")).toHaveLength(0);
    expect(await pmFlags("R2")).toHaveLength(1);
  });
});

describe("the check job (pg-boss, as `npm run worker` runs it)", () => {
  let boss: PgBoss;
  beforeAll(async () => {
    boss = await startJobs(db, { databaseUrl: env.DATABASE_URL, smtpHost: env.SMTP_HOST, smtpPort: env.SMTP_PORT, from: env.MAIL_FROM, pollMs: 500, deliverMail: false });
  });
  afterAll(async () => {
    await boss.stop({ graceful: true, timeout: 5000, wait: true });
    delete (globalThis as { __runproofJobs?: PgBoss }).__runproofJobs;
  });

  it("an edit returns at once with a queued job; a worker stores the flags once; stale flags are never current", async () => {
    const [r2] = (await roundRunList(db, ctx.roundId)).filter((r) => r.label === "R2");
    await editRun(db, { runId: r2!.runId, roundId: ctx.roundId, input: run("R2", 1.25), origin: "form", userId: ctx.userId, expectedVersion: 1 });
    const [current] = (await roundRunList(db, ctx.roundId)).filter((r) => r.label === "R2");
    // Right after the edit: the old version's mismatch is still stored, but the round and the run say "checking".
    const early = await roundRunRows(db, ctx.roundId);
    if ((await pmFlags("R2")).length > 0) {
      expect((await roundCheckState(db, ctx.roundId)).checking).toBe(true);
      expect(early.find((r) => r.label === "R2")!.checking).toBe(true);
    }
    const deadline = Date.now() + 20_000;
    while ((await roundCheckState(db, ctx.roundId)).checking && Date.now() < deadline) await new Promise((r) => setTimeout(r, 200));
    expect((await roundCheckState(db, ctx.roundId)).checking).toBe(false);
    expect(await pmFlags("R2")).toHaveLength(0);
    // Every run flag now stored for R2 belongs to the version the round uses.
    const stored = await db.select({ v: flags.runVersionId }).from(flags).where(dsql`${flags.roundId} = ${ctx.roundId} and ${flags.runLabel} = 'R2' and ${flags.claimId} is null`);
    expect(stored.every((f) => f.v === current!.versionId)).toBe(true);
    // One job for this round ran (stately queue, singleton key = round id), and it completed.
    const jobs = await sql`select state from pgboss.job where name = ${QUEUES.recheck} and singleton_key = ${ctx.roundId}`;
    expect(jobs.map((j) => j.state)).toEqual(["completed"]);
    expect(await recheckRound(db, ctx.roundId)).toEqual({ runsChecked: 0, claimsChecked: 0, checkError: null });
  });
});
