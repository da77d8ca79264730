import { eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { namelistMaps } from "~db/schema";
import { createClaim, deleteClaim, updateClaim, type ClaimInput } from "./claims.server";
import { type KeyMap, mergeRecord, namelistToRecord } from "./namelist-map";
import { markRoundChanged, requestRecheck } from "./recheck.server";
import { draftRoundById } from "./rounds.server";
import { createRun, parseRunRecord, reviseRun, type RunOrigin } from "./runs.server";
import { InvalidInput } from "./types";
import { findBadText } from "~/lib/edge-input";

/**
 * The workspace's writes: each validates and writes in one transaction that also marks the
 * round changed, then queues the round's check. The request returns at once; pages show
 * "checking…" until the worker has stored the flags of what changed.
 */
export async function addRun(db: Database, opts: { submissionId: string; roundId: string; input: unknown; origin: RunOrigin; userId: string }) {
  await draftRoundById(db, opts.roundId);
  const record = parseRunRecord(opts.input);
  const out = await db.transaction(async (tx) => {
    const created = await createRun(tx, { ...opts, record });
    await markRoundChanged(tx, opts.roundId);
    return created;
  });
  await requestRecheck(db, opts.roundId, { alreadyMarked: true });
  return out;
}

export async function editRun(db: Database, opts: { runId: string; roundId: string; input: unknown; origin: RunOrigin; userId: string; expectedVersion?: number }) {
  await draftRoundById(db, opts.roundId);
  const record = parseRunRecord(opts.input);
  const out = await db.transaction(async (tx) => {
    const revised = await reviseRun(tx, { ...opts, record });
    await markRoundChanged(tx, opts.roundId);
    return revised;
  });
  await requestRecheck(db, opts.roundId, { alreadyMarked: true });
  return out;
}

/** JSON text → record, with a clear message on a syntax error (position and what to fix). */
export function parseJsonText(text: string): unknown {
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    const pos = /position (\d+)/.exec(msg);
    let where = "file";
    if (pos) {
      const before = text.slice(0, Number(pos[1]));
      where = `line ${before.split("\n").length}, column ${before.length - before.lastIndexOf("\n")}`;
    }
    throw new InvalidInput("The file is not valid JSON; nothing was stored.", [{ path: where, message: `${msg}. Check for a missing comma, quote or bracket.` }]);
  }
  const bad = findBadText(parsed);
  if (bad) throw new InvalidInput(`The file's text cannot be stored: ${bad.message}; nothing was stored.`, [bad]);
  return parsed;
}

export async function savedKeyMap(db: Database, submissionId: string): Promise<KeyMap | null> {
  const [row] = await db.select({ map: namelistMaps.map }).from(namelistMaps).where(eq(namelistMaps.submissionId, submissionId));
  return row?.map ?? null;
}

export async function saveKeyMap(db: Database, submissionId: string, map: KeyMap) {
  await db
    .insert(namelistMaps)
    .values({ submissionId, map })
    .onConflictDoUpdate({ target: namelistMaps.submissionId, set: { map, updatedAt: new Date() } });
}

/** A namelist import: the form's base fields, the namelist's values mapped over them. */
export async function importNamelist(
  db: Database,
  opts: { submissionId: string; roundId: string; base: Record<string, unknown>; namelist: string; map: KeyMap; userId: string },
) {
  const mapped = namelistToRecord(opts.namelist, opts.map);
  return addRun(db, { ...opts, input: mergeRecord(opts.base, mapped), origin: "namelist" });
}

export async function addClaim(db: Database, roundId: string, input: ClaimInput) {
  await draftRoundById(db, roundId);
  const row = await db.transaction(async (tx) => {
    const created = await createClaim(tx, roundId, input);
    await markRoundChanged(tx, roundId);
    return created;
  });
  await requestRecheck(db, roundId, { alreadyMarked: true });
  return row;
}

export async function changeClaim(db: Database, roundId: string, claimId: string, version: number, input: ClaimInput) {
  await draftRoundById(db, roundId);
  const row = await db.transaction(async (tx) => {
    const updated = await updateClaim(tx, roundId, claimId, version, input);
    await markRoundChanged(tx, roundId);
    return updated;
  });
  await requestRecheck(db, roundId, { alreadyMarked: true });
  return row;
}

export async function removeClaim(db: Database, roundId: string, claimId: string) {
  await draftRoundById(db, roundId);
  await db.transaction(async (tx) => {
    await deleteClaim(tx, roundId, claimId);
    await markRoundChanged(tx, roundId);
  });
  await requestRecheck(db, roundId, { alreadyMarked: true });
}
