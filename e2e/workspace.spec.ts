import { expect, test, type Page } from "@playwright/test";
import { linkIn, waitForMail } from "./support/mail";
import { ORIGIN } from "./support/origin";
import { demo, login } from "./support/session";
import { runJson, seriesCsv, seriousViolations, spectrumCsv, startSubmission } from "./support/workspace";

// Mail goes out through the job queue; after an unclean stop of another server its stuck job
// expires only at the queue's next maintenance pass, so mail may take up to ~2 minutes.
const MAIL_WAIT = 150_000;
const flag = (page: Page, rule: string) => page.locator(`[data-testid="flag"][data-rule="${rule}"]`);

test("an author takes a submission from empty to sent; a co-author follows; an unassigned reviewer sees nothing", async ({ page, browser }) => {
  test.setTimeout(420_000);
  const title = `Layer filtering test ${Date.now()}`;
  await login(page, "author");
  const round = await startSubmission(page, title);
  const submissionBase = round.replace(/\/rounds\/1$/, "");

  // A co-author is invited by e-mail and attaches their account through the link.
  const coauthor = demo("coauthor1");
  await page.getByRole("link", { name: "Manuscript details and co-authors" }).click();
  const invite = page.locator("form").filter({ has: page.getByRole("button", { name: "Send the invitation" }) });
  await invite.getByLabel("Name").fill(coauthor.name);
  await invite.getByLabel("E-mail").fill(coauthor.email);
  await invite.getByLabel("Affiliation").fill(coauthor.affiliation);
  await invite.getByLabel("Formal analysis").check();
  await invite.getByRole("button", { name: "Send the invitation" }).click();
  await expect(page.getByTestId("contributors")).toContainText(coauthor.name);
  const inviteMail = await waitForMail(coauthor.email, `You are listed as a co-author: ${title}`, MAIL_WAIT);
  const coContext = await browser.newContext();
  const co = await coContext.newPage();
  await login(co, "coauthor1");
  await co.goto(linkIn(inviteMail, `${ORIGIN}/submissions/`).replace(ORIGIN, ""));
  await co.getByRole("button", { name: "Join the submission" }).click();
  await expect(co.getByRole("heading", { level: 1, name: title })).toBeVisible();

  // Run 1 by the form.
  await page.goto(`${round}/runs`);
  const form = page.getByTestId("run-form-form");
  await form.locator("#new-label").fill("ref-A");
  await form.locator("#new-geometry-radiusRatio").fill("0.35");
  await form.locator("#new-conventions-lengthScale").selectOption("gap");
  await form.locator("#new-conventions-timeScale").selectOption("viscous");
  await form.locator("#new-conventions-rotationFactor").selectOption("1");
  await form.locator("#new-conventions-rayleigh").selectOption("classical");
  await form.locator("#new-controls-E").fill("1e-4");
  await form.locator("#new-controls-Ra").fill("2e7");
  await form.locator("#new-controls-Pr").fill("1");
  await form.locator("#new-controls-Pm").fill("2");
  await form.locator("#new-resolution-maxDegree").fill("40");
  await form.locator("#new-time-start").fill("0");
  await form.locator("#new-time-end").fill("3");
  await form.getByRole("button", { name: "Add the run" }).click();
  await expect(page.getByRole("heading", { name: "Run ref-A" })).toBeVisible();

  // A series and a spectrum, with the upload's progress shown.
  await page.getByLabel("Attach a time series").setInputFiles({ name: "ref-A-series.csv", mimeType: "text/csv", buffer: Buffer.from(seriesCsv(400, 3)) });
  await expect(page.getByTestId("upload-series-progress")).toBeVisible();
  await expect(page.getByTestId("upload-series")).toContainText("Attached: 400 rows");
  await expect(page.getByTestId("upload-series-progress")).toHaveAttribute("value", "100");
  await page.getByLabel("Attach a spectrum").setInputFiles({ name: "ref-A-spectrum.csv", mimeType: "text/csv", buffer: Buffer.from(spectrumCsv(40, 4)) });
  await expect(page.getByTestId("upload-spectrum-progress")).toBeVisible();
  await expect(page.getByTestId("upload-spectrum")).toContainText("Attached: 40 rows");
  await expect(page.getByTestId("attachments")).toContainText("ref-A-series.csv");
  await expect(page.getByTestId("series-chart")).toBeVisible();
  await expect(page.getByTestId("spectrum-chart")).toContainText("ℓ_max = 40");
  await expect(page.getByTestId("spectrum-chart").locator("svg").first()).toBeVisible();
  expect(await seriousViolations(page), "run page").toEqual([]);

  // Run 2 by a JSON upload: its diffusivities give Pm = 1.25, not the configured 2.
  await page.goto(`${round}/runs`);
  await page.getByText("Upload a run record (runproof.run/1 JSON)").click();
  await page.getByLabel("Run record file", { exact: true }).setInputFiles({
    name: "strat-B.json",
    mimeType: "application/json",
    buffer: Buffer.from(runJson("strat-B", { material: { nu: "0.5 m^2/s", eta: "0.4 m^2/s" }, stableLayer: { position: "top", edgeRadius: 1.45 } })),
  });
  await page.getByRole("button", { name: "Upload the run record" }).click();
  await expect(page.getByRole("heading", { name: "Run strat-B" })).toBeVisible();
  await expect(flag(page, "A.pm-from-diffusivities")).toHaveAttribute("data-severity", "mismatch");

  // A comparison claim with stated values; the runs also differ in Ra, which it does not declare.
  await page.goto(`${round}/claims`);
  const editor = page.getByTestId("claim-editor");
  await editor.getByLabel("Title").fill("Zonal flow with and without the layer");
  await editor.getByLabel("Figure").fill("Fig. 3");
  await editor.getByLabel("Run 1", { exact: true }).selectOption("ref-A");
  await editor.getByRole("button", { name: "Add a run" }).click();
  await editor.getByLabel("Run 2", { exact: true }).selectOption("strat-B");
  await editor.getByLabel("Parameters the claim varies").fill("stableLayer");
  await editor.getByRole("button", { name: "Add a stated value" }).click();
  await editor.getByLabel("Quantity 1", { exact: true }).fill("Pm");
  await editor.getByLabel("Value 1", { exact: true }).fill("2");
  await editor.getByLabel("Run of value 1", { exact: true }).selectOption("strat-B");
  await editor.getByRole("button", { name: "Add a stated value" }).click();
  await expect(editor.getByTestId("stated-row")).toHaveCount(2);
  await editor.getByRole("button", { name: "Remove value 2" }).click();
  await expect(editor.getByTestId("stated-row")).toHaveCount(1);
  await editor.getByRole("button", { name: "Save the claim" }).click();
  await expect(page).toHaveURL(/\/claims\/[0-9a-f-]{36}$/);

  // The expected flags, on the round's overview, with the advisory caution beside them.
  await page.goto(round);
  const panel = page.getByTestId("flags-panel");
  await expect(panel.getByTestId("advisory-note")).toBeVisible();
  await expect(flag(page, "A.pm-from-diffusivities")).toHaveCount(1);
  await expect(flag(page, "B.stated-vs-material")).toHaveCount(1);
  await expect(flag(page, "G.undeclared-difference").filter({ hasText: "controls.Ra" })).toHaveCount(1);
  // Grouped by rule (the default), what a rule checks and its source stand once above its flags.
  const pmGroup = panel.getByTestId("flag-group").filter({ has: flag(page, "A.pm-from-diffusivities") });
  await expect(pmGroup.getByTestId("flag-group-rule")).toContainText("Source");
  await expect(pmGroup.getByTestId("flag-group-counts")).toContainText("1 mismatch");
  await expect(panel.getByTestId("flags-unanswered")).toContainText("without an answer from the authors");
  await expect(page.getByRole("button", { name: "Send round 1 to the editor" })).toBeDisabled();
  // Filtering and grouping go into the address; the counts come back with the page.
  await panel.getByLabel("Rule family").selectOption("A");
  await expect(page).toHaveURL(/[?&]family=A(&|$)/);
  await expect(panel.locator('[data-testid="flag"]:not([data-rule^="A."])')).toHaveCount(0);
  await expect(flag(page, "A.pm-from-diffusivities")).toHaveCount(1);
  await panel.getByLabel("Rule family").selectOption("");
  await panel.getByLabel("Run", { exact: true }).check();
  await expect(page).toHaveURL(/[?&]group=run(&|$)/);
  await expect(panel.getByTestId("flag-group").filter({ hasText: "Run strat-B" }).getByTestId("flag").first()).toBeVisible();
  await panel.getByLabel("Rule", { exact: true }).check();
  await expect(page).not.toHaveURL(/group=/);
  // A closed group's rows come from the round's flags route; a query it cannot read is refused with the reason.
  const rows = await page.request.get(`${round}/flags?group=rule&key=A.pm-from-diffusivities`);
  expect(rows.status()).toBe(200);
  expect(((await rows.json()) as { total: number }).total).toBe(1);
  const refused = await page.request.get(`${round}/flags?limit=0`);
  expect(refused.status()).toBe(400);
  expect(((await refused.json()) as { error: { message: string } }).error.message).toContain("limit");

  // Accessibility (axe-core): the round with its flags, the runs, a run, the claims and a claim.
  expect(await seriousViolations(page), "round overview").toEqual([]);
  for (const tab of ["Runs", "Claims"]) {
    await page.getByRole("navigation", { name: "Round sections" }).getByRole("link", { name: tab }).click();
    await expect(page.getByRole("heading", { level: 3, name: tab })).toBeVisible();
    expect(await seriousViolations(page), tab).toEqual([]);
  }
  await page.getByTestId("claims-table").getByRole("link").first().click();
  await expect(page.getByTestId("flags-panel")).toBeVisible();
  expect(await seriousViolations(page), "claim page").toEqual([]);
  await page.goto(round);

  // Fix one: correct strat-B's magnetic diffusivity; the Pm flags go away after the re-check.
  await flag(page, "A.pm-from-diffusivities").getByRole("link", { name: "run strat-B" }).click();
  await expect(page).toHaveURL(/#run-controls-Pm$/);
  await page.locator("#run-material-eta").fill("0.25 m^2/s");
  await page.getByRole("button", { name: "Save as a new version" }).click();
  await expect(page.getByText("Saved as version 2")).toBeVisible();
  await page.goto(round);
  await expect(flag(page, "A.pm-from-diffusivities")).toHaveCount(0);
  await expect(flag(page, "B.stated-vs-material")).toHaveCount(0);

  // Answer the remaining mismatches in place, then send.
  const ids = await page.locator('[data-testid="flag"][data-severity="mismatch"]').evaluateAll((els) => els.map((e) => e.getAttribute("data-flag-id")!));
  expect(ids.length).toBeGreaterThan(0);
  for (const id of ids) {
    const item = page.locator(`[data-flag-id="${id}"]`);
    await item.getByRole("textbox").fill("The layer run needs a higher Ra to stay convective below the layer; the text says so.");
    await item.getByRole("button", { name: "Save the answer" }).click();
    await expect(item.getByText("Answer saved.")).toBeVisible();
  }
  await page.reload();
  await expect(page.getByTestId("open-mismatches")).toHaveText("No mismatch is left open.");
  // Sending asks once what it will do; the author confirms.
  page.once("dialog", (dialog) => {
    expect(dialog.message()).toContain("freezes");
    void dialog.accept();
  });
  await page.getByRole("button", { name: "Send round 1 to the editor" }).click();
  await expect(page.getByTestId("sent-note")).toBeVisible();
  await expect(page.getByTestId("round-state")).toContainText("frozen");

  // The co-author sees the sent round and gets the mail.
  await waitForMail(demo("editor").email, `Round 1 sent: ${title}`, MAIL_WAIT);
  await waitForMail(coauthor.email, `Round 1 sent to the editor: ${title}`, MAIL_WAIT);
  await co.goto(`/submissions/${submissionBase.split("/").pop()}`);
  await expect(co.getByTestId("round-state")).toContainText("frozen");
  await expect(co.getByTestId("flags-panel")).toBeVisible();
  await coContext.close();

  // A reviewer who is not assigned gets 404 on every URL of the submission, pages and actions alike.
  const runLinks = await page.goto(`${round}/runs`).then(() => page.getByTestId("runs-table").getByRole("link").evaluateAll((as) => as.map((a) => a.getAttribute("href")!)));
  const claimLink = await page.goto(`${round}/claims`).then(() => page.getByTestId("claims-table").getByRole("link").first().getAttribute("href"));
  const revContext = await browser.newContext();
  const rev = await revContext.newPage();
  await login(rev, "reviewer2");
  const urls = [
    `/submissions/${submissionBase.split("/").pop()}`,
    submissionBase,
    `${submissionBase}/details`,
    `${submissionBase}/manuscript.pdf`,
    round,
    `${round}/runs`,
    ...runLinks,
    `${round}/claims`,
    claimLink!,
    `${round}/files`,
    `${round}/runs.csv`,
  ];
  for (const url of urls) {
    const res = await rev.request.get(url, { maxRedirects: 0 });
    expect([403, 404], url).toContain(res.status());
  }
  for (const url of [`${round}/runs`, `${runLinks[0]}/attachments?kind=series`, `${round}/claims`, `${submissionBase}/details`, `${round}/flags/${ids[0]}/answer`, `${round}?index`]) {
    const res = await rev.request.post(url, { headers: { origin: ORIGIN }, form: { intent: "json", json: runJson("sneaky") } });
    expect([403, 404], `POST ${url}`).toContain(res.status());
  }
  await revContext.close();
});
