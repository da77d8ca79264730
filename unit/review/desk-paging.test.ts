/** The desk pages each state with a keyset cursor: every round once, none skipped, counts per state. */
import { eq, inArray, sql as dsql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { rounds, submissions, user, venues } from "~db/schema";
import { deskPage, parseDeskCursor } from "~/review/desk.server";
import { createSubmission } from "~/workspace/submissions.server";
import { testDatabase } from "../support/test-db";

const { db, sql } = testDatabase();
const made: string[] = [];
let venueId = "";

beforeAll(async () => {
  const [author] = await db.select({ id: user.id }).from(user).where(eq(user.email, "author@demo.runproof.example"));
  const [venue] = await db.select({ id: venues.id }).from(venues).where(eq(venues.slug, "corvane-annals"));
  venueId = venue!.id;
  for (let i = 0; i < 7; i++) {
    const s = await createSubmission(db, { venueId, userId: author!.id, fields: { title: `desk paging ${i} ${Date.now()}`, abstract: "", keywords: [], availability: "", dois: [] } });
    made.push(s.submissionId);
  }
  // Two of them sent at the same moment: the id breaks the tie, so neither is skipped.
  await db.execute(dsql`update rounds set state = 'sent', sent_at = timestamp '2026-01-01' + (case when abs(hashtext(id::text)) % 2 = 0 then interval '0' else interval '1 hour' end)
    where submission_id in (${dsql.join(made.map((m) => dsql`${m}::uuid`), dsql`, `)})`);
});

afterAll(async () => {
  await db.delete(submissions).where(inArray(submissions.id, made));
  await sql.end({ timeout: 5 });
});

describe("desk paging", () => {
  it("walks the 'sent' column two at a time: every round exactly once, as many as the count says", async () => {
    const seen: string[] = [];
    let cursor = null as ReturnType<typeof parseDeskCursor>;
    let total = -1;
    for (let guard = 0; guard < 1000; guard++) {
      const page = await deskPage(db, venueId, { sent: cursor }, 2);
      const sent = page.groups.find((g) => g.state === "sent")!;
      total = sent.total;
      expect(sent.items.length).toBeLessThanOrEqual(2);
      seen.push(...sent.items.map((i) => i.roundId));
      if (!sent.next) break;
      cursor = parseDeskCursor(sent.next);
      expect(cursor).not.toBeNull();
    }
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen.length).toBe(total);
    const ours = await db.select({ id: rounds.id }).from(rounds).where(inArray(rounds.submissionId, made));
    for (const r of ours) expect(seen).toContain(r.id);
  });

  it("ignores a cursor that is not one", () => {
    expect(parseDeskCursor("2026-01-01T00:00:00.000Z_not-a-uuid")).toBeNull();
    expect(parseDeskCursor(null)).toBeNull();
  });
});
