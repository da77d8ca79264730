import { createContext } from "react-router";
import { createDatabase, type Database } from "~db/client";
import { env } from "~/config/env.server";
import { stopJobSender } from "~/jobs/check-queue.server";

// Kept on globalThis so the dev server's module reloads do not open a new pool each time.
const g = globalThis as unknown as { __runproofDb?: ReturnType<typeof createDatabase>; __runproofExit?: boolean };
g.__runproofDb ??= createDatabase(env.DATABASE_URL);

export const db: Database = g.__runproofDb.db;
export const sqlClient = g.__runproofDb.sql;

/** The database handle as loaders and actions receive it: `context.get(dbContext)`. */
export const dbContext = createContext<Database>();

// The web process runs no jobs: outbox delivery, reminders, digests and round checks run in
// `npm run worker` processes (app/jobs/boss.server.ts). It only queues round checks.

/** Stops the job sender and closes the pool; the server entry calls it once requests have drained. */
export async function closeDatabaseAndJobs(): Promise<void> {
  await stopJobSender().catch(() => {});
  await sqlClient.end({ timeout: 5 });
}

// Under the server entry (scripts/serve.mjs) the server drains requests first and then calls
// closeDatabaseAndJobs; under the development server this module stops the process itself.
if (!g.__runproofExit && !(globalThis as { __runproofServerOwnsShutdown?: boolean }).__runproofServerOwnsShutdown) {
  g.__runproofExit = true;
  for (const signal of ["SIGTERM", "SIGINT"] as const) {
    process.once(signal, () => void closeDatabaseAndJobs().catch(() => {}).finally(() => process.exit(0)));
  }
}
