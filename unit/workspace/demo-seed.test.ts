import { eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { demoStages, demoSubmission } from "~db/demo-data";
import { auditLog, flags, invitations, reviews, roundRuns, rounds, submissions, user, venues } from "~db/schema";
import { seed } from "~db/seed";
import { dashboardFor } from "~/dashboard/queries.server";
import { roleSummary } from "~/auth/roles.server";
import { myReviews } from "~/review/dashboard.server";
import { deskQueue } from "~/review/desk.server";
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

// The demo at every stage of the cycle (issue: a demo sign-in must land on something to do).
describe("the seeded demo", () => {
  it("seeds every stage once: a second run adds nothing and every demo sign-in has something to do", async () => {
    const count = async () => ({
      submissions: (await db.select({ id: submissions.id }).from(submissions)).length,
      rounds: (await db.select({ id: rounds.id }).from(rounds)).length,
      reviews: (await db.select({ id: reviews.id }).from(reviews)).length,
      invitations: (await db.select({ id: invitations.id }).from(invitations)).length,
      audit: (await db.select({ id: auditLog.id }).from(auditLog)).length,
    });
    const before = await count();
    const again = await seed(db);
    expect(again.stages).toEqual([]);
    expect(await count()).toEqual(before);

    const stageOf = async (title: string) =>
      db
        .select({ stage: submissions.stage, number: rounds.number, state: rounds.state, decision: rounds.decision, venue: venues.slug, blinding: venues.blinding })
        .from(submissions)
        .innerJoin(rounds, eq(rounds.submissionId, submissions.id))
        .innerJoin(venues, eq(venues.id, submissions.venueId))
        .where(eq(submissions.title, title))
        .orderBy(rounds.number);
    expect(await stageOf(demoSubmission.title)).toMatchObject([{ stage: "draft", state: "draft" }]);
    expect(await stageOf(demoStages.sent.title)).toMatchObject([{ stage: "with-editor", state: "sent" }]);
    expect(await stageOf(demoStages.underReview.title)).toMatchObject([{ stage: "in-review", state: "under-review" }]);
    expect(await stageOf(demoStages.majorRevision.title)).toMatchObject([
      { number: 1, state: "decided", decision: "major-revision" },
      { number: 2, state: "draft" },
    ]);
    expect(await stageOf(demoStages.accepted.title)).toMatchObject([{ stage: "decided", state: "decided", decision: "accept" }]);
    expect(await stageOf(demoStages.blind.title)).toMatchObject([{ blinding: "double", state: "under-review" }]);

    const id = (key: string) => again.ids[key as keyof typeof again.ids];
    // Reports: under review has one report in and one being written.
    const [under] = await db.select({ id: rounds.id }).from(rounds).innerJoin(submissions, eq(submissions.id, rounds.submissionId)).where(eq(submissions.title, demoStages.underReview.title));
    const states = (await db.select({ state: reviews.state }).from(reviews).where(eq(reviews.roundId, under!.id))).map((r) => r.state).sort();
    expect(states).toEqual(["in-progress", "submitted"]);

    // Something to do for each sign-in listed in the README.
    for (const key of ["author", "coauthor1", "coauthor2"]) {
      const d = await dashboardFor(db, id(key), await roleSummary(db, { id: id(key) }));
      expect([...d.authored.items, ...d.coAuthored.items].some((s) => s.stage === "draft"), `${key} has a draft to work on`).toBe(true);
    }
    for (const key of ["reviewer1", "reviewer2"]) expect((await myReviews(db, id(key))).items.some((r) => r.state === "in-progress"), `${key} has a report to write`).toBe(true);
    const queue = await deskQueue(db, again.venueId);
    expect(queue.some((q) => q.state === "sent"), "the editor has a round to find reviewers for").toBe(true);
    expect((await deskQueue(db, again.blindVenueId)).some((q) => q.state === "under-review"), "the second editor has a round under review").toBe(true);
    const [admin] = await db.select({ role: user.role }).from(user).where(eq(user.id, id("admin")));
    expect(admin!.role).toBe("admin");
  }, 180_000);
});
