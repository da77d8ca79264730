import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import * as schema from "./schema";

export type Database = ReturnType<typeof createDatabase>["db"];

// Kept on globalThis: the server entry and the app bundle each hold a copy of this module.
const sent = globalThis as { __runproofSqlStatements?: number };

/** Statements this process has sent to PostgreSQL since it started (exported by /metrics). */
export function sqlStatementsSent(): number {
  return sent.__runproofSqlStatements ?? 0;
}

/** One pool per process; idle connections close so the process can exit on SIGTERM. */
export function createDatabase(url: string, max = 10) {
  const sql = postgres(url, {
    max,
    idle_timeout: 20,
    onnotice: () => {},
    debug: () => {
      sent.__runproofSqlStatements = (sent.__runproofSqlStatements ?? 0) + 1;
    },
  });
  const db = drizzle(sql, { schema });
  return { sql, db };
}
