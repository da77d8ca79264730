/**
 * How the reviewer's flags table behaves with a round of 800 flags, measured in Chromium against a
 * running production server: document time, time until the table answers keys, the cost of a key
 * press (j, and x on a row), of opening a group, and of a change of grouping. Results: docs/flags-table.md.
 *
 *   BENCH_URL=http://127.0.0.1:3152 DATABASE_URL=…_test npx tsx scripts/bench-flags-table.ts [flags]
 *
 * The round is made with the test fixtures (a sent round that demo reviewer 1 accepted), then its
 * flags are multiplied by copying the checker's own rows with new fingerprints (nothing is re-checked).
 */
import { chromium } from "@playwright/test";
import { eq } from "drizzle-orm";
import { writeFileSync } from "node:fs";
import { createDatabase } from "../database/client";
import { DEMO_PASSWORD, demoPeople } from "../database/demo-data";
import { flags } from "../database/schema";
import { makeReviewOpen } from "../e2e/support/make-review-open";

const base = process.env.BENCH_URL ?? "http://127.0.0.1:3100";
const url = process.env.DATABASE_URL ?? "";
if (!new URL(url || "postgres://x/none").pathname.endsWith("_test")) throw new Error("bench-flags-table only writes to a *_test database (set DATABASE_URL)");
const count = Math.min(5000, Math.max(10, Number(process.argv[2] ?? 800) || 800));

const { db, sql } = createDatabase(url, 2);
const fx = await makeReviewOpen(db, `Flags table bench ${Date.now()}`);
const seedRows = await db.select().from(flags).where(eq(flags.roundId, fx.roundId));
const copies = [];
for (let i = seedRows.length; i < count; i++) {
  const { id: _id, createdAt: _c, ...f } = seedRows[i % seedRows.length]!;
  copies.push({ ...f, fingerprint: `${f.fingerprint}#bench-${i}`, message: `${f.message} (copy ${i})` });
}
for (let i = 0; i < copies.length; i += 500) await db.insert(flags).values(copies.slice(i, i + 500));
await sql.end({ timeout: 5 });

const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/lib/chromium/chromium", args: ["--no-sandbox", "--disable-gpu"] });
const context = await browser.newContext({ baseURL: base, viewport: { width: 1440, height: 1000 } });
const page = await context.newPage();
const signIn = await page.request.post("/api/auth/sign-in/email", {
  data: { email: demoPeople.find((p) => p.key === "reviewer1")!.email, password: DEMO_PASSWORD },
  headers: { origin: base },
});
if (signIn.status() !== 200) throw new Error(`sign-in failed: ${signIn.status()}`);
const path = `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/review`;

const results: { what: string; ms: number }[] = [];
async function time(what: string, run: () => Promise<unknown>) {
  const t0 = performance.now();
  await run();
  results.push({ what, ms: Math.round(performance.now() - t0) });
}
const ready = () => page.locator('[data-testid="flags-table"][data-ready="true"]').waitFor();
for (let i = 0; i < 3; i++) {
  await time(`open the workspace until the table answers keys (visit ${i + 1})`, async () => {
    await page.goto(path, { waitUntil: "commit" });
    await ready();
  });
}
const rows = () => page.locator('[data-testid="flag-row"]').count();
const shownAtFirst = await rows();
await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
await time("j (to the first group header)", async () => {
  await page.keyboard.press("j");
  await page.waitForFunction(() => document.activeElement?.tagName === "BUTTON");
});
await time("j (to the first row)", async () => {
  await page.keyboard.press("j");
  await page.waitForFunction(() => document.activeElement?.getAttribute("data-testid") === "flag-row");
});
await time("x (open the row's numbers)", async () => {
  await page.keyboard.press("x");
  await page.locator('[data-testid="flag-detail"]').first().waitFor();
});
await time("group by run", async () => {
  await page.getByRole("radio", { name: "Run" }).click();
  await page.waitForURL(/group=run/);
  await page.locator('[data-testid="flag-group"][data-group^="Run "]').first().waitFor();
});
const groups = await page.locator('[data-testid="flag-group"]').count();
await time("open every group (each shows 100 rows, then “Show more”)", async () => {
  const closed = page.locator('[data-testid="flag-group"] button[aria-expanded="false"]');
  while ((await closed.count()) > 0) await closed.first().click();
});
const shownOpen = await rows();
const version = browser.version();
await browser.close();

const report = [
  "# The flags table with many flags",
  "",
  `Measured by \`scripts/bench-flags-table.ts\` (${count} flags in one round, reviewer 1's workspace, Chromium ${version} headless, 1440×1000) against the production server at ${new Date().toISOString().slice(0, 10)}, on the shared 2-core development machine (other work ran at the same time, so read the numbers as an upper bound).`,
  "",
  `Rows rendered on arrival: ${shownAtFirst} (groups start closed above 150 flags, except the first, which shows at most 100 rows); after opening all ${groups} groups by run: ${shownOpen}.`,
  "",
  "| step | ms |",
  "| --- | ---: |",
  ...results.map((r) => `| ${r.what} | ${r.ms} |`),
  "",
].join("\n");
writeFileSync(new URL("../docs/flags-table.md", import.meta.url), report);
process.stdout.write(report);
