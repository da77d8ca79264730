/**
 * The claim page (stated values beside the recomputed ones, with the interval used and the
 * outcome in words), the run page's version diff and series statistics, the plots' log scale and
 * zoom, the plots read from their own route (run page, reviewer and claim page), and the editor's "send the
 * digest now" reaching the authors' mailboxes.
 */
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page, type Route } from "@playwright/test";
import { mailsTo } from "./support/mail";
import { fixture } from "./support/review";
import { demo, login } from "./support/session";

// axe over pages with several charts takes a while on a busy machine.
test.describe.configure({ timeout: 180_000 });

type Draft = { venueId: string; submissionId: string; roundId: string; runIds: Record<string, string>; claimId: string };
type Sent = { venueId: string; submissionId: string; roundId: string };

async function seriousViolations(page: Page) {
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
}

test("claim page: each stated value beside the recomputed one, its interval and the outcome in words; the claim's runs overlaid from the claim's plots route", async ({ page }) => {
  const fx = fixture<Draft>("make-checked-draft.ts", `Claim page ${Date.now()}`);
  await login(page, "author");
  const claimUrl = `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/claims/${fx.claimId}`;
  const plotReads: string[] = [];
  page.on("request", (req) => {
    if (new URL(req.url()).pathname.endsWith("/plots.data")) plotReads.push(new URL(req.url()).pathname);
  });
  await page.goto(claimUrl);
  const table = page.getByTestId("stated-values");
  await expect(table).toBeVisible();
  // examples/claims/layer-zonal-flow.json: E "1 × 10^-4" for both runs → [5 × 10⁻⁵, 1.5 × 10⁻⁴) (family B: half a unit in the last digit).
  const e = table.getByTestId("stated-check").filter({ hasText: "ref-A" }).filter({ hasText: "1 × 10^-4" });
  await expect(e).toContainText("1 × 10^-4 → [5 × 10⁻⁵, 1.5 × 10⁻⁴)");
  await expect(e).toContainText("10⁻⁴");
  await expect(e).toContainText("Agrees");
  await expect(e).toHaveAttribute("data-outcome", "agrees");
  // "≥ 1.5" magnetic diffusion times: a one-sided interval.
  await expect(table.getByTestId("stated-check").filter({ hasText: "runLength.magnetic" })).toContainText("≥ 1.5 → ≥ 1.5");
  // Every row says its outcome in words, not by colour alone.
  for (const row of await table.getByTestId("stated-check").all()) await expect(row).toContainText(/Agrees|Differs|Cannot be recomputed|Cannot be decided/);
  // The comparison claim's two runs on one plot.
  const overlay = page.getByTestId("comparison-chart");
  await expect(overlay).toContainText("ref-A, strat-B");
  await expect(overlay.locator("svg .recharts-line").first()).toBeVisible();
  expect(await overlay.locator(".recharts-legend-item").count()).toBeGreaterThanOrEqual(2);
  await expect(page.getByTestId("plots-loading")).toHaveCount(0);
  expect(await seriousViolations(page), "claim page").toEqual([]);
  // The overlay came from the claim's own plots route, read once after the page was on screen.
  expect(plotReads).toEqual([`${claimUrl}/plots.data`]);
  // The page's own data names the claim's runs but carries no points (neither as objects nor as columns).
  const pageData = await (await page.request.get(`${claimUrl}.data`)).text();
  expect(pageData).toContain("strat-B");
  expect(pageData).not.toContain('"points"');
  expect(pageData).not.toMatch(/"[xy]"/);
  // The route: both runs' series column-wise, with a tag; the same tag again is answered 304 with no body (RFC 9110 §13.1.2).
  const first = await page.request.get(`${claimUrl}/plots`);
  expect(first.status()).toBe(200);
  expect(first.headers()["cache-control"]).toBe("private, no-cache");
  const body = (await first.json()) as { runs: { label: string; series: { columns: string[]; y: Record<string, number[]> } }[] };
  expect(body.runs.map((r) => r.label)).toEqual(["ref-A", "strat-B"]);
  for (const r of body.runs) expect(r.series.y[r.series.columns[0]!]!.length).toBeGreaterThan(10);
  const again = await page.request.get(`${claimUrl}/plots`, { headers: { "if-none-match": first.headers()["etag"]! } });
  expect(again.status()).toBe(304);
  expect(await again.text()).toBe("");
  // A claim that is not in the round: the route's own 404 as JSON, not the error page.
  const missing = await page.request.get(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/claims/00000000-0000-4000-8000-000000000000/plots`);
  expect(missing.status()).toBe(404);
  expect(((await missing.json()) as { error: { message: string } }).error.message).toContain("not in the round");
  // When the route refuses (here the chart's read is sent to that missing claim), the chart's place says so and "Try again" reads it again.
  const refused = `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/claims/00000000-0000-4000-8000-000000000000/plots.data`;
  const toRefused = (route: Route) => route.continue({ url: new URL(refused + new URL(route.request().url()).search, route.request().url()).toString() });
  await page.route("**/claims/*/plots.data*", toRefused);
  await page.reload();
  const failed = page.getByTestId("plots-error");
  await expect(failed).toContainText("The plots could not be loaded: This claim is not in the round, or you may not see it.");
  await expect(page.getByTestId("comparison-chart")).toHaveCount(0);
  await expect(page.getByTestId("stated-values")).toBeVisible();
  await page.unroute("**/claims/*/plots.data*", toRefused);
  await failed.getByRole("button", { name: "Try again" }).click();
  await expect(overlay.locator("svg .recharts-line").first()).toBeVisible();
  await expect(failed).toHaveCount(0);

  // The parameter-space chart on the overview: run labels drawn, none on top of another.
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1`);
  const labels = page.getByTestId("parameter-label").locator("text");
  await expect(labels.first()).toBeVisible();
  const boxes = await labels.evaluateAll((els) => els.map((e) => e.getBoundingClientRect()).map((r) => ({ x: r.x, y: r.y, w: r.width, h: r.height })));
  for (let i = 0; i < boxes.length; i++)
    for (let j = i + 1; j < boxes.length; j++) {
      const [a, b] = [boxes[i]!, boxes[j]!];
      expect(a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h, `labels ${i} and ${j} overlap`).toBe(false);
    }
});

test("run page: series statistics in the derived panel, log scale and zoom, and a diff between two versions", async ({ page }) => {
  const fx = fixture<Draft>("make-checked-draft.ts", `Run page ${Date.now()}`);
  await login(page, "author");
  const runUrl = `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/runs/${fx.runIds["ref-A"]}`;
  await page.goto(runUrl);
  const derived = page.getByTestId("run-derived");
  const stats = derived.getByTestId("series-stats");
  await expect(stats).toBeVisible();
  for (const symbol of ["⟨x⟩", "σ⟨x⟩", "τ_int", "N_eff", "t_trans", "z"]) await expect(stats.locator("abbr", { hasText: symbol }).first()).toBeVisible();
  await expect(stats.locator("abbr", { hasText: "τ_int" })).toHaveAttribute("title", /autocorrelation time/);
  await expect(stats.getByRole("rowheader", { name: "Re" })).toBeVisible();

  // Log scale: the toggle switches every column's y axis.
  const chart = page.getByTestId("series-chart");
  await expect(chart.getByTestId("series-column-plot").first()).toHaveAttribute("data-scale", "linear");
  await chart.getByLabel("Logarithmic y axis").check();
  await expect(chart.getByTestId("series-column-plot").first()).toHaveAttribute("data-scale", "log");
  // Zoom: drag across a plot, then reset.
  const plot = chart.getByTestId("series-column-plot").first().locator(".recharts-surface");
  await expect(plot).toBeVisible();
  const box = (await plot.boundingBox())!;
  await page.mouse.move(box.x + box.width * 0.4, box.y + box.height * 0.4);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.4, { steps: 8 });
  await page.mouse.move(box.x + box.width * 0.7, box.y + box.height * 0.4, { steps: 8 });
  await page.mouse.up();
  await expect(chart.getByText(/Showing t = /)).toBeVisible();
  await chart.getByRole("button", { name: "Reset zoom" }).click();
  await expect(chart.getByText(/Showing t = /)).toHaveCount(0);
  expect(await seriousViolations(page), "run page").toEqual([]);

  // A new version in the draft, then the diff between version 1 and 2.
  await page.getByLabel("Magnetic Prandtl number Pm").fill("2.5");
  await page.getByRole("button", { name: "Save as a new version" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Saved as version 2" })).toBeVisible();
  await page.goto(`${runUrl}?from=1&to=2`);
  const diff = page.getByTestId("version-diff");
  await expect(diff).toContainText("Version 1 → version 2: 1 field(s) changed");
  const row = diff.getByTestId("diff-row");
  await expect(row).toHaveCount(1);
  await expect(row).toContainText("Pm");
  await expect(row.locator("del")).toHaveText("2");
  await expect(row.locator("ins")).toHaveText("2.5");
  await expect(diff.locator("caption")).toHaveText("Controls");
  // The choice sits in the URL: the other direction reads the other way round.
  await page.goto(`${runUrl}?from=2&to=1`);
  await expect(page.getByTestId("diff-row").locator("del")).toHaveText("2.5");
});

test("plots come from the run's plots route: none in the page's data, a repeat answered 304, one run at a time for the reviewer", async ({ page, browser }) => {
  const fx = fixture<Draft>("make-review-with-plots.ts", `Plots route ${Date.now()}`);
  await login(page, "author");
  const runUrl = `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/runs/${fx.runIds["ref-A"]}`;
  const plotReads: { url: string; status: number; ifNoneMatch?: string; bodyBytes: number }[] = [];
  page.on("response", async (res) => {
    if (!new URL(res.url()).pathname.endsWith("/plots.data")) return;
    await res.finished();
    const bodyBytes = (await res.request().sizes()).responseBodySize;
    plotReads.push({ url: res.url(), status: res.status(), ifNoneMatch: (await res.request().allHeaders())["if-none-match"], bodyBytes });
  });
  await page.goto(runUrl);
  await expect(page.getByTestId("series-chart").getByTestId("series-column-plot").first().locator(".recharts-surface")).toBeVisible();
  await expect(page.getByTestId("plots-loading")).toHaveCount(0);
  expect(plotReads.map((r) => new URL(r.url).pathname)).toEqual([`${runUrl}/plots.data`]);
  // The page's own data names the files but carries no points.
  const pageData = await (await page.request.get(`${runUrl}.data`)).text();
  expect(pageData).toContain("ref-A.csv");
  expect(pageData).not.toContain('"points"');

  // The route itself: column-wise JSON with a tag; the same tag again is answered 304 with no body (RFC 9110 §13.1.2).
  const first = await page.request.get(`${runUrl}/plots`);
  expect(first.status()).toBe(200);
  expect(first.headers()["cache-control"]).toBe("private, no-cache");
  const body = (await first.json()) as { series: { columns: string[]; y: Record<string, number[]> } };
  expect(body.series.y[body.series.columns[0]!]!.length).toBeGreaterThan(10);
  const again = await page.request.get(`${runUrl}/plots`, { headers: { "if-none-match": first.headers()["etag"]! } });
  expect(again.status()).toBe(304);
  expect(await again.text()).toBe("");
  // A second visit: the browser revalidates its copy with the tag, the server answers 304 (no body
  // on the wire) and the browser hands the fetcher its cached copy (so the page sees 200).
  await page.reload();
  await expect(page.getByTestId("series-chart").getByTestId("series-column-plot").first().locator(".recharts-surface")).toBeVisible();
  await expect.poll(() => plotReads.length).toBe(2);
  expect(plotReads[0]!.bodyBytes).toBeGreaterThan(1000);
  expect(plotReads[1]!.ifNoneMatch, "the browser asks with the tag it holds").toBe(first.headers()["etag"]);
  expect(plotReads[1]!.bodyBytes, "a 304 carries no body").toBe(0);

  // The reviewer opens one run's plots: only that run's plots route is read, not its page.
  const context = await browser.newContext();
  const reviewer = await context.newPage();
  await login(reviewer, "reviewer1");
  const reads: string[] = [];
  reviewer.on("request", (req) => {
    if (req.url().includes("/runs/")) reads.push(new URL(req.url()).pathname);
  });
  await reviewer.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/review`);
  const item = reviewer.getByTestId("run-plots").filter({ hasText: "strat-B" });
  await item.getByRole("button", { name: "Show the plots of strat-B" }).click();
  await expect(item.getByTestId("series-chart")).toContainText("strat-B: time series");
  await expect(item.getByTestId("series-stats")).toBeVisible();
  expect(reads).toEqual([`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/runs/${fx.runIds["strat-B"]}/plots.data`]);
  await expect(reviewer.getByTestId("run-plots").filter({ hasText: "ref-A" }).getByTestId("series-chart")).toHaveCount(0);
  await context.close();
});

test("the editor sends a submission's digest now: asked once with who gets it, then the authors have it", async ({ page }) => {
  const title = `Digest now ${Date.now()}`;
  const fx = fixture<Sent>("make-sent-round.ts", title);
  const coauthor = demo("coauthor1");
  await login(page, "editor");
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/desk`);
  const box = page.getByTestId("digest-now");
  await expect(box).toContainText(coauthor.email);
  let asked = "";
  page.once("dialog", (d) => {
    asked = d.message();
    void d.accept();
  });
  await box.getByRole("button", { name: "Send the digest now" }).click();
  await expect(box.getByRole("status")).toContainText("Digest sent to");
  expect(asked).toContain(coauthor.email);
  let text = "";
  await expect
    .poll(async () => {
      text = (await mailsTo(coauthor.email)).find((m) => m.subject.includes("digest") && m.text.includes(title))?.text ?? "";
      return text !== "";
    }, { timeout: 30_000, message: `no digest about "${title}" reached ${coauthor.email}` })
    .toBe(true);
  expect(text).toMatch(/Round 1: \d+ mismatch flag\(s\) raised/);
});
