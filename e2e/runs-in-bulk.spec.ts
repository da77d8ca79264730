import { expect, test } from "@playwright/test";
import { ORIGIN } from "./support/origin";
import { login } from "./support/session";
import { runJson, startSubmission } from "./support/workspace";

test("an author imports runs in bulk (all or nothing), duplicates one, deletes runs, a claim and the whole draft", async ({ page }) => {
  test.setTimeout(300_000);
  const title = `Runs in bulk ${Date.now()}`;
  await login(page, "author");
  const round = await startSubmission(page, title);
  await page.goto(`${round}/runs`);

  // One good file and one with a bad record: nothing is stored, the error names the file and record.
  const good = { name: "survey.json", mimeType: "application/json", buffer: Buffer.from(`[${runJson("bulk-a")},${runJson("bulk-b")}]`) };
  const bad = { name: "broken-run.json", mimeType: "application/json", buffer: Buffer.from(runJson("bulk-c", { controls: { E: "tiny" } })) };
  const bulk = page.getByTestId("bulk-json");
  await page.getByText("Import many run records at once (JSON files)").click();
  await bulk.getByLabel("Run record files").setInputFiles([good, bad]);
  await bulk.getByRole("button", { name: "Import the runs" }).click();
  const error = page.getByTestId("bulk-json-error");
  await expect(error).toContainText("nothing was stored");
  await expect(error).toContainText('broken-run.json ("bulk-c") › controls.E');
  await expect(page.getByRole("link", { name: "bulk-a" })).toHaveCount(0);

  // The good file alone goes in whole.
  await page.getByTestId("bulk-json").getByLabel("Run record files").setInputFiles([good]);
  await page.getByTestId("bulk-json").getByRole("button", { name: "Import the runs" }).click();
  await expect(page.getByTestId("bulk-imported")).toContainText("Imported 2 runs: bulk-a, bulk-b");
  await expect(page.getByRole("link", { name: "bulk-a", exact: true })).toBeVisible();
  await expect(page.getByRole("link", { name: "bulk-b", exact: true })).toBeVisible();

  // Duplicate as template: a new run "bulk-a (copy)" opens on its edit form.
  await page.getByRole("link", { name: "bulk-a", exact: true }).click();
  await expect(page.getByRole("heading", { name: "Run bulk-a" })).toBeVisible();
  await page.getByRole("button", { name: "Duplicate as template" }).click();
  await expect(page.getByRole("heading", { name: "Run bulk-a (copy)" })).toBeVisible();
  await expect(page.getByTestId("run-copied")).toContainText("A copy of run bulk-a");
  await expect(page.locator("#run-controls-E")).toHaveValue("0.0001");

  // Deleting asks first and says what goes; dismissing keeps the run.
  const messages: string[] = [];
  page.once("dialog", (d) => (messages.push(d.message()), void d.dismiss()));
  await page.getByRole("button", { name: "Delete the run" }).click();
  expect(messages[0]).toMatch(/^Delete run bulk-a \(copy\) from round 1\? Its record \(1 version\), its attached files \(0\)/);
  await expect(page.getByRole("heading", { name: "Run bulk-a (copy)" })).toBeVisible();
  page.once("dialog", (d) => void d.accept());
  await page.getByRole("button", { name: "Delete the run" }).click();
  await expect(page.getByTestId("run-deleted")).toContainText("Run bulk-a (copy) was deleted");
  await expect(page.getByRole("link", { name: "bulk-a (copy)" })).toHaveCount(0);

  // A claim naming bulk-b: the run cannot be deleted (the page says which claim); the claim can, after a confirmation.
  await page.goto(`${round}/claims`);
  const claim = {
    format: "runproof.claim/1",
    title: "Two runs at one Ekman number",
    runs: [
      { label: "bulk-a", part: "reference" },
      { label: "bulk-b", part: "varied" },
    ],
    varies: ["stableLayer"],
    stated: [{ quantity: "E", value: "1e-4" }],
  };
  const res = await page.request.post(`${round}/claims`, {
    form: { intent: "create", record: JSON.stringify(claim), figure: "Fig. 2", statement: "" },
    headers: { origin: ORIGIN },
    maxRedirects: 0,
  });
  expect(res.status(), await res.text()).toBeLessThan(400);
  await page.goto(`${round}/runs`);
  await page.getByRole("link", { name: "bulk-b", exact: true }).click();
  page.once("dialog", (d) => (messages.push(d.message()), void d.accept()));
  await page.getByRole("button", { name: "Delete the run" }).click();
  expect(messages.at(-1)).toContain("cannot be deleted while claims name it: Fig. 2: Two runs at one Ekman number");
  await expect(page.getByRole("heading", { name: "Run bulk-b" })).toBeVisible();

  await page.goto(`${round}/claims`);
  await page.getByRole("link", { name: /Two runs at one Ekman number/ }).first().click();
  page.once("dialog", (d) => (messages.push(d.message()), void d.accept()));
  await page.getByRole("button", { name: "Delete the claim" }).click();
  expect(messages.at(-1)).toMatch(/^Delete the claim "Fig\. 2: Two runs at one Ekman number" from round 1\? Its 1 stated value/);
  await expect(page).toHaveURL(/\/claims$/);
  await expect(page.getByRole("link", { name: /Two runs at one Ekman number/ })).toHaveCount(0);

  // The whole draft: the confirmation counts what goes; then the submission is gone.
  await page.goto(round);
  page.once("dialog", (d) => (messages.push(d.message()), void d.accept()));
  await page.getByRole("button", { name: "Delete this draft submission" }).click();
  expect(messages.at(-1)).toContain("This removes its 2 runs, 0 claims");
  await expect(page.getByTestId("draft-deleted")).toBeVisible();
  expect((await page.request.get(round)).status()).toBe(404);
});
