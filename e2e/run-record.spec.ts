import { expect, test } from "@playwright/test";
import { fixture } from "./support/review";
import { login } from "./support/session";

// A reviewer reads a run's whole record and what the checker recomputed from it, from the
// round's own pages (the runs table links to each run).
type Fx = { venueId: string; submissionId: string; roundId: string };
let fx: Fx;

test.beforeAll(() => {
  fx = fixture<Fx>("make-decided-round.ts", `Run record ${Date.now()}`, "single");
});

test("a reviewer opens a run from the runs table and reads its full record and recomputed values", async ({ page }) => {
  await login(page, "reviewer1");
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/runs`);
  await page.getByTestId("runs-table").getByRole("link", { name: "strat-B" }).first().click();
  await expect(page.getByRole("heading", { name: "Run strat-B" })).toBeVisible();
  const record = page.getByTestId("run-full-record");
  for (const group of ["Geometry", "Conventions", "Controls", "Material (with units)"]) await expect(record.getByText(group, { exact: true })).toBeVisible();
  const derived = page.getByTestId("run-derived");
  await expect(derived.getByRole("rowheader", { name: "E", exact: true })).toBeVisible();
  await expect(derived.getByRole("rowheader", { name: "Pm", exact: true })).toBeVisible();
  // Four significant figures at most: the mantissa of every shown value has ≤ 4 digits.
  for (const cell of await derived.locator("td.font-mono").allTextContents()) {
    const mantissa = cell.split(/[×eE]/)[0]!.replace(/[^0-9]/g, "").replace(/^0+/, "");
    expect(mantissa.length, cell).toBeLessThanOrEqual(4);
  }
});
