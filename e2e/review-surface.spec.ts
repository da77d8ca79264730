import { expect, test, type Browser, type Page } from "@playwright/test";
import { ORIGIN } from "./support/origin";
import { fixture } from "./support/review";
import { demo, login } from "./support/session";

// The reviewer's and editor's working surface, through the pages: the flags table (grouping,
// filters in the address, keys), a dispute with its reason, a remark with a formula written
// beside its flag, the editor's table of verdicts, and the authors reading "Reviewer 1" and
// answering in round 2.
test.describe.configure({ mode: "serial" });
test.setTimeout(180_000);

type Fx = { venueId: string; submissionId: string; roundId: string; flagCount: number };
const title = `Working surface ${Date.now()}`;
let fx: Fx;
const REASON = "With the stated diffusivities, Pm = 2 holds; the flag reads the wrong unit.";

test.beforeAll(() => {
  fx = fixture<Fx>("make-review-open.ts", title);
});

async function as(browser: Browser, key: Parameters<typeof login>[1]) {
  const context = await browser.newContext({ baseURL: ORIGIN, viewport: { width: 1440, height: 1000 } });
  const page = await context.newPage();
  page.on("dialog", (dialog) => void dialog.accept());
  await login(page, key);
  return page;
}

const roundPath = (tail: string, round = 1) => `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/${round}/${tail}`;
/** The table answers keys once hydrated. */
const ready = (page: Page) => expect(page.locator('[data-testid="flags-table"][data-ready="true"]')).toBeVisible();
const row = (page: Page, rule: string) => page.locator(`[data-testid="flag-row"][data-rule="${rule}"]`).first();

test("keys move through the flags and give verdicts, never while typing", async ({ browser }) => {
  const page = await as(browser, "reviewer1");
  await page.goto(roundPath("review"));
  await ready(page);
  const table = page.getByTestId("flags-table");
  await expect(table.getByTestId("flags-keys")).toContainText("a agree");
  await expect(table.getByTestId("flag-row")).toHaveCount(fx.flagCount);

  // j: the first group's header, j: its first row; a agrees with it.
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
  await page.keyboard.press("j");
  await page.keyboard.press("j");
  const rows = table.getByTestId("flag-row");
  const first = rows.nth(0);
  await expect(first).toBeFocused();
  await page.keyboard.press("a");
  await expect(first.getByRole("button", { name: "Agree" })).toHaveAttribute("aria-pressed", "true");

  // j, then d: the reason field opens and takes the keys (a "j" typed there stays text).
  await page.keyboard.press("j");
  const second = rows.nth(1);
  await expect(second).toBeFocused();
  await page.keyboard.press("d");
  const reason = page.getByLabel("Why do you dispute this flag?");
  await expect(reason).toBeFocused();
  await page.keyboard.type("just a judgement call");
  await expect(reason).toHaveValue("just a judgement call");
  await expect(second).not.toBeFocused();
  await page.getByRole("button", { name: "Save the dispute" }).click();
  await expect(second.getByRole("button", { name: "Dispute" })).toHaveAttribute("aria-pressed", "true");

  // k goes back up; x opens the row's numbers.
  await page.keyboard.press("k");
  await expect(first).toBeFocused();
  await page.keyboard.press("x");
  await expect(table.getByTestId("flag-detail").first()).toContainText("Source");

  // A dispute without a reason is refused by the server, in words.
  const refused = await page.request.post(roundPath("review"), {
    form: { intent: "verdict", flagId: (await rows.nth(2).getAttribute("data-flag-id"))!, verdict: "dispute" },
    headers: { origin: ORIGIN },
  });
  expect(refused.status()).toBe(400);
  expect(await refused.text()).toContain("Say why you dispute this flag");

  // Saved verdicts survive a reload; grouping and filters live in the address.
  await page.reload();
  await ready(page);
  await expect(table.getByTestId("flag-row").nth(0).getByRole("button", { name: "Agree" })).toHaveAttribute("aria-pressed", "true");
  await page.getByRole("radio", { name: "Run" }).click();
  await expect(page).toHaveURL(/group=run/);
  await page.getByRole("combobox", { name: "Verdict", exact: true }).selectOption("dispute");
  await expect(page).toHaveURL(/verdict=dispute/);
  await expect(table.getByTestId("flag-row")).toHaveCount(1);
  await expect(table.getByTestId("flag-group").first()).toContainText("Run strat-B");
  await page.reload();
  await ready(page);
  await expect(page.getByRole("radio", { name: "Run" })).toBeChecked();
  await expect(table.getByTestId("flag-row")).toHaveCount(1);
  // The rule links to its entry in the checks reference.
  const ruleLink = table.getByTestId("flag-row").first().getByRole("link").first();
  const target = (await ruleLink.getAttribute("href"))!;
  await page.goto(target);
  await expect(page.locator(`[id="${target.split("#")[1]}"]`)).toBeVisible();
  await page.context().close();
});

test("reviewer disputes a flag with a reason and remarks beside it with a formula; the editor sees it; the authors answer it in round 2", async ({ browser }) => {
  const reviewer = await as(browser, "reviewer1");
  await reviewer.goto(roundPath("review"));
  await ready(reviewer);
  // The run's full record, one click from the workspace.
  await reviewer.getByTestId("runs-table").getByRole("link", { name: "strat-B" }).click();
  await expect(reviewer.getByTestId("run-full-record")).toBeVisible();
  await expect(reviewer.getByTestId("run-derived")).toBeVisible();
  await reviewer.goBack();
  await ready(reviewer);

  const flag = row(reviewer, "A.pm-from-diffusivities");
  await flag.getByRole("button", { name: "Dispute" }).click();
  await reviewer.getByLabel("Why do you dispute this flag?").fill(REASON);
  await reviewer.getByRole("button", { name: "Save the dispute" }).click();
  await expect(flag.getByRole("button", { name: "Dispute" })).toHaveAttribute("aria-pressed", "true");

  // The composer opens beside the flag, already anchored to it.
  await flag.getByRole("button", { name: "Remark" }).click();
  const composer = reviewer.getByTestId("flag-remark");
  await expect(composer.getByTestId("remark-anchor")).toContainText("A.pm-from-diffusivities on strat-B");
  await composer.getByRole("textbox").click();
  await reviewer.keyboard.type("The Rossby number follows as $Ro = Re\\,E$ here.");
  await expect(composer.locator("code.tex")).toHaveText("Ro = Re\\,E");
  await composer.getByRole("button", { name: "Save remark" }).click();
  const mine = reviewer.getByTestId("my-remarks");
  await expect(mine).toContainText("The Rossby number follows as");
  await expect(mine.locator(".katex").first()).toBeVisible();
  await expect(mine.getByRole("link", { name: /A\.pm-from-diffusivities/ })).toHaveAttribute("href", /#flag-/);

  await reviewer.getByTestId("report-form").getByRole("combobox").selectOption("major-revision");
  await reviewer.getByRole("button", { name: "Submit the report" }).click();
  await expect(reviewer.getByTestId("report-locked")).toBeVisible();
  await reviewer.context().close();

  // The editor's round page: the same table, with each reviewer's verdict and reason.
  const editor = await as(browser, "editor");
  await editor.goto(roundPath("desk"));
  await ready(editor);
  const edRow = row(editor, "A.pm-from-diffusivities");
  await expect(edRow.getByTestId("flag-verdicts")).toContainText(`Reviewer 1 (${demo("reviewer1").name}): disputes`);
  await edRow.getByRole("button", { name: /Pm/ }).first().click();
  await expect(editor.getByTestId("flag-detail")).toContainText(REASON);
  await editor.getByRole("combobox", { name: "Decision", exact: true }).selectOption("major-revision");
  await editor.getByRole("button", { name: "Release decision to the authors" }).click();
  await expect(editor.getByTestId("decision-released")).toContainText("Major revision");
  await editor.context().close();

  // The authors: the verdict as "Reviewer 1" with its reason, the formula typeset, no names.
  const author = await as(browser, "author");
  await author.goto(roundPath("decision"));
  const verdict = author.getByTestId("released-verdict").filter({ hasText: "A.pm-from-diffusivities" });
  await expect(verdict).toContainText("Reviewer 1 disputes");
  await expect(verdict.getByTestId("verdict-reason")).toHaveText(REASON);
  await expect(author.locator("body")).not.toContainText(demo("reviewer1").name);
  await expect(author.locator("body")).not.toContainText(demo("reviewer1").email);
  const remark = author.getByTestId("released-remark").filter({ hasText: "The Rossby number follows as" });
  await expect(remark.locator(".katex")).toBeVisible();
  const shown = await remark.evaluate((e) => {
    const copy = e.cloneNode(true) as HTMLElement;
    copy.querySelectorAll("annotation").forEach((a) => a.remove());
    return copy.textContent ?? "";
  });
  expect(shown).not.toContain("\\,");
  expect(shown).not.toContain("$");
  await verdict.getByRole("textbox").fill("We recomputed Pm from the corrected diffusivity in round 2.");
  await verdict.getByRole("button", { name: "Save answer" }).click();
  await expect(verdict.getByRole("status")).toContainText("Answer saved");

  // Round 2 sent: the changes view lists the verdict, its reason and the answer.
  fixture("revise-round.ts", fx.submissionId, "2");
  await author.goto(roundPath("changes", 2));
  const changes = author.getByTestId("verdict-changes");
  await expect(changes).toContainText("Reviewer 1 disputes");
  await expect(changes).toContainText(REASON);
  await expect(changes).toContainText("We recomputed Pm from the corrected diffusivity in round 2.");
  await expect(author.locator("body")).not.toContainText(demo("reviewer1").name);
  await author.context().close();
});
