/**
 * Data for `npm run bench`, made through the domain services (the rows are what the app itself
 * stores) except where only volume matters (extra reviewers' reports and remarks, inserted in bulk).
 * Two sizes: `seedBase` makes the small one, `grow` adds to it; the bench counts the SQL statements
 * of each page at both sizes and loads the pages at the large one.
 */
import { and, eq, isNull, sql } from "drizzle-orm";
import type { Database } from "../../database/client";
import * as s from "../../database/schema";

export type Size = { submissions: number; runs: number; claims: number; series: number; rows: number; reviews: number; remarks: number };

export function seriesCsv(rows: number, seed: number) {
  let state = seed;
  const r = () => (state = (state * 48271) % 2147483647) / 2147483647;
  const out = ["t,kineticEnergy,magneticEnergy,Re,Rm,Nu"];
  let x = 0;
  for (let i = 0; i < rows; i++) {
    x = 0.95 * x + (r() - 0.5);
    out.push(`${(i * 0.0001).toFixed(4)},${(30 + x + 5 * Math.exp(-i / 5000)).toPrecision(8)},${(12 + 0.5 * x).toPrecision(8)},${(78 + x).toPrecision(8)},${(390 + 5 * x).toPrecision(8)},${(2.1 + 0.01 * x).toPrecision(8)}`);
  }
  return out.join("\n") + "\n";
}

const runLabel = (i: number) => `H${String(i).padStart(2, "0")}`;
const runRecord = (i: number) => ({
  format: "runproof.run/1",
  label: runLabel(i),
  geometry: { radiusRatio: 0.35 },
  conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
  controls: { E: 10 ** (-3 - (i % 4)), Ra: 1e5 * (1 + i), Pr: 1, Pm: 2 + (i % 3) },
  material: { nu: "1e-6 m^2/s", eta: "0.5e-6 m^2/s", outerRadius: "1800 km" },
  resolution: { radialPoints: 65, radialGrid: "chebyshev", maxDegree: 85, maxOrder: 85 },
  time: { start: 0, end: 20 },
  diagnostics: { kineticEnergy: 30, Re: 78 },
});

const remarkBody = (i: number) => ({
  type: "doc",
  content: [{ type: "paragraph", content: [{ type: "text", text: `Remark ${i}: please state over which window $Ro = Re\\,E$ was averaged, and how long the transient lasted.` }] }],
});

export type BenchWorld = {
  venueIds: string[];
  mainVenueId: string;
  authorId: string;
  editorId: string;
  reviewerId: string;
  heavyId: string;
  roundId: string;
  runIds: string[];
  lightId: string;
};

async function users(db: Database) {
  const byEmail = async (email: string) => (await db.select({ id: s.user.id }).from(s.user).where(eq(s.user.email, email)))[0]!.id;
  return {
    authorId: await byEmail("author@demo.runproof.example"),
    editorId: await byEmail("editor@demo.runproof.example"),
    reviewerId: await byEmail("reviewer1@demo.runproof.example"),
  };
}

/** Bench submissions i in [from, to), spread over the venues and the desk's states, sent over the last year. */
async function addSubmissions(db: Database, w: Pick<BenchWorld, "venueIds" | "authorId">, from: number, to: number) {
  const { createSubmission } = await import("../../app/workspace/submissions.server");
  for (let i = from; i < to; i++) {
    const venueId = w.venueIds[i % w.venueIds.length]!;
    await createSubmission(db, { venueId, userId: w.authorId, fields: { title: `Bench submission ${i}`, abstract: "", keywords: [], availability: "", dois: [] } });
  }
  await db.execute(sql`update rounds set state = (array['sent','under-review','reviews-in','decided'])[1 + (abs(hashtext(id::text)) % 4)]::round_state,
    sent_at = now() - (abs(hashtext(id::text)) % 365) * interval '1 day', change_seq = 0, checked_seq = 0,
    sent_title = (select title from submissions where submissions.id = rounds.submission_id)
    where state = 'draft' and submission_id in (select id from submissions where title like 'Bench submission %')`);
  await db.execute(sql`update submissions set stage = 'in-review' where title like 'Bench submission %'`);
}

/** Runs [from, to), claims [cFrom, cTo) and series [sFrom, sTo) of the heavy draft round, then one check. */
async function fillHeavy(db: Database, w: BenchWorld, size: Size, from: Pick<Size, "runs" | "claims" | "series">) {
  const { addRun, addClaim } = await import("../../app/workspace/run-edits.server");
  const { attachCsv } = await import("../../app/workspace/attachments.server");
  const { recheckRound } = await import("../../app/workspace/recheck.server");
  for (let i = from.runs; i < size.runs; i++) {
    const out = await addRun(db, { submissionId: w.heavyId, roundId: w.roundId, input: runRecord(i), origin: "api", userId: w.authorId });
    w.runIds.push(out.run.id);
  }
  for (let i = from.claims; i < size.claims; i++) {
    const ref = i % size.runs;
    const other = (i * 7 + 3) % size.runs === ref ? (ref + 1) % size.runs : (i * 7 + 3) % size.runs;
    const names = [{ label: runLabel(ref), part: "reference" }, { label: runLabel(other), part: "varied" }];
    await addClaim(db, w.roundId, { figure: `Fig. ${i + 1}`, record: { format: "runproof.claim/1", title: `Claim ${i}`, runs: names, stated: [{ quantity: "E", value: "1e-3" }] } });
  }
  for (let i = from.series; i < size.series; i++) {
    const body = new Blob([seriesCsv(size.rows, 11 + i)]).stream();
    await attachCsv(db, { roundId: w.roundId, runId: w.runIds[i]!, kind: "series", body, filename: `H${i}-series.csv`, userId: w.authorId, limitBytes: 50 * 1024 * 1024 });
  }
  await recheckRound(db, w.roundId);
}

/** The small size: demo, a third venue, bench submissions, the heavy draft round and a light sent one. */
export async function seedBase(db: Database, size: Size): Promise<BenchWorld> {
  const { createSubmission } = await import("../../app/workspace/submissions.server");
  const people = await users(db);
  await db.insert(s.venues).values({ slug: "bench-third-venue", name: "Bench Review of Rotating Fluids", publisher: "Bench Society", blinding: "single" }).onConflictDoNothing();
  const venueRows = await db.select({ id: s.venues.id, slug: s.venues.slug }).from(s.venues);
  const main = venueRows.find((v) => v.slug === "corvane-annals")!.id;
  const venueIds = [main, ...venueRows.filter((v) => v.slug !== "corvane-annals").map((v) => v.id)].slice(0, 3);
  await db.insert(s.venueMembers).values(venueIds.map((venueId) => ({ venueId, userId: people.editorId, role: "editor" as const }))).onConflictDoNothing();
  await addSubmissions(db, { venueIds, authorId: people.authorId }, 0, size.submissions);
  const [light] = await db.select({ id: s.submissions.id }).from(s.submissions).where(and(eq(s.submissions.title, "Bench submission 0")));
  const heavy = await createSubmission(db, { venueId: main, userId: people.authorId, fields: { title: "Heavy round", abstract: "", keywords: [], availability: "", dois: [] } });
  const [round] = await db.select({ id: s.rounds.id }).from(s.rounds).where(eq(s.rounds.submissionId, heavy.submissionId));
  const w: BenchWorld = { venueIds, mainVenueId: main, ...people, heavyId: heavy.submissionId, roundId: round!.id, runIds: [], lightId: light!.id };
  await fillHeavy(db, w, size, { runs: 0, claims: 0, series: 0 });
  return w;
}

/** From the small size to the large one: more submissions, runs, claims and series. */
export async function grow(db: Database, w: BenchWorld, small: Size, large: Size) {
  await addSubmissions(db, w, small.submissions, large.submissions);
  await fillHeavy(db, w, large, small);
}

/**
 * Sends the heavy round (its mismatches answered, as authors must) and gives it reports: the demo
 * reviewer's (who signs in for the bench) and more, up to `count`, with `remarks` remarks in all and
 * a verdict from each reviewer on the first 20 flags.
 */
export async function sendHeavy(db: Database, w: BenchWorld) {
  const { sendRound } = await import("../../app/workspace/send.server");
  const { inviteReviewer, respondToInvitation } = await import("../../app/review/invitations.server");
  const { newToken } = await import("../../app/review/link-tokens.server");
  await db.update(s.flags).set({ authorAnswer: "Kept on purpose; see the methods section.", answeredBy: w.authorId }).where(and(eq(s.flags.roundId, w.roundId), eq(s.flags.severity, "mismatch"), isNull(s.flags.authorAnswer)));
  const [draft] = await db.select({ version: s.rounds.version }).from(s.rounds).where(eq(s.rounds.id, w.roundId));
  await sendRound(db, { roundId: w.roundId, userId: w.authorId, expectedVersion: draft!.version });
  const inv = await inviteReviewer(db, { roundId: w.roundId, email: "reviewer1@demo.runproof.example", dueAt: new Date(Date.now() + 21 * 86_400_000), editorId: w.editorId });
  const { token, hash } = newToken();
  await db.update(s.invitations).set({ tokenHash: hash }).where(eq(s.invitations.id, inv.id));
  await respondToInvitation(db, { token, answer: "accept", userId: w.reviewerId });
}

/** Reports 2…count (reviewer 1's exists) and remarks up to `remarks` in all, spread over the reports. */
export async function addReports(db: Database, w: BenchWorld, count: number, remarks: number) {
  await db.transaction(async (tx) => {
    const existing = await tx.select({ id: s.reviews.id, number: s.reviews.number }).from(s.reviews).where(eq(s.reviews.roundId, w.roundId));
    for (let n = existing.length + 1; n <= count; n++) {
      const id = `bench-reviewer-${n}`;
      await tx.insert(s.user).values({ id, name: `Bench Reviewer ${n}`, email: `bench-reviewer-${n}@bench.runproof.example`, emailVerified: true }).onConflictDoNothing();
      await tx.insert(s.submissionMembers).values({ submissionId: w.heavyId, userId: id, role: "reviewer" }).onConflictDoNothing();
      await tx.insert(s.reviews).values({ roundId: w.roundId, reviewerId: id, number: n, state: "in-progress" });
    }
    const reports = await tx.select({ id: s.reviews.id }).from(s.reviews).where(eq(s.reviews.roundId, w.roundId)).orderBy(s.reviews.number);
    const flagIds = (await tx.select({ id: s.flags.id }).from(s.flags).where(eq(s.flags.roundId, w.roundId)).orderBy(s.flags.id).limit(20)).map((f) => f.id);
    const verdicts = ["agree", "dispute", "ask-authors"] as const;
    await tx.insert(s.flagVerdicts).values(reports.flatMap((r, k) => flagIds.map((flagId, j) => ({ reviewId: r.id, flagId, verdict: verdicts[(j + k) % 3]! })))).onConflictDoNothing();
    const [have] = await tx.select({ n: sql<number>`count(*)::int` }).from(s.remarks).innerJoin(s.reviews, eq(s.reviews.id, s.remarks.reviewId)).where(eq(s.reviews.roundId, w.roundId));
    const rows = [];
    for (let i = have!.n; i < remarks; i++) rows.push({ reviewId: reports[i % reports.length]!.id, anchorKind: "round" as const, anchorRef: null, body: remarkBody(i) });
    if (rows.length) await tx.insert(s.remarks).values(rows);
  });
}
