import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { extractText, getDocumentProxy } from "unpdf";
import { afterAll, describe, expect, it } from "vitest";
import { demoPeople } from "~db/demo-data";
import { submissions, venues } from "~db/schema";
import { roundContext } from "~/review/round-context.server";
import { packetFor } from "~/review/documents.server";
import { reviewerView } from "~/review/workspace.server";
import { makeSentRound } from "../../e2e/support/make-sent-round";
import { testDatabase } from "../support/test-db";
import { dropQueuedMail } from "./outbox-cleanup";
import { can } from "~/access/round-policy";

const { db, sql } = testDatabase();
const title = `Blinding towards reviewers ${Date.now()}`;
afterAll(async () => {
  await dropQueuedMail(db, title);
  await sql.end({ timeout: 5 });
});

const author = demoPeople.find((p) => p.key === "author")!;

async function packetText(ctx: Awaited<ReturnType<typeof roundContext>>) {
  const doc = await getDocumentProxy(new Uint8Array(await packetFor(db, ctx)));
  return (await extractText(doc, { mergePages: true })).text;
}

describe("blinding towards reviewers", () => {
  it("shows authors' names and affiliations to reviewers at a single-blind venue only", async () => {
    const fx = await makeSentRound(db, title);
    const single = await roundContext(db, { roundId: fx.roundId });
    expect(single.venue.blinding).toBe("single");
    const open = await reviewerView(db, single, { id: randomUUID() }, { showAuthors: can("reviewer", "sent", "read-author-identities", single.venue.blinding) });
    expect(open.authors.map((a) => a.name)).toContain(author.name);
    expect(await packetText(single)).toContain(author.name);

    // The same round moved to a double-blind venue of its own.
    const [venue] = await db.insert(venues).values({ slug: `double-${Date.now()}`, name: "Double-blind test venue", blinding: "double" }).returning();
    await db.update(submissions).set({ venueId: venue!.id }).where(eq(submissions.id, fx.submissionId));
    const double = await roundContext(db, { roundId: fx.roundId });
    const hidden = await reviewerView(db, double, { id: randomUUID() }, { showAuthors: can("reviewer", "sent", "read-author-identities", double.venue.blinding) });
    expect(hidden.authors).toEqual([]);
    expect(JSON.stringify(hidden)).not.toContain(author.name);
    expect(JSON.stringify(hidden)).not.toContain(author.affiliation);
    const text = await packetText(double);
    expect(text).not.toContain(author.name);
    expect(text).toContain("strat-B");
  });
});
