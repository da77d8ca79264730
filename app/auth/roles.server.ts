import { eq, sql } from "drizzle-orm";
import type { RouterContextProvider } from "react-router";
import type { Database } from "~db/client";
import { memo } from "~/access/request-memo.server";
import { submissionMembers, venueMembers, venues } from "~db/schema";

export type RoleSummary = {
  admin: boolean;
  editorOf: { id: string; name: string }[];
  submissionRoles: { role: "author" | "co-author" | "reviewer"; count: number }[];
};

/** What the header and the dashboard say about a person: every role they hold anywhere. */
export async function roleSummary(db: Database, user: { id: string; role?: string | null }): Promise<RoleSummary> {
  const [editorOf, counts] = await Promise.all([
    db
      .select({ id: venues.id, name: venues.name })
      .from(venueMembers)
      .innerJoin(venues, eq(venues.id, venueMembers.venueId))
      .where(eq(venueMembers.userId, user.id)),
    db
      .select({ role: submissionMembers.role, count: sql<number>`count(*)::int` })
      .from(submissionMembers)
      .where(eq(submissionMembers.userId, user.id))
      .groupBy(submissionMembers.role),
  ]);
  return { admin: user.role === "admin", editorOf, submissionRoles: counts };
}

/** The same summary, read once per request however many loaders of it ask (header and dashboard). */
export function requestRoleSummary(context: Pick<RouterContextProvider, "get">, db: Database, user: { id: string; role?: string | null }) {
  return memo(context, `role-summary:${user.id}`, () => roleSummary(db, user));
}

export function roleLabels(summary: RoleSummary): string[] {
  const labels: string[] = [];
  if (summary.admin) labels.push("admin");
  if (summary.editorOf.length) labels.push("editor");
  for (const r of summary.submissionRoles) labels.push(r.role);
  return labels;
}
