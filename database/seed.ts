import { hashPassword } from "better-auth/crypto";
import { and, eq } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { parseEnv, type Env } from "../app/config/env-schema";
import { createDatabase, type Database } from "./client";
import { DEMO_PASSWORD, demoBlindVenue, demoPeople, demoSubmission, demoVenue, type DemoKey } from "./demo-data";
import { seedDemoStages } from "./demo-stages";
import { account, contributors, submissionMembers, submissions, user, venueMembers, venues } from "./schema";
import { seedDemoRound } from "./seed-round";

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/** Creates the person with a confirmed address and the demo password, or finds them. */
async function ensurePerson(tx: Tx, person: (typeof demoPeople)[number], passwordHash: string) {
  const [existing] = await tx.select({ id: user.id }).from(user).where(eq(user.email, person.email));
  if (existing) return existing.id;
  const id = randomUUID();
  await tx.insert(user).values({
    id,
    name: person.name,
    email: person.email,
    emailVerified: true,
    affiliation: person.affiliation,
    orcid: "orcid" in person ? person.orcid : null,
    role: "role" in person ? person.role : "user",
  });
  await tx.insert(account).values({ id: randomUUID(), accountId: id, providerId: "credential", userId: id, password: passwordHash });
  return id;
}

/** Idempotent: a second run finds everything and changes nothing. */
export async function seed(db: Database, env: Env = parseEnv(process.env)) {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  return db.transaction(async (tx) => {
    const ids = {} as Record<DemoKey, string>;
    for (const person of demoPeople) ids[person.key] = await ensurePerson(tx, person, passwordHash);

    await tx.insert(venues).values(demoVenue).onConflictDoNothing({ target: venues.slug });
    const [venue] = await tx.select({ id: venues.id }).from(venues).where(eq(venues.slug, demoVenue.slug));
    await tx.insert(venueMembers).values({ venueId: venue!.id, userId: ids.editor, role: "editor" }).onConflictDoNothing();

    let [sub] = await tx
      .select({ id: submissions.id })
      .from(submissions)
      .where(and(eq(submissions.venueId, venue!.id), eq(submissions.title, demoSubmission.title)));
    if (!sub) {
      [sub] = await tx
        .insert(submissions)
        .values({ ...demoSubmission, venueId: venue!.id, createdBy: ids.author })
        .returning({ id: submissions.id });
    }
    await tx
      .insert(submissionMembers)
      .values([
        { submissionId: sub!.id, userId: ids.author, role: "author", corresponding: true },
        { submissionId: sub!.id, userId: ids.coauthor1, role: "co-author" },
        { submissionId: sub!.id, userId: ids.coauthor2, role: "co-author" },
      ])
      .onConflictDoNothing();
    const [listed] = await tx.select({ id: contributors.id }).from(contributors).where(eq(contributors.submissionId, sub!.id)).limit(1);
    if (!listed) {
      // The author list in order, with CRediT roles (ANSI/NISO Z39.104-2022), all accounts attached.
      const credit = { author: ["Conceptualization", "Software", "Writing – original draft"], coauthor1: ["Formal analysis", "Visualization"], coauthor2: ["Methodology", "Writing – review & editing"] } as const;
      await tx.insert(contributors).values(
        (["author", "coauthor1", "coauthor2"] as const).map((key, i) => {
          const p = demoPeople.find((d) => d.key === key)!;
          return { submissionId: sub!.id, userId: ids[key], position: i + 1, name: p.name, email: p.email, affiliation: p.affiliation, orcid: "orcid" in p ? p.orcid : null, creditRoles: [...credit[key]], corresponding: key === "author" };
        }),
      );
    }
    const demoRound = await seedDemoRound(tx, env, { submissionId: sub!.id, authorId: ids.author });

    await tx.insert(venues).values(demoBlindVenue).onConflictDoNothing({ target: venues.slug });
    const [blind] = await tx.select({ id: venues.id }).from(venues).where(eq(venues.slug, demoBlindVenue.slug));
    await tx.insert(venueMembers).values({ venueId: blind!.id, userId: ids.editor2, role: "editor" }).onConflictDoNothing();
    const stages = await seedDemoStages(tx, env, ids, { main: venue!.id, blind: blind!.id });
    return { ids, venueId: venue!.id, blindVenueId: blind!.id, submissionId: sub!.id, roundId: demoRound.roundId, stages };
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const env = parseEnv(process.env);
  const { db, sql } = createDatabase(env.DATABASE_URL, 1);
  try {
    const out = await seed(db, env);
    console.log(`demo seeded: venues ${demoVenue.slug} and ${demoBlindVenue.slug}, ${Object.keys(out.ids).length} people; ${out.stages.length ? `new: ${out.stages.join("; ")}` : "every stage already present"}`);
  } finally {
    await sql.end({ timeout: 5 });
  }
}
