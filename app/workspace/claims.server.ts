import { and, asc, eq, max } from "drizzle-orm";
import { claims } from "~db/schema";
import { claimSchema, type ClaimRecord } from "~/checker/schema";
import { InvalidInput, StateConflict, type Db } from "./types";
import { zodIssues } from "./zod-issues";

export type ClaimInput = { figure?: string | null; statement?: string; record: unknown };

export function parseClaimRecord(input: unknown): ClaimRecord {
  const parsed = claimSchema.safeParse(input);
  if (!parsed.success) throw new InvalidInput("The claim does not follow runproof.claim/1.", zodIssues(parsed.error));
  return parsed.data;
}

export async function roundClaims(db: Db, roundId: string) {
  return db.select().from(claims).where(eq(claims.roundId, roundId)).orderBy(asc(claims.position), asc(claims.updatedAt));
}

/** One claim of a round, or undefined when the round has no such claim (or the id is not one). */
export async function roundClaim(db: Db, roundId: string, claimId: string) {
  if (!/^[0-9a-f-]{36}$/i.test(claimId)) return undefined;
  const [row] = await db.select().from(claims).where(and(eq(claims.id, claimId), eq(claims.roundId, roundId)));
  return row;
}

/** The labels of the runs a claim names, once each (at most 200: what its overlay may draw). */
export function claimRunLabels(record: unknown): string[] {
  return [...new Set(((record as { runs?: { label: string }[] } | null)?.runs ?? []).map((r) => r.label))].slice(0, 200);
}

export async function createClaim(db: Db, roundId: string, input: ClaimInput) {
  const record = parseClaimRecord(input.record);
  const [{ last } = { last: 0 }] = await db.select({ last: max(claims.position) }).from(claims).where(eq(claims.roundId, roundId));
  const [row] = await db
    .insert(claims)
    .values({ roundId, record, figure: input.figure ?? null, statement: input.statement ?? "", position: (last ?? 0) + 1 })
    .returning();
  return row!;
}

/** Optimistic concurrency: the update applies only to the version the editor of the form saw. */
export async function updateClaim(db: Db, roundId: string, claimId: string, expectedVersion: number, input: ClaimInput) {
  // A version outside what can exist (not a whole number, or past the integer column) is stale too.
  if (!Number.isSafeInteger(expectedVersion) || expectedVersion < 1 || expectedVersion >= 2 ** 31 - 1) {
    throw new StateConflict("This form names a version of the claim that does not exist: reload the page and apply your change again.");
  }
  const record = parseClaimRecord(input.record);
  const [row] = await db
    .update(claims)
    .set({ record, figure: input.figure ?? null, statement: input.statement ?? "", version: expectedVersion + 1, updatedAt: new Date() })
    .where(and(eq(claims.id, claimId), eq(claims.roundId, roundId), eq(claims.version, expectedVersion)))
    .returning();
  if (!row) throw new StateConflict("This claim was changed by someone else since you opened it: reload and apply your change again.");
  return row;
}

export async function deleteClaim(db: Db, roundId: string, claimId: string) {
  await db.delete(claims).where(and(eq(claims.id, claimId), eq(claims.roundId, roundId)));
}
