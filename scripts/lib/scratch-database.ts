/**
 * A database of its own for a measurement or fault run, so it neither disturbs nor is disturbed by
 * tests using runproof_test: dropped if present, created, migrated (and seeded with the demo when
 * asked). The name always ends in `_test`.
 */
import { execFileSync } from "node:child_process";
import postgres from "postgres";

export async function scratchDatabase(name: string, opts: { seed?: boolean } = {}) {
  const base = process.env.RUNPROOF_TEST_DATABASE_URL ?? process.env.DATABASE_URL;
  if (!base) throw new Error("RUNPROOF_TEST_DATABASE_URL is not set: source scripts/lib/common.sh (or run through npm run)");
  const dbName = `runproof_${name}_test`;
  const admin = postgres(base, { max: 1, onnotice: () => {} });
  try {
    await admin.unsafe(`drop database if exists "${dbName}" with (force)`);
    await admin.unsafe(`create database "${dbName}"`);
  } finally {
    await admin.end({ timeout: 5 });
  }
  const url = new URL(base);
  url.pathname = `/${dbName}`;
  const env = { ...process.env, DATABASE_URL: url.href, NODE_ENV: "test" };
  execFileSync("node_modules/.bin/tsx", ["database/migrate.ts"], { env, stdio: ["ignore", "ignore", "inherit"] });
  if (opts.seed) execFileSync("node_modules/.bin/tsx", ["database/seed.ts"], { env, stdio: ["ignore", "ignore", "inherit"] });
  return url.href;
}

export async function dropScratchDatabase(url: string) {
  const name = new URL(url).pathname.slice(1);
  if (!name.endsWith("_test")) return;
  const admin = postgres(process.env.RUNPROOF_TEST_DATABASE_URL ?? url, { max: 1, onnotice: () => {} });
  try {
    await admin.unsafe(`drop database if exists "${name}" with (force)`);
  } finally {
    await admin.end({ timeout: 5 });
  }
}
