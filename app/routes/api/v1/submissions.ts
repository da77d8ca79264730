import { and, eq, inArray, ne, or } from "drizzle-orm";
import { rounds, submissionMembers, submissions, venueMembers, venues } from "~db/schema";
import { requireApiCaller } from "~/api/auth.server";
import { apiHandle } from "~/api/errors.server";
import { methodNotAllowed } from "~/api/input.server";
import { dbContext } from "~/db.server";
import type { Route } from "./+types/submissions";

/** GET /api/v1/submissions: the submissions you hold a role on (author, co-author, reviewer, editor). */
export function loader({ request, context }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const [memberRows, editorRows] = await Promise.all([
      db.select({ id: submissionMembers.submissionId, role: submissionMembers.role }).from(submissionMembers).where(eq(submissionMembers.userId, caller.userId)),
      db.select({ venueId: venueMembers.venueId }).from(venueMembers).where(eq(venueMembers.userId, caller.userId)),
    ]);
    const memberIds = [...new Set(memberRows.map((m) => m.id))];
    const venueIds = editorRows.map((e) => e.venueId);
    if (memberIds.length === 0 && venueIds.length === 0) return Response.json({ items: [] });
    const conditions = [];
    if (memberIds.length) conditions.push(inArray(submissions.id, memberIds));
    if (venueIds.length) conditions.push(inArray(submissions.venueId, venueIds));
    const rows = await db
      .select({
        id: submissions.id,
        title: submissions.title,
        stage: submissions.stage,
        updatedAt: submissions.updatedAt,
        venueId: venues.id,
        venueName: venues.name,
        blinding: venues.blinding,
      })
      .from(submissions)
      .innerJoin(venues, eq(venues.id, submissions.venueId))
      .where(or(...conditions))
      .orderBy(submissions.updatedAt);
    // Editors see a submission once a round of it was sent (the same rule as the round routes).
    const editable = rows.filter((s) => venueIds.includes(s.venueId)).map((s) => s.id);
    const sentRows = editable.length
      ? await db
          .selectDistinct({ id: rounds.submissionId })
          .from(rounds)
          .where(and(inArray(rounds.submissionId, editable), ne(rounds.state, "draft")))
      : [];
    const sent = new Set(sentRows.map((r) => r.id));
    const items = rows
      .map((s) => {
        const roles: string[] = memberRows.filter((m) => m.id === s.id).map((m) => m.role);
        if (sent.has(s.id)) roles.push("editor");
        return {
          id: s.id,
          title: s.title,
          stage: s.stage,
          venue: { id: s.venueId, name: s.venueName, blinding: s.blinding },
          roles,
          updatedAt: s.updatedAt.toISOString(),
        };
      })
      .filter((s) => s.roles.length > 0);
    return Response.json({ items });
  });
}

export function action() {
  return methodNotAllowed(["GET"]);
}
