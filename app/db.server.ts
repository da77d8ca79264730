import { createContext } from "react-router";
import { createDatabase, type Database } from "~db/client";
import { env } from "~/config/env.server";
import { startJobs } from "~/jobs/boss.server";

// Kept on globalThis so the dev server's module reloads do not open a new pool each time.
const g = globalThis as unknown as { __runproofDb?: ReturnType<typeof createDatabase>; __runproofWorker?: boolean; __runproofBoss?: Promise<{ stop(o?: object): Promise<void> } | null> };
g.__runproofDb ??= createDatabase(env.DATABASE_URL);

export const db: Database = g.__runproofDb.db;
export const sqlClient = g.__runproofDb.sql;

/** The database handle as loaders and actions receive it: `context.get(dbContext)`. */
export const dbContext = createContext<Database>();

if (env.OUTBOX_WORKER && !g.__runproofWorker) {
  g.__runproofWorker = true;
  // pg-boss runs outbox delivery, reminders and digests (app/jobs/boss.server.ts).
  g.__runproofBoss = startJobs(db, {
    databaseUrl: env.DATABASE_URL,
    smtpHost: env.SMTP_HOST,
    smtpPort: env.SMTP_PORT,
    from: env.MAIL_FROM,
    pollMs: env.OUTBOX_POLL_MS,
  }).catch((error) => {
    console.warn("jobs: could not start:", error instanceof Error ? error.message : error);
    return null;
  });
}

/** Stops the job runner and closes the pool; the server entry calls it once requests have drained. */
export async function closeDatabaseAndJobs(): Promise<void> {
  const boss = await (g.__runproofBoss ?? Promise.resolve(null)).catch(() => null);
  await boss?.stop({ graceful: true, timeout: 5000 }).catch(() => {});
  await sqlClient.end({ timeout: 5 });
}

// Under the server entry (scripts/serve.mjs) the server drains requests first and then calls
// closeDatabaseAndJobs; under the development server this module stops the process itself.
if (!(globalThis as { __runproofServerOwnsShutdown?: boolean }).__runproofServerOwnsShutdown) {
  for (const signal of ["SIGTERM", "SIGINT"] as const) {
    process.once(signal, () => void closeDatabaseAndJobs().catch(() => {}).finally(() => process.exit(0)));
  }
}
