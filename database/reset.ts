import postgres from "postgres";
import { parseEnv } from "../app/config/env-schema";

// Drops every table of the configured database (the test database, usually) so migrations start clean.
const env = parseEnv(process.env);
const sql = postgres(env.DATABASE_URL, { max: 1, onnotice: () => {} });
try {
  await sql`drop schema if exists public cascade`;
  await sql`drop schema if exists drizzle cascade`;
  // pg-boss's queues (app/jobs/): the app recreates them at start.
  await sql`drop schema if exists pgboss cascade`;
  await sql`create schema public`;
  console.log(`reset ${new URL(env.DATABASE_URL).pathname.slice(1)}`);
} finally {
  await sql.end({ timeout: 5 });
}
