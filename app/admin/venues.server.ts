import { asc, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { user, venueMembers, venues } from "~db/schema";

export async function listVenues(db: Database) {
  const rows = await db
    .select({
      id: venues.id,
      name: venues.name,
      slug: venues.slug,
      blinding: venues.blinding,
      editorName: user.name,
      editorEmail: user.email,
    })
    .from(venues)
    .leftJoin(venueMembers, eq(venueMembers.venueId, venues.id))
    .leftJoin(user, eq(user.id, venueMembers.userId))
    .orderBy(asc(venues.name));
  const byVenue = new Map<string, { id: string; name: string; slug: string; blinding: string; editors: string[] }>();
  for (const r of rows) {
    const v = byVenue.get(r.id) ?? { id: r.id, name: r.name, slug: r.slug, blinding: r.blinding, editors: [] };
    if (r.editorName) v.editors.push(`${r.editorName} <${r.editorEmail}>`);
    byVenue.set(r.id, v);
  }
  return [...byVenue.values()];
}

export async function findUserIdByEmail(db: Pick<Database, "select">, email: string) {
  const [row] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
  return row?.id ?? null;
}

/** The venue and its first editor are stored together or not at all. */
export async function createVenue(
  db: Database,
  input: { name: string; slug: string; blinding: "single" | "double"; editorUserId: string },
) {
  return db.transaction(async (tx) => {
    const [venue] = await tx
      .insert(venues)
      .values({ name: input.name, slug: input.slug, blinding: input.blinding })
      .returning({ id: venues.id });
    await tx.insert(venueMembers).values({ venueId: venue!.id, userId: input.editorUserId, role: "editor" });
    return venue!.id;
  });
}
