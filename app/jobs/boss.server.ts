import PgBoss from "pg-boss";
import type { Database } from "~db/client";
import { deliverDue } from "~/mail/deliver.server";
import { smtpTransport } from "~/mail/transport.server";
import { runDigests } from "~/review/digest.server";
import { QUEUE_SETTINGS, QUEUES } from "./queues";
import { sendReminders } from "./reminders.server";
import { recheckRound, roundsBehind } from "~/workspace/recheck.server";

type JobOpts = { databaseUrl: string; smtpHost: string; smtpPort: number; from: string; pollMs: number; deliverMail?: boolean };

/** Creates (or updates) every queue with its settings; safe to call from any number of processes. */
export async function ensureQueues(boss: PgBoss) {
  for (const [name, settings] of Object.entries(QUEUE_SETTINGS)) {
    const options = { name, ...settings };
    await boss.createQueue(name, options);
    await boss.updateQueue(name, options);
  }
}

/** Queues the check of one round (one waiting job per round at most: see QUEUE_SETTINGS). */
export async function sendRecheck(boss: PgBoss, roundId: string) {
  return boss.send(QUEUES.recheck, { roundId }, { singletonKey: roundId });
}

/**
 * Starts the job handlers of a worker process (`npm run worker`; any number of them). Jobs live
 * in PostgreSQL, so workers share one database without doing the same work twice: the outbox
 * pass is a "short" queue that re-queues itself, cron jobs are claimed by one worker, round
 * checks are "stately" per round and idempotent, and each handler is itself safe to repeat
 * (SKIP LOCKED in the outbox, dedupe keys in reminders and digests, input keys in checks).
 */
export async function startJobs(db: Database, opts: JobOpts) {
  const boss = new PgBoss({ connectionString: opts.databaseUrl, max: 4, schema: "pgboss" });
  boss.on("error", (error) => console.warn("jobs:", error.message));
  await boss.start();
  await ensureQueues(boss);

  const transport = smtpTransport(opts.smtpHost, opts.smtpPort);
  const pollMs = Math.max(500, opts.pollMs);
  const nextPass = () => boss.send(QUEUES.outbox, {}, { startAfter: new Date(Date.now() + pollMs) }).catch(() => null);
  const deliverMail = opts.deliverMail !== false;
  if (deliverMail) {
    await boss.work(QUEUES.outbox, { pollingIntervalSeconds: pollMs / 1000 }, async () => {
      try {
        await deliverDue(db, transport, opts.from);
      } finally {
        await nextPass();
      }
    });
  }
  await boss.work<{ roundId: string }>(QUEUES.recheck, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
    if (job) await recheckRound(db, job.data.roundId);
  });
  // Safety net: a change whose job could not be queued is still checked within a minute.
  const sweep = async () => {
    for (const id of await roundsBehind(db)) await sendRecheck(boss, id);
  };
  await boss.work(QUEUES.recheckSweep, sweep);
  await boss.work(QUEUES.reminders, async () => void (await sendReminders(db)));
  await boss.work(QUEUES.digestsDaily, async () => void (await runDigests(db, new Date(), "daily")));
  await boss.work(QUEUES.digestsWeekly, async () => void (await runDigests(db, new Date(), "weekly")));

  // A cron pass every minute restarts the outbox chain should it ever break.
  if (deliverMail) await boss.schedule(QUEUES.outbox, "* * * * *");
  await boss.schedule(QUEUES.recheckSweep, "* * * * *");
  await boss.schedule(QUEUES.reminders, "0 * * * *");
  await boss.schedule(QUEUES.digestsDaily, "0 6 * * *");
  await boss.schedule(QUEUES.digestsWeekly, "0 6 * * 1");
  if (deliverMail) await boss.send(QUEUES.outbox, {});
  await sweep();
  (globalThis as { __runproofJobs?: PgBoss }).__runproofJobs = boss;
  return boss;
}
