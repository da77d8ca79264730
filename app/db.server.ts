import { createContext } from "react-router";
import { createDatabase, type Database } from "~db/client";
import { env } from "~/config/env.server";
import { startOutboxWorker } from "~/mail/worker.server";

// Kept on globalThis so the dev server's module reloads do not open a new pool each time.
const g = globalThis as unknown as { __runproofDb?: ReturnType<typeof createDatabase>; __runproofWorker?: boolean };
g.__runproofDb ??= createDatabase(env.DATABASE_URL);

export const db: Database = g.__runproofDb.db;
export const sqlClient = g.__runproofDb.sql;

/** The database handle as loaders and actions receive it: `context.get(dbContext)`. */
export const dbContext = createContext<Database>();

if (env.OUTBOX_WORKER && !g.__runproofWorker) {
  g.__runproofWorker = true;
  startOutboxWorker(db, {
    smtpHost: env.SMTP_HOST,
    smtpPort: env.SMTP_PORT,
    from: env.MAIL_FROM,
    pollMs: env.OUTBOX_POLL_MS,
  });
}

for (const signal of ["SIGTERM", "SIGINT"] as const) {
  process.once(signal, () => {
    void sqlClient.end({ timeout: 5 }).finally(() => process.exit(0));
  });
}
