/**
 * npm run worker: one job process (pg-boss) — outbox delivery, reminders, digests and round
 * checks. Start any number of them beside any number of web processes on one database. The
 * checker's CPU work (file analyses, a round's evaluation) runs in this process's checker
 * threads (app/threads/checker-pool.server.ts), each with its own heap limit and time budget.
 */
import { createDatabase } from "../database/client";
import { env } from "../app/config/env.server";
import { startJobs } from "../app/jobs/boss.server";
import { closeCheckerPool } from "../app/threads/checker-pool.server";

const { db, sql } = createDatabase(env.DATABASE_URL, 4);
const boss = await startJobs(db, {
  databaseUrl: env.DATABASE_URL,
  smtpHost: env.SMTP_HOST,
  smtpPort: env.SMTP_PORT,
  from: env.MAIL_FROM,
  pollMs: env.OUTBOX_POLL_MS,
  deliverMail: env.OUTBOX_WORKER,
});
console.log(`Runproof worker ready (pid ${process.pid})`);

let stopping = false;
for (const signal of ["SIGTERM", "SIGINT"] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    // Running jobs get 10 s to finish; an unfinished one expires and another worker retries it.
    void boss
      .stop({ graceful: true, timeout: 10_000, wait: true })
      .catch(() => {})
      .then(() => Promise.all([sql.end({ timeout: 5 }), closeCheckerPool()]))
      .finally(() => process.exit(0));
  });
}
