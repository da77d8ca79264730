import { eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { flags, roundRuns, submissions, user, venues } from "~db/schema";
import { seedDemoRound } from "~db/seed-round";
import { parseEnv } from "~/config/env-schema";
import { createSubmission } from "~/workspace/submissions.server";
import { testDatabase } from "../support/test-db";

const { db, sql } = testDatabase();
let submissionId: string | undefined;

afterAll(async () => {
  if (submissionId) await db.delete(submissions).where(eq(submissions.id, submissionId));
  await sql.end({ timeout: 5 });
});

// The brief's demo must show its deliberate problems right after seeding (product brief, "Demo scenario").
describe("the demo round", () => {
  it("carries the brief's deliberate problems, and seeding twice changes nothing", async () => {
    const [author] = await db.select({ id: user.id }).from(user).where(eq(user.email, "author@demo.runproof.example"));
    const [venue] = await db.select({ id: venues.id }).from(venues).where(eq(venues.slug, "corvane-annals"));
    ({ submissionId } = await createSubmission(db, {
      venueId: venue!.id,
      userId: author!.id,
      fields: { title: `demo seed test ${Date.now()}`, abstract: "", keywords: [], availability: "", dois: [] },
    }));
    const env = parseEnv(process.env);
    const first = await db.transaction((tx) => seedDemoRound(tx, env, { submissionId: submissionId!, authorId: author!.id }));
    expect(first.created).toBe(true);
    const found = await db.select({ rule: flags.rule, severity: flags.severity, run: flags.runLabel, message: flags.message }).from(flags).where(eq(flags.roundId, first.roundId));
    const has = (rule: string, run: string, severity: string) => found.some((f) => f.rule === rule && f.run === run && f.severity === severity);
    expect(has("A.pm-from-diffusivities", "strat-B", "mismatch"), "stated Pm against ν/η").toBe(true);
    expect(has("D.min-magnetic-times", "strat-C", "caution"), "too short in magnetic times").toBe(true);
    expect(has("F.spectrum-decay", "strat-C", "caution"), "spectrum falls less than two decades").toBe(true);
    expect(found.some((f) => f.rule === "G.undeclared-difference" && f.message.includes("controls.Ra")), "undeclared difference in a comparison").toBe(true);

    const again = await db.transaction((tx) => seedDemoRound(tx, env, { submissionId: submissionId!, authorId: author!.id }));
    expect(again).toEqual({ roundId: first.roundId, created: false });
    expect(await db.select().from(roundRuns).where(eq(roundRuns.roundId, first.roundId))).toHaveLength(3);
  });
});
