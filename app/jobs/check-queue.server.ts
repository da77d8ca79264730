import PgBoss from "pg-boss";
import { env } from "~/config/env.server";
import { QUEUE_SETTINGS, QUEUES } from "./queues";

const g = globalThis as { __runproofJobs?: PgBoss; __runproofSender?: Promise<PgBoss> };

/**
 * The web process's handle on the queues: sends jobs, runs none (no maintenance, no cron).
 * Workers (`npm run worker`) do the work; in a worker or a test that started the job runner,
 * that runner's instance is used.
 */
export function jobSender(): Promise<PgBoss> | null {
  if (g.__runproofJobs) return Promise.resolve(g.__runproofJobs);
  if (!env.JOBS_QUEUE) return null;
  g.__runproofSender ??= (async () => {
    const boss = new PgBoss({ connectionString: env.DATABASE_URL, max: 2, schema: "pgboss", supervise: false, schedule: false });
    boss.on("error", (error) => console.warn("jobs:", error.message));
    await boss.start();
    const settings = QUEUE_SETTINGS[QUEUES.recheck];
    if (!(await boss.getQueue(QUEUES.recheck))) await boss.createQueue(QUEUES.recheck, { name: QUEUES.recheck, ...settings });
    return boss;
  })().catch((e) => {
    g.__runproofSender = undefined;
    throw e;
  });
  return g.__runproofSender;
}

/** Stops the sender of this process (graceful shutdown). */
export async function stopJobSender() {
  const sender = g.__runproofSender;
  g.__runproofSender = undefined;
  if (sender) await (await sender.catch(() => null))?.stop({ graceful: false, wait: true });
}

/**
 * Queues the check of a round for the workers. The queue is "stately" per round (one waiting
 * job per round), so ten uploads in a row leave one waiting check. Returns false when this
 * process queues no jobs (JOBS_QUEUE=false); the workers' sweep then finds the round.
 */
export async function queueRecheck(roundId: string) {
  const sender = jobSender();
  if (!sender) return false;
  await (await sender).send(QUEUES.recheck, { roundId }, { singletonKey: roundId });
  return true;
}
