import { randomUUID } from "node:crypto";
import { inArray } from "drizzle-orm";
import { RouterContextProvider } from "react-router";
import type { Database } from "~db/client";
import { contributors, reviews, rounds, storedFiles, submissionMembers, submissions, user, venueMembers, venues } from "~db/schema";
import { createApiToken, type TokenScope } from "~/api/api-tokens.server";
import { dbContext } from "~/db.server";

type Handler = (args: never) => Promise<Response> | Response;
type Module = { loader?: Handler; action?: Handler };

/** Calls a route module's loader (GET/HEAD) or action (anything else) the way the router does. */
export async function call(mod: Module, db: Database, opts: { method?: string; url: string; params: Record<string, string>; token?: string; body?: BodyInit; headers?: Record<string, string> }) {
  const method = opts.method ?? "GET";
  const headers = new Headers(opts.headers);
  if (opts.token) headers.set("authorization", `Bearer ${opts.token}`);
  if (typeof opts.body === "string" && !headers.has("content-type")) headers.set("content-type", "application/json");
  const request = new Request(`http://localhost${opts.url}`, { method, headers, body: opts.body, ...(opts.body instanceof ReadableStream ? { duplex: "half" } : {}) } as RequestInit);
  const context = new RouterContextProvider();
  context.set(dbContext, db);
  const fn = method === "GET" || method === "HEAD" ? mod.loader : mod.action;
  if (!fn) throw new Error(`module has no handler for ${method}`);
  const res = await (fn as (a: unknown) => Promise<Response>)({ request, context, params: opts.params });
  return { status: res.status, headers: res.headers, body: (await res.json()) as any };
}

/**
 * People, a venue, a submission with a draft round 1… of this test only (unique names),
 * and a way to remove all of it afterwards.
 */
export async function makeWorld(db: Database, tag: string, blinding: "single" | "double" = "double") {
  const people = Object.fromEntries(
    ["author", "coauthor", "reviewer", "otherReviewer", "editor", "stranger"].map((k) => [k, { id: randomUUID(), name: `${k} ${tag}`, email: `${k}-${tag}@unit.runproof.example` }]),
  ) as Record<"author" | "coauthor" | "reviewer" | "otherReviewer" | "editor" | "stranger", { id: string; name: string; email: string }>;
  await db.insert(user).values(Object.values(people).map((p) => ({ ...p, emailVerified: true })));
  const [venue] = await db.insert(venues).values({ slug: `venue-${tag}`, name: `Venue ${tag}`, blinding }).returning();
  await db.insert(venueMembers).values({ venueId: venue!.id, userId: people.editor.id, role: "editor" });
  const [submission] = await db.insert(submissions).values({ venueId: venue!.id, title: `Layer study ${tag}`, createdBy: people.author.id }).returning();
  await db.insert(submissionMembers).values([
    { submissionId: submission!.id, userId: people.author.id, role: "author", corresponding: true },
    { submissionId: submission!.id, userId: people.coauthor.id, role: "co-author" },
    { submissionId: submission!.id, userId: people.reviewer.id, role: "reviewer" },
    { submissionId: submission!.id, userId: people.otherReviewer.id, role: "reviewer" },
  ]);
  await db.insert(contributors).values({ submissionId: submission!.id, userId: people.author.id, position: 1, name: people.author.name, email: people.author.email, affiliation: "Lanthorn Institute" });
  // Round 1 was sent and is reviewed by `reviewer` only; round 2 is the authors' draft.
  const [sent] = await db.insert(rounds).values({ submissionId: submission!.id, number: 1, state: "under-review", sentAt: new Date() }).returning();
  const [draft] = await db.insert(rounds).values({ submissionId: submission!.id, number: 2, state: "draft" }).returning();
  await db.insert(reviews).values({ roundId: sent!.id, reviewerId: people.reviewer.id, number: 1 });
  const token = async (who: keyof typeof people, scopes: TokenScope[], expiresInDays = 30) =>
    (await createApiToken(db, { userId: people[who].id, name: `${who} ${tag}`, scopes, expiresInDays })).secret;
  async function cleanup() {
    const ids = Object.values(people).map((p) => p.id);
    await db.delete(submissions).where(inArray(submissions.venueId, [venue!.id]));
    await db.delete(storedFiles).where(inArray(storedFiles.uploadedBy, ids));
    await db.delete(venues).where(inArray(venues.id, [venue!.id]));
    await db.delete(user).where(inArray(user.id, ids));
  }
  return { people, venue: venue!, submission: submission!, sent: sent!, draft: draft!, token, cleanup };
}
