/**
 * Runs in bulk, duplicates and deletions against the test database: an import is all or nothing
 * (row counts before and after), every problem names its file, record and field; a copy gets a
 * label of its own; a run that claims name is not deleted; a draft submission goes with its rows.
 */
import { and, count, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { claims, roundRuns, rounds, runs, runVersions, submissions, user, venues } from "~db/schema";
import { addClaim, addRun } from "~/workspace/run-edits.server";
import { BULK_LIMITS, checkBulkBounds, importRuns, labelFromFileName, recordsFromJsonFiles, recordsFromNamelists } from "~/workspace/run-import.server";
import { deleteDraftSubmission, deleteRun } from "~/workspace/removals.server";
import { copyLabel, duplicateRun } from "~/workspace/run-template.server";
import { createSubmission } from "~/workspace/submissions.server";
import { InvalidInput, PayloadTooLarge, StateConflict } from "~/workspace/types";
import { testDatabase } from "../support/test-db";

const { db, sql } = testDatabase();
let ctx: { submissionId: string; roundId: string; userId: string };

const record = (label: string, extra: Record<string, unknown> = {}) => ({
  format: "runproof.run/1",
  label,
  geometry: { radiusRatio: 0.35 },
  conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
  controls: { E: 1e-4, Ra: 2e7, Pr: 1, Pm: 2 },
  ...extra,
});

const runCount = async () => (await db.select({ n: count() }).from(runs).where(eq(runs.submissionId, ctx.submissionId)))[0]!.n;
const versionCount = async () =>
  (await db.select({ n: count() }).from(runVersions).innerJoin(runs, eq(runs.id, runVersions.runId)).where(eq(runs.submissionId, ctx.submissionId)))[0]!.n;

async function newDraft(title: string) {
  const [author] = await db.select({ id: user.id }).from(user).where(eq(user.email, "author@demo.runproof.example"));
  const [venue] = await db.select({ id: venues.id }).from(venues).where(eq(venues.slug, "corvane-annals"));
  const created = await createSubmission(db, { venueId: venue!.id, userId: author!.id, fields: { title, abstract: "", keywords: [], availability: "", dois: [] } });
  const [round] = await db.select({ id: rounds.id }).from(rounds).where(eq(rounds.submissionId, created.submissionId));
  return { submissionId: created.submissionId, roundId: round!.id, userId: author!.id };
}

beforeAll(async () => {
  ctx = await newDraft(`bulk import test ${Date.now()}`);
});

afterAll(async () => {
  if (ctx) await db.delete(submissions).where(eq(submissions.id, ctx.submissionId));
  await sql.end({ timeout: 5 });
});

const importJson = (files: { name: string; text: string }[]) =>
  importRuns(db, { ...ctx, origin: "json", ...recordsFromJsonFiles(files) });

describe("importing many runs", () => {
  it("stores nothing when one record of one file is bad, and names the file, record, label and field", async () => {
    const before = [await runCount(), await versionCount()];
    const err = await importJson([
      { name: "survey-a.json", text: JSON.stringify([record("bulk-1"), record("bulk-2")]) },
      { name: "survey-b.json", text: JSON.stringify([record("bulk-3"), record("bulk-4", { controls: { E: "small" } })]) },
      { name: "single.json", text: JSON.stringify(record("bulk-5")) },
    ]).catch((e) => e);
    expect(err).toBeInstanceOf(InvalidInput);
    expect((err as InvalidInput).message).toMatch(/1 problem.*nothing was stored/);
    expect((err as InvalidInput).issues).toEqual([{ path: 'survey-b.json, record 2 ("bulk-4") › controls.E', message: expect.stringMatching(/number/i) }]);
    expect([await runCount(), await versionCount()]).toEqual(before);
  });

  it("names a JSON syntax error by file, line and column, and a label used twice by both places", async () => {
    const err = await importJson([
      { name: "broken.json", text: '{\n  "format": "runproof.run/1",\n  "label": "x"\n  "geometry": {}\n}' },
      { name: "one.json", text: JSON.stringify(record("twice")) },
      { name: "two.json", text: JSON.stringify([record("other"), record("twice")]) },
    ]).catch((e) => e);
    expect(err).toBeInstanceOf(InvalidInput);
    const paths = (err as InvalidInput).issues.map((i) => i.path);
    expect(paths[0]).toMatch(/^broken\.json › line 4, column \d+$/);
    expect((err as InvalidInput).issues).toContainEqual({ path: 'two.json, record 2 ("twice") › label', message: 'the label is also used by one.json ("twice"); labels are unique within a submission' });
    expect(await runCount()).toBe(0);
  });

  it("stores every run of several files in one go, then refuses a second import that reuses a label", async () => {
    const created = await importJson([
      { name: "survey-a.json", text: JSON.stringify([record("bulk-1"), record("bulk-2")]) },
      { name: "single.json", text: JSON.stringify(record("bulk-3")) },
    ]);
    expect(created.map((c) => c.label)).toEqual(["bulk-1", "bulk-2", "bulk-3"]);
    expect(await runCount()).toBe(3);
    const [round] = await db.select({ changeSeq: rounds.changeSeq }).from(rounds).where(eq(rounds.id, ctx.roundId));
    expect(round!.changeSeq).toBeGreaterThan(0); // the round is marked for its check
    const err = await importJson([{ name: "again.json", text: JSON.stringify([record("bulk-9"), record("bulk-2")]) }]).catch((e) => e);
    expect((err as InvalidInput).issues).toEqual([{ path: 'again.json, record 2 ("bulk-2") › label', message: expect.stringContaining("already exists") }]);
    expect(await runCount()).toBe(3);
  });

  it("imports namelists with one key map, the label from the file name, all or nothing", async () => {
    const map = { ek: "controls.E", ra: "controls.Ra", pr: "controls.Pr", prmag: "controls.Pm", radratio: "geometry.radiusRatio" };
    const base = { format: "runproof.run/1", conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" } };
    // ISO/IEC 1539 NAMELIST input, with a D exponent
    const nl = (ek: string) => `&phys_param\n  ek = ${ek}, ra = 2.0e7, pr = 1.0, prmag = 2.0, radratio = 0.35\n/\n`;
    const bad = recordsFromNamelists([{ name: "nl-1.nml", text: nl("1.0d-4") }, { name: "nl-2.nml", text: `${nl("3.0d-5")}&extra\n  omega = 2\n/\n` }], map, base);
    const err = await importRuns(db, { ...ctx, origin: "namelist", ...bad }).catch((e) => e);
    expect((err as InvalidInput).issues).toEqual([{ path: "nl-2.nml › &extra omega", message: expect.stringContaining('add "omega = <run-record path>"') }]);
    expect(await runCount()).toBe(3);
    const good = recordsFromNamelists([{ name: "nl-1.nml", text: nl("1.0d-4") }, { name: "dir/nl-2.nml", text: nl("3.0D-5") }], map, base);
    const created = await importRuns(db, { ...ctx, origin: "namelist", ...good });
    expect(created.map((c) => c.label)).toEqual(["nl-1", "nl-2"]);
    const [v] = await db.select({ record: runVersions.record }).from(runVersions).where(eq(runVersions.runId, created[1]!.runId));
    expect((v!.record as { controls: { E: number } }).controls.E).toBe(3e-5); // 3.0D-5 per ISO/IEC 1539
  });

  it("bounds the number of files and bytes before reading any", () => {
    expect(() => checkBulkBounds([])).toThrow(InvalidInput);
    expect(() => checkBulkBounds(Array.from({ length: BULK_LIMITS.files + 1 }, (_, i) => ({ name: `f${i}.json`, size: 10 })))).toThrow(/at most 50/);
    expect(() => checkBulkBounds([{ name: "huge.json", size: BULK_LIMITS.fileBytes + 1 }])).toThrow(PayloadTooLarge);
    expect(() => checkBulkBounds(Array.from({ length: 6 }, (_, i) => ({ name: `f${i}.json`, size: BULK_LIMITS.fileBytes })))).toThrow(/add up to/);
    const many = JSON.stringify(Array.from({ length: BULK_LIMITS.records + 1 }, (_, i) => record(`r${i}`)));
    expect(() => recordsFromJsonFiles([{ name: "many.json", text: many }])).toThrow(/more than 200 run records/);
    expect(labelFromFileName("runs/strat-B.nml")).toBe("strat-B");
  });
});

describe("duplicating and deleting", () => {
  it("a copy gets '<label> (copy)', then '(copy 2)', and never passes the label limit", async () => {
    expect(copyLabel("ref-A", new Set())).toBe("ref-A (copy)");
    expect(copyLabel("ref-A", new Set(["ref-A (copy)"]))).toBe("ref-A (copy 2)");
    expect(copyLabel("x".repeat(200), new Set())).toHaveLength(200);
    const [source] = await db.select({ id: runs.id }).from(runs).where(and(eq(runs.submissionId, ctx.submissionId), eq(runs.label, "bulk-1")));
    const first = await duplicateRun(db, { ...ctx, runId: source!.id });
    const second = await duplicateRun(db, { ...ctx, runId: source!.id });
    expect([first.run.label, second.run.label]).toEqual(["bulk-1 (copy)", "bulk-1 (copy 2)"]);
    expect((first.version.record as { controls: unknown }).controls).toEqual(record("x").controls);
    expect(first.version.origin).toBe("copy");
  });

  it("refuses to delete a run that a claim names, naming the claim; deletes it once the claim is gone", async () => {
    const [run] = await db.select({ id: runs.id }).from(runs).where(and(eq(runs.submissionId, ctx.submissionId), eq(runs.label, "bulk-2")));
    const claim = await addClaim(db, ctx.roundId, {
      figure: "Fig. 3",
      record: { format: "runproof.claim/1", title: "Same Ekman number", runs: [{ label: "bulk-2", part: "reference" }, { label: "bulk-3", part: "varied" }], varies: ["stableLayer"], stated: [{ quantity: "E", value: "1e-4" }] },
    });
    const before = await runCount();
    const err = await deleteRun(db, { roundId: ctx.roundId, runId: run!.id }).catch((e) => e);
    expect(err).toBeInstanceOf(StateConflict);
    expect((err as Error).message).toMatch(/Run "bulk-2" is named by the claim "Fig\. 3: Same Ekman number"; nothing was deleted/);
    expect(await runCount()).toBe(before);
    await db.delete(claims).where(eq(claims.id, claim.id));
    await deleteRun(db, { roundId: ctx.roundId, runId: run!.id });
    expect(await runCount()).toBe(before - 1);
    expect(await db.select().from(roundRuns).where(eq(roundRuns.runId, run!.id))).toHaveLength(0);
  });

  it("deletes a never-sent draft submission with everything in it, and refuses once it was sent", async () => {
    const draft = await newDraft(`draft to delete ${Date.now()}`);
    await addRun(db, { ...draft, input: record("only"), origin: "form" });
    await deleteDraftSubmission(db, draft.submissionId);
    expect(await db.select().from(submissions).where(eq(submissions.id, draft.submissionId))).toHaveLength(0);
    expect(await db.select().from(runs).where(eq(runs.submissionId, draft.submissionId))).toHaveLength(0);

    const sent = await newDraft(`sent, kept ${Date.now()}`);
    await db.update(rounds).set({ state: "sent" }).where(eq(rounds.id, sent.roundId));
    await db.update(submissions).set({ stage: "with-editor" }).where(eq(submissions.id, sent.submissionId));
    await expect(deleteDraftSubmission(db, sent.submissionId)).rejects.toThrow(/was sent to the editor/);
    expect(await db.select().from(submissions).where(eq(submissions.id, sent.submissionId))).toHaveLength(1);
    await expect(deleteRun(db, { roundId: sent.roundId, runId: "00000000-0000-4000-8000-000000000000" })).rejects.toThrow(/frozen/);
    await db.delete(submissions).where(eq(submissions.id, sent.submissionId));
  });
});
