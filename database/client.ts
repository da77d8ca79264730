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

/**
 * Seconds before the pool tries to connect again after `retries` failed attempts in a row:
 * 0.1 s doubling, at most 2 s, with jitter. The driver's default (3^n/100 s, up to 20 s) left
 * pages waiting 15–20 s after a restarted PostgreSQL was back (faults/faults.test.ts).
 */
export const reconnectDelaySeconds = (retries: number) => Math.min(0.1 * 2 ** retries, 2) * (0.5 + Math.random() / 2);

/** One pool per process; idle connections close so the process can exit on SIGTERM. */
export function createDatabase(url: string, max = 10) {
  const sql = postgres(url, {
    max,
    idle_timeout: 20,
    backoff: reconnectDelaySeconds,
    onnotice: () => {},
    debug: () => {
      sent.__runproofSqlStatements = (sent.__runproofSqlStatements ?? 0) + 1;
    },
  });
  const db = drizzle(preparedStatements(sql), { schema });
  return { sql, db };
}

/**
 * The ORM sends each query as an unnamed statement, which PostgreSQL parses and plans on every
 * execution; for a page's short queries that planning is most of the database's work. Named
 * statements (the driver keeps one per distinct query text on each connection) are parsed once
 * and their plans reused. Transactions get the same treatment through `begin`.
 */
function preparedStatements(sql: postgres.Sql): postgres.Sql {
  const wrap = <T extends postgres.Sql | postgres.TransactionSql>(client: T): T =>
    new Proxy(client, {
      get(target, prop, receiver) {
        if (prop === "unsafe") {
          return (query: string, args?: postgres.ParameterOrJSON<never>[], options?: postgres.UnsafeQueryOptions) =>
            // A text without parameters may hold several statements (migrations), which cannot be prepared.
            target.unsafe(query, args, args?.length ? { ...options, prepare: true } : options);
        }
        if (prop === "begin") {
          return (...args: unknown[]) => {
            const fn = args.pop() as (tx: postgres.TransactionSql) => unknown;
            return (target as postgres.Sql).begin(...(args as [string]), (tx) => fn(wrap(tx)));
          };
        }
        if (prop === "savepoint") {
          return (...args: unknown[]) => {
            const fn = args.pop() as (tx: postgres.TransactionSql) => unknown;
            return (target as postgres.TransactionSql).savepoint(...(args as [string]), (tx) => fn(wrap(tx)));
          };
        }
        return Reflect.get(target, prop, receiver);
      },
    });
  return wrap(sql);
}
