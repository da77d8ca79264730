/**
 * Generated hostile requests (fast-check) to every route with an action, read from app/routes.ts:
 * none may answer ≥ 500, and a refused request (≥ 400) may leave no row behind. A few cases per
 * action here; `npm run measure:reliability -- --fuzz` sends 500 per action and reads the server's log.
 */
import { expect, test } from "@playwright/test";
import postgres from "postgres";
import { actionTargets, fuzzActions, signIn, worldIds, type Session, type Who } from "./support/action-fuzz";
import type { AccessWorld } from "./support/make-access-world";
import { WORLD_PASSWORD } from "./support/make-access-world";
import { ORIGIN } from "./support/origin";
import { fixture, TEST_DB } from "./support/review";

const CASES = Number(process.env.FUZZ_CASES ?? 12);

test("every form and API action survives generated hostile input: no 5xx, nothing stored when refused", async () => {
  test.setTimeout(600_000);
  const { world, authorToken } = fixture<{ world: AccessWorld; authorToken: string }>("make-fuzz-world.ts", `f${Date.now()}`);
  const targets = actionTargets(world);
  expect(targets.length, "routes with an action").toBeGreaterThan(25);
  const sessions: Partial<Record<Who, Session>> = { anonymous: { cookie: "" } };
  for (const who of new Set(targets.map((t) => t.who))) {
    if (who === "anonymous") continue;
    sessions[who] = await signIn(ORIGIN, world.people[who].email, WORLD_PASSWORD);
  }
  sessions.author!.token = authorToken;
  const sql = postgres(TEST_DB, { max: 1 });
  try {
    const { findings, reports } = await fuzzActions({ origin: ORIGIN, sql, targets, sessions, ids: worldIds(world), numRuns: CASES });
    console.log(`action fuzz: ${reports.reduce((n, r) => n + r.cases, 0)} requests to ${reports.length} actions`);
    expect(findings, findings.slice(0, 20).map((f) => `${f.status} ${f.target}: ${f.what}\n   sent: ${f.request}`).join("\n")).toEqual([]);
  } finally {
    await sql.end({ timeout: 5 });
  }
});
