import type PgBoss from "pg-boss";
import { QUEUES } from "./queues";

/**
 * Queues a re-check of a round (e.g. after a large upload) instead of running it inside the
 * request. The queue is "short" per round (one waiting job per round), so ten uploads in a row leave one waiting re-check.
 * Returns false when no job runner is started in this process; the caller then re-checks inline.
 */
export async function queueRecheck(roundId: string) {
  const boss = (globalThis as { __runproofJobs?: PgBoss }).__runproofJobs;
  if (!boss) return false;
  await boss.send(QUEUES.recheck, { roundId }, { singletonKey: roundId });
  return true;
}
