import { migrate } from "drizzle-orm/postgres-js/migrator";
import { parseEnv } from "../app/config/env-schema";
import { createDatabase } from "./client";

const env = parseEnv(process.env);
const { db, sql } = createDatabase(env.DATABASE_URL, 1);
try {
  await migrate(db, { migrationsFolder: new URL("./migrations", import.meta.url).pathname });
  console.log(`migrations applied to ${new URL(env.DATABASE_URL).pathname.slice(1)}`);
} finally {
  await sql.end({ timeout: 5 });
}
