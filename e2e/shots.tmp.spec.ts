import { test } from "@playwright/test";
import { readFileSync } from "node:fs";
const w = JSON.parse(readFileSync("/tmp/world.json", "utf8"));
const PW = "matrix-passphrase-7741";
const shots: [string, string, string][] = [];
const c = w.cells.single;
const r = (cell: any, tail = "") => `/venues/${cell.venueId}/submissions/${cell.submissionId}/rounds/${cell.round}${tail}`;
shots.push(["editor", r(c["under-review"], "/desk"), "editor-desk"]);
shots.push(["editor", r(c.draft, "/desk"), "editor-draft-404"]);
shots.push(["reviewer", r(c["under-review"], "/review"), "reviewer-review"]);
shots.push(["invited", r(c["under-review"], "/review"), "invited-review"]);
shots.push(["author", r(c.decided, "/decision"), "author-decision"]);
shots.push(["author", r(c.sent, ""), "author-sent-overview"]);
shots.push(["author", `/venues/${c.sent.venueId}/submissions/${c.sent.submissionId}/details`, "author-details-frozen"]);
shots.push(["invited", "/dashboard", "invited-dashboard"]);
shots.push(["reviewer", r(c["under-review"], "/changes"), "reviewer-changes"]);
test("shots", async ({ browser }) => {
  test.setTimeout(300_000);
  for (const [who, url, name] of shots) {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    const res = await page.request.post("/api/auth/sign-in/email", { data: { email: w.people[who].email, password: PW }, headers: { origin: process.env.ORIGIN_URL! } });
    if (res.status() !== 200) throw new Error(await res.text());
    await page.goto(url);
    await page.screenshot({ path: `/tmp/shots/${name}.png`, fullPage: true });
    await ctx.close();
  }
});
