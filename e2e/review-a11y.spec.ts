import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { fixture } from "./support/review";
import { login } from "./support/session";

// The review cycle's pages, checked with axe-core (WCAG rules as axe implements them).
type Fx = { venueId: string; submissionId: string };
let fx: Fx;
test.beforeAll(() => {
  fx = fixture<Fx>("make-decided-round.ts", `Accessible review ${Date.now()}`);
});

async function seriousViolations(page: Page) {
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
}

test("the editor's desk and round page", async ({ page }) => {
  await login(page, "editor");
  await page.goto(`/venues/${fx.venueId}/desk`);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/desk`);
  await expect(page.getByTestId("audit-log")).toBeVisible();
  await expect(page.getByTestId("flags-table")).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});

test("the reviewer's workspace", async ({ page }) => {
  await login(page, "reviewer1");
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/review`);
  await expect(page.getByTestId("flag-row").first()).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});

test("the reviewer's workspace while the report is open: flags table, reason field, composer beside a flag", async ({ page }) => {
  test.setTimeout(180_000);
  const open = fixture<Fx>("make-review-open.ts", `Accessible open review ${Date.now()}`);
  await login(page, "reviewer1");
  await page.goto(`/venues/${open.venueId}/submissions/${open.submissionId}/rounds/1/review`);
  await expect(page.locator('[data-testid="flags-table"][data-ready="true"]')).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.getByTestId("flag-row").first().getByRole("button", { name: "Dispute" }).click();
  await expect(page.getByTestId("verdict-reason-form")).toBeVisible();
  await page.getByTestId("flag-row").nth(1).getByRole("button", { name: "Remark" }).click();
  await expect(page.getByTestId("flag-remark")).toBeVisible();
  await page.getByTestId("flag-row").nth(2).getByRole("button").filter({ hasText: /./ }).first().click();
  expect(await seriousViolations(page)).toEqual([]);
});

test("the authors' decision and changes pages", async ({ page }) => {
  await login(page, "author");
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/decision`);
  await expect(page.getByTestId("released-remark").first()).toBeVisible();
  await expect(page.getByTestId("released-verdict").first()).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/2/changes`);
  await expect(page.getByTestId("flags-diff-counts")).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});
