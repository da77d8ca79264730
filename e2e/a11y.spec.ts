import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { login } from "./support/session";

async function seriousViolations(page: Page) {
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
}

test("sign-in page has no serious or critical accessibility violations", async ({ page }) => {
  await page.goto("/sign-in");
  expect(await seriousViolations(page)).toEqual([]);
});

test("dashboard has no serious or critical accessibility violations", async ({ page }) => {
  await login(page, "editor");
  await page.goto("/dashboard");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});
