import { expect, test } from "@playwright/test";
import { login } from "./support/session";
import { runJson, startSubmission } from "./support/workspace";

test("bad uploads give a clear message and store nothing", async ({ page }) => {
  test.setTimeout(120_000);
  await login(page, "author");
  const round = await startSubmission(page, `Upload errors test ${Date.now()}`);

  // A malformed JSON run record: the message names the position; no run appears.
  await page.goto(`${round}/runs`);
  await page.getByText("Upload a run record (runproof.run/1 JSON)").click();
  await page.getByLabel("Run record file", { exact: true }).setInputFiles({ name: "broken.json", mimeType: "application/json", buffer: Buffer.from('{ "format": "runproof.run/1",\n  "label": "x" "geometry": {} }') });
  await page.getByRole("button", { name: "Upload the run record" }).click();
  await expect(page.getByTestId("json-error")).toContainText("The file is not valid JSON; nothing was stored.");
  await expect(page.getByTestId("json-error")).toContainText("line 2");
  await expect(page.getByText("No runs yet.")).toBeVisible();

  // A well-formed record that breaks the format: the JSON path of the problem is shown.
  await page.getByLabel("Run record file", { exact: true }).setInputFiles({ name: "bad-key.json", mimeType: "application/json", buffer: Buffer.from(runJson("bad", { controls: { E: 1e-4, Ra: 1e7, Pr: 1, Pmag: 2 } })) });
  await page.getByRole("button", { name: "Upload the run record" }).click();
  await expect(page.getByTestId("json-error")).toContainText("controls.Pmag");
  await expect(page.getByText("No runs yet.")).toBeVisible();

  // A namelist with a key the key map does not cover.
  await page.getByText("Import a Fortran namelist").click();
  const nl = page.getByTestId("run-form-namelist");
  await nl.getByLabel("Namelist (ISO/IEC 1539 NAMELIST input)").fill("&phys_param\n  ek = 1.0d-4, ra = 2.0e7, pr = 1.0, prmag = 2.0\n  mystery_knob = .true.\n/");
  await nl.locator("#nl-label").fill("nl-run");
  await nl.getByRole("button", { name: "Import the namelist" }).click();
  await expect(page.getByTestId("run-form-namelist").getByRole("alert").first()).toContainText("key(s) the key map does not cover; nothing was stored");
  await expect(page.getByTestId("run-form-namelist")).toContainText("&phys_param mystery_knob");
  await expect(page.getByText("No runs yet.")).toBeVisible();
  await expect(page.getByTestId("run-form-namelist")).toContainText("(none saved yet)");

  // Mapping the key (here: ignoring it) makes the same namelist import, and keeps the map.
  await nl.getByLabel(/Your key map/).fill("ek = controls.E\nra = controls.Ra\npr = controls.Pr\nprmag = controls.Pm\nmystery_knob = ignore");
  for (const [field, value] of [["lengthScale", "gap"], ["timeScale", "viscous"], ["rotationFactor", "1"], ["rayleigh", "classical"]] as const) {
    await nl.locator(`#nl-conventions-${field}`).selectOption(value);
  }
  await nl.locator("#nl-geometry-radiusRatio").fill("0.35");
  await nl.getByRole("button", { name: "Import the namelist" }).click();
  await expect(page.getByRole("heading", { name: "Run nl-run" })).toBeVisible();
  await expect(page.locator("#run-controls-E")).toHaveValue("0.0001");
  await expect(page.locator("#run-controls-Pm")).toHaveValue("2");
  await page.goto(`${round}/runs`);
  await expect(page.getByTestId("run-form-namelist")).toContainText("(one is saved)");

  // A run to attach files to, then a CSV with a bad row: the line is named, nothing attached.
  await page.getByText("Upload a run record (runproof.run/1 JSON)").click();
  await page.getByLabel("Run record file", { exact: true }).setInputFiles({ name: "ok.json", mimeType: "application/json", buffer: Buffer.from(runJson("ok-run")) });
  await page.getByRole("button", { name: "Upload the run record" }).click();
  await expect(page.getByRole("heading", { name: "Run ok-run" })).toBeVisible();
  const bad = "t,kineticEnergy\r\n0,1.0\r\n0.5,1.1\r\n1.0,oops\r\n1.5,1.2\r\n";
  await page.getByLabel("Attach a time series").setInputFiles({ name: "bad.csv", mimeType: "text/csv", buffer: Buffer.from(bad) });
  await expect(page.getByTestId("upload-series-error")).toContainText("nothing was stored");
  await expect(page.getByTestId("upload-series-error")).toContainText("line 4");
  await expect(page.getByTestId("upload-series-error")).toContainText("not a number");
  await expect(page.getByText("No time series attached.")).toBeVisible();

  // A file over the upload limit (25 MB by default).
  const big = Buffer.alloc(26 * 1024 * 1024, "1,2\n");
  await page.getByLabel("Attach a spectrum").setInputFiles({ name: "huge.csv", mimeType: "text/csv", buffer: big });
  await expect(page.getByTestId("upload-spectrum-error")).toContainText("larger than the upload limit of 25 MB; nothing was stored", { timeout: 30_000 });
  await page.reload();
  await expect(page.getByText("No spectrum attached.")).toBeVisible();
  await expect(page.getByTestId("attachments")).toHaveCount(0);
});
