import PgBoss from "pg-boss";
import type { Database } from "~db/client";
import { deliverDue } from "~/mail/deliver.server";
import { smtpTransport } from "~/mail/transport.server";
import { runDigests } from "~/review/digest.server";
import { QUEUES } from "./queues";
import { sendReminders } from "./reminders.server";
import { recheckRound } from "~/workspace/recheck.server";

type JobOpts = { databaseUrl: string; smtpHost: string; smtpPort: number; from: string; pollMs: number };

/**
 * Starts pg-boss in the server process. Jobs live in PostgreSQL, so several app instances
 * share one database without doing the same work twice: the outbox pass is a "short" queue
 * (one waiting job at most) that re-queues itself, cron jobs are claimed by one instance, and
 * each handler is itself safe to repeat (SKIP LOCKED in the outbox, dedupe keys in reminders
 * and digests).
 */
export async function startJobs(db: Database, opts: JobOpts) {
  const boss = new PgBoss({ connectionString: opts.databaseUrl, max: 3, schema: "pgboss" });
  boss.on("error", (error) => console.warn("jobs:", error.message));
  await boss.start();
  // "short": at most one *waiting* job per queue (per round for re-checks), however many
  // instances send; an active job of an instance that died never blocks the next pass.
  for (const name of Object.values(QUEUES)) {
    const short = name === QUEUES.outbox || name === QUEUES.recheck;
    const options = { name, policy: short ? ("short" as const) : ("singleton" as const), expireInSeconds: short ? 120 : 900 };
    await boss.createQueue(name, options);
    await boss.updateQueue(name, options);
  }

  const transport = smtpTransport(opts.smtpHost, opts.smtpPort);
  const pollMs = Math.max(500, opts.pollMs);
  const nextPass = () => boss.send(QUEUES.outbox, {}, { startAfter: new Date(Date.now() + pollMs) }).catch(() => null);
  await boss.work(QUEUES.outbox, { pollingIntervalSeconds: pollMs / 1000 }, async () => {
    try {
      await deliverDue(db, transport, opts.from);
    } finally {
      await nextPass();
    }
  });
  await boss.work<{ roundId: string }>(QUEUES.recheck, async ([job]) => void (job && (await recheckRound(db, job.data.roundId))));
  await boss.work(QUEUES.reminders, async () => void (await sendReminders(db)));
  await boss.work(QUEUES.digestsDaily, async () => void (await runDigests(db, new Date(), "daily")));
  await boss.work(QUEUES.digestsWeekly, async () => void (await runDigests(db, new Date(), "weekly")));

  // A cron pass every minute restarts the outbox chain should it ever break.
  await boss.schedule(QUEUES.outbox, "* * * * *");
  await boss.schedule(QUEUES.reminders, "0 * * * *");
  await boss.schedule(QUEUES.digestsDaily, "0 6 * * *");
  await boss.schedule(QUEUES.digestsWeekly, "0 6 * * 1");
  await boss.send(QUEUES.outbox, {});
  (globalThis as { __runproofJobs?: PgBoss }).__runproofJobs = boss;
  return boss;
}
