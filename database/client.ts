import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import * as schema from "./schema";

export type Database = ReturnType<typeof createDatabase>["db"];

/** One pool per process; idle connections close so the process can exit on SIGTERM. */
export function createDatabase(url: string, max = 10) {
  const sql = postgres(url, { max, idle_timeout: 20, onnotice: () => {} });
  const db = drizzle(sql, { schema });
  return { sql, db };
}
