export { QUEUE_GROUPS } from "./states";
import { and, desc, eq, ne, or, sql, lt, type SQL } from "drizzle-orm";
import { flags, invitations, reviews, rounds, submissions } from "~db/schema";
import type { Db } from "~/workspace/types";
import { QUEUE_GROUPS } from "./states";

/** Rounds per column of the desk; older ones page in with a cursor. */
export const DESK_PAGE_SIZE = 20;

const columns = {
  roundId: rounds.id,
  number: rounds.number,
  state: rounds.state,
  sentAt: rounds.sentAt,
  decision: rounds.decision,
  submissionId: submissions.id,
  title: sql<string>`coalesce(${rounds.sentTitle}, ${submissions.title})`,
  mismatch: sql<number>`(select count(*)::int from ${flags} where ${flags.roundId} = ${rounds.id} and ${flags.severity} = 'mismatch')`,
  caution: sql<number>`(select count(*)::int from ${flags} where ${flags.roundId} = ${rounds.id} and ${flags.severity} = 'caution')`,
  note: sql<number>`(select count(*)::int from ${flags} where ${flags.roundId} = ${rounds.id} and ${flags.severity} = 'note')`,
  invited: sql<number>`(select count(*)::int from ${invitations} where ${invitations.roundId} = ${rounds.id} and ${invitations.state} = 'pending')`,
  reviewing: sql<number>`(select count(*)::int from ${reviews} where ${reviews.roundId} = ${rounds.id} and ${reviews.state} = 'in-progress')`,
  submitted: sql<number>`(select count(*)::int from ${reviews} where ${reviews.roundId} = ${rounds.id} and ${reviews.state} = 'submitted')`,
};

/** Every sent round of the venue with its flag counts and where its reviews stand. */
export async function deskQueue(db: Db, venueId: string) {
  return db
    .select(columns)
    .from(rounds)
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .where(and(eq(submissions.venueId, venueId), ne(rounds.state, "draft")))
    .orderBy(desc(rounds.sentAt));
}

/** A position in a desk column: the last round shown (sent time, then id, newest first). */
export type DeskCursor = { sentAt: string; roundId: string };
const CURSOR = /^(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(?:\.\d+)?Z)_([0-9a-f-]{36})$/i;

export function parseDeskCursor(value: string | null): DeskCursor | null {
  const m = value ? CURSOR.exec(value) : null;
  return m && !Number.isNaN(Date.parse(m[1]!)) ? { sentAt: m[1]!, roundId: m[2]! } : null;
}
export const deskCursorOf = (r: { sentAt: Date | null; roundId: string }) => `${(r.sentAt ?? new Date(0)).toISOString()}_${r.roundId}`;

/**
 * The desk, one page per state: each column's next rounds after its cursor (keyset paging on
 * sent time and id, so a page costs the same however many rounds the venue has), the count of
 * rounds in every state, and the cursor of the next page when there is one.
 */
export async function deskPage(db: Db, venueId: string, cursors: Partial<Record<string, DeskCursor | null>> = {}, size = DESK_PAGE_SIZE) {
  const countRows = await db
    .select({ state: rounds.state, n: sql<number>`count(*)::int` })
    .from(rounds)
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .where(and(eq(submissions.venueId, venueId), ne(rounds.state, "draft")))
    .groupBy(rounds.state);
  const counts = Object.fromEntries(countRows.map((c) => [c.state, c.n])) as Record<string, number>;
  const groups = await Promise.all(
    QUEUE_GROUPS.map(async (g) => {
      const cursor = cursors[g.state] ?? null;
      const after: SQL | undefined = cursor
        ? or(lt(rounds.sentAt, new Date(cursor.sentAt)), and(eq(rounds.sentAt, new Date(cursor.sentAt)), lt(rounds.id, cursor.roundId)))
        : undefined;
      const rows = await db
        .select(columns)
        .from(rounds)
        .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
        .where(and(eq(submissions.venueId, venueId), eq(rounds.state, g.state), after))
        .orderBy(desc(rounds.sentAt), desc(rounds.id))
        .limit(size + 1);
      const items = rows.slice(0, size);
      return { state: g.state, label: g.label, total: counts[g.state] ?? 0, items, next: rows.length > size ? deskCursorOf(items[items.length - 1]!) : null, paged: cursor !== null };
    }),
  );
  return { groups, counts };
}
