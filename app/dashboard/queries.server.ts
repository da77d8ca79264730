import { and, count, desc, eq, inArray, lt, or, sql, type SQL } from "drizzle-orm";
import type { Database } from "~db/client";
import { rounds, submissionMembers, submissions, venues } from "~db/schema";
import type { RoleSummary } from "~/auth/roles.server";

export type DashboardItem = { id: string; title: string; stage: string; venueName: string; venueId: string };
/** One page of a dashboard list: its items, how many there are in all, and the next page's cursor. */
export type DashboardList = { items: DashboardItem[]; total: number; next: string | null };

/** Submissions per dashboard list and page; older ones page in with a cursor. */
export const DASHBOARD_PAGE_SIZE = 20;
export const DASHBOARD_LISTS = ["authored", "coAuthored", "reviewing", "editing"] as const;
export type DashboardListName = (typeof DASHBOARD_LISTS)[number];

/** Authors see their working title; editors and reviewers the title as last sent. */
const sentTitle = sql<string>`coalesce((select ${rounds.sentTitle} from ${rounds} where ${rounds.submissionId} = ${submissions.id} and ${rounds.state} <> 'draft' order by ${rounds.number} desc limit 1), ${submissions.title})`;

const itemColumns = {
  id: submissions.id,
  title: submissions.title,
  stage: submissions.stage,
  venueName: venues.name,
  venueId: venues.id,
  updatedAt: submissions.updatedAt,
};

const CURSOR = /^(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(?:\.\d+)?Z)_([0-9a-f-]{36})$/i;
/** A cursor from the URL: the last item shown (updated time and id); anything else starts at the top. */
export function parseListCursor(value: string | null) {
  const m = value ? CURSOR.exec(value) : null;
  return m && !Number.isNaN(Date.parse(m[1]!)) ? { updatedAt: new Date(m[1]!), id: m[2]! } : null;
}
type Cursor = ReturnType<typeof parseListCursor>;
const after = (c: Cursor): SQL | undefined =>
  c ? or(lt(submissions.updatedAt, c.updatedAt), and(eq(submissions.updatedAt, c.updatedAt), lt(submissions.id, c.id))) : undefined;

async function page(rows: Promise<(DashboardItem & { updatedAt: Date })[]>, total: number | Promise<{ n: number }[]>): Promise<DashboardList> {
  const [r, t] = await Promise.all([rows, typeof total === "number" ? { n: total } : total.then(([first]) => first)]);
  const items = r.slice(0, DASHBOARD_PAGE_SIZE);
  const last = items[items.length - 1];
  return {
    items: items.map(({ updatedAt: _u, ...i }) => i),
    total: t?.n ?? 0,
    next: r.length > DASHBOARD_PAGE_SIZE && last ? `${last.updatedAt.toISOString()}_${last.id}` : null,
  };
}

function byMembership(db: Database, userId: string, role: "author" | "co-author" | "reviewer", cursor: Cursor, roles: RoleSummary) {
  const where = and(eq(submissionMembers.userId, userId), eq(submissionMembers.role, role));
  const total = roles.submissionRoles.find((r) => r.role === role)?.count ?? 0;
  return page(
    db
      .select(role === "reviewer" ? { ...itemColumns, title: sentTitle } : itemColumns)
      .from(submissionMembers)
      .innerJoin(submissions, eq(submissions.id, submissionMembers.submissionId))
      .innerJoin(venues, eq(venues.id, submissions.venueId))
      .where(and(where, after(cursor)))
      .orderBy(desc(submissions.updatedAt), desc(submissions.id))
      .limit(DASHBOARD_PAGE_SIZE + 1),
    total,
  );
}

/**
 * One list per role the person holds (a role they do not hold is simply empty), each paged with
 * a keyset cursor on (updated, id): a page costs the same however many submissions there are.
 * The venues they edit and their counts per role come from the request's role summary (the header
 * reads the same), so they are not read twice.
 */
export async function dashboardFor(db: Database, userId: string, roles: RoleSummary, cursors: Partial<Record<DashboardListName, Cursor>> = {}) {
  const editorVenues = roles.editorOf;
  const venueIds = editorVenues.map((v) => v.id);
  const editingWhere = and(inArray(submissions.venueId, venueIds), inArray(submissions.stage, ["with-editor", "in-review"]));
  const [authored, coAuthored, reviewing, editing] = await Promise.all([
    byMembership(db, userId, "author", cursors.authored ?? null, roles),
    byMembership(db, userId, "co-author", cursors.coAuthored ?? null, roles),
    byMembership(db, userId, "reviewer", cursors.reviewing ?? null, roles),
    venueIds.length
      ? page(
          db
            .select({ ...itemColumns, title: sentTitle })
            .from(submissions)
            .innerJoin(venues, eq(venues.id, submissions.venueId))
            .where(and(editingWhere, after(cursors.editing ?? null)))
            .orderBy(desc(submissions.updatedAt), desc(submissions.id))
            .limit(DASHBOARD_PAGE_SIZE + 1),
          db.select({ n: count() }).from(submissions).where(editingWhere),
        )
      : Promise.resolve({ items: [], total: 0, next: null } as DashboardList),
  ]);
  return { editorVenues, authored, coAuthored, reviewing, editing };
}
