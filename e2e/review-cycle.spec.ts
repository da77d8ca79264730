import { expect, test, type Browser, type Page } from "@playwright/test";
import ICAL from "ical.js";
import { linkIn, waitForMail } from "./support/mail";
import { ORIGIN } from "./support/origin";
import { dueDate, fixture, mailAttachment, pdfText } from "./support/review";
import { demo, login } from "./support/session";

// The whole review cycle in the browser: invitations by mail, two reviews with remarks on
// claims and flags, a major-revision decision, the authors' answers in round 2, the flags
// diff, and the PDFs' text.
test.describe.configure({ mode: "serial" });
test.setTimeout(180_000);

const title = `Stable layer cycle ${Date.now()}`;
let fx: { venueId: string; submissionId: string; roundId: string; flagCount: number };

test.beforeAll(() => {
  fx = fixture("make-sent-round.ts", title);
});

async function as(browser: Browser, key: Parameters<typeof login>[1]) {
  const context = await browser.newContext({ baseURL: ORIGIN });
  const page = await context.newPage();
  // Irreversible steps ask once; the person means it.
  page.on("dialog", (dialog) => void dialog.accept());
  await login(page, key);
  return page;
}

async function writeInEditor(page: Page, testId: string, text: string) {
  const editor = page.getByTestId(testId);
  await editor.click();
  await page.keyboard.type(text);
  await expect(editor).toContainText(text);
}

async function review(browser: Browser, key: "reviewer1" | "reviewer2", marker: string) {
  const person = demo(key);
  const mail = await waitForMail(person.email, title);
  const ics = (await mailAttachment(mail, "review-due.ics")).toString("utf8");
  const event = new ICAL.Event(new ICAL.Component(ICAL.parse(ics)).getFirstSubcomponent("vevent")!);
  expect(event.startDate.toJSDate().toISOString().slice(0, 10)).toBe(dueDate(21));

  const page = await as(browser, key);
  await page.goto(linkIn(mail, `${ORIGIN}/invitations/`));
  await page.getByRole("button", { name: "Accept and open the review" }).click();
  await expect(page.getByRole("heading", { level: 1, name: title })).toBeVisible();
  await expect(page.getByTestId("advisory-note").first()).toBeVisible();
  await expect(page.locator('[data-testid="flags-table"][data-ready="true"]')).toBeVisible();

  // A dispute on the first flag, with its reason, shown at once (optimistic) and still there after reload.
  const flag = page.getByTestId("flag-row").first();
  await flag.getByRole("button", { name: "Dispute" }).click();
  await page.getByLabel("Why do you dispute this flag?").fill(`${marker} thinks this flag reads the wrong unit.`);
  await page.getByRole("button", { name: "Save the dispute" }).click();
  await expect(flag.getByRole("button", { name: "Dispute" })).toHaveAttribute("aria-pressed", "true");

  // A remark on the claim, written beside it.
  await page.getByTestId("claim").first().getByRole("button", { name: /^Remark/ }).click();
  const claimComposer = page.getByTestId("claim-remark");
  await expect(claimComposer.getByTestId("remark-anchor")).toContainText("Zonal flow below the outer boundary");
  await claimComposer.getByRole("textbox").click();
  await page.keyboard.type(`${marker} claim remark about the zonal flow.`);
  await claimComposer.getByRole("button", { name: "Save remark" }).click();
  await expect(page.getByTestId("my-remarks")).toContainText(`${marker} claim remark`);
  // Until the report is submitted, a remark can be edited in place.
  await page.getByTestId("my-remarks").getByRole("button", { name: "Edit" }).first().click();
  const edit = page.getByTestId("remark-edit-form");
  await edit.getByRole("textbox").click();
  await page.keyboard.press("End");
  await page.keyboard.type(" Edited.");
  await edit.getByRole("button", { name: "Save changes" }).click();
  await expect(page.getByTestId("my-remarks")).toContainText("zonal flow. Edited.");
  await expect(page.getByTestId("remark-edit-form")).toHaveCount(0);
  // A remark on a flag, written beside it. Inline maths: "$…$" becomes a TeX mark as it is typed.
  await page.locator('[data-testid="flag-row"][data-rule="A.pm-from-diffusivities"]').getByRole("button", { name: "Remark" }).click();
  const flagComposer = page.getByTestId("flag-remark");
  const editor = flagComposer.getByRole("textbox");
  await editor.click();
  await page.keyboard.type(`${marker} flag remark: Pm is $\\nu/\\eta$ here.`);
  await expect(flagComposer.locator("code.tex")).toHaveText("\\nu/\\eta");
  await flagComposer.getByRole("button", { name: "Save remark" }).click();
  await expect(page.getByTestId("my-remarks")).toContainText(`${marker} flag remark`);
  // Saved, the formula is typeset by KaTeX (its MathML carries ν and η).
  await expect(page.getByTestId("my-remarks").locator(".katex").first()).toBeVisible();
  await expect(page.getByTestId("my-remarks").locator("math").first()).toContainText("ν");

  await page.getByTestId("report-form").getByRole("combobox").selectOption("major-revision");
  await writeInEditor(page, "note-editor", `${marker} confidential note for the editor.`);
  await page.getByRole("button", { name: "Submit the report" }).click();
  await expect(page.getByTestId("report-locked")).toBeVisible();
  await page.reload();
  await expect(page.getByTestId("flag-row").first().getByRole("button", { name: "Dispute" })).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByRole("button", { name: "Save remark" })).toHaveCount(0);
  await page.context().close();
}

test("editor invites two reviewers, both review, the editor decides, the authors revise", async ({ browser }) => {
  const editor = await as(browser, "editor");
  await editor.goto(`/venues/${fx.venueId}/desk`);
  await editor.getByTestId("queue-sent").getByRole("link", { name: title }).click();
  await expect(editor.getByTestId("desk-round-state")).toContainText("Round 1 · with the editor");

  // Conflict guard: a co-author cannot be invited.
  await editor.getByLabel("E-mail").fill(demo("coauthor1").email);
  await editor.getByRole("button", { name: "Invite reviewer" }).click();
  await expect(editor.getByRole("alert")).toContainText("author or co-author");

  // Reviewer 1 shares an affiliation with a co-author: a warning, then "Invite anyway".
  await editor.getByLabel("E-mail").fill(demo("reviewer1").email);
  await editor.getByRole("button", { name: "Invite reviewer" }).click();
  await expect(editor.getByTestId("affiliation-warning")).toContainText("Quell Observatory");
  await editor.getByLabel("E-mail").fill(demo("reviewer1").email);
  await editor.getByRole("button", { name: "Invite anyway" }).click();
  await expect(editor.getByRole("status")).toContainText(`Invitation sent to ${demo("reviewer1").email}`);
  await editor.getByLabel("E-mail").fill(demo("reviewer2").email);
  await editor.getByRole("button", { name: "Invite reviewer" }).click();
  await expect(editor.getByRole("status")).toContainText(`Invitation sent to ${demo("reviewer2").email}`);

  await review(browser, "reviewer1", "R1");
  await review(browser, "reviewer2", "R2");
  await waitForMail(demo("editor").email, `Review submitted: ${title}`);

  await editor.reload();
  await expect(editor.getByTestId("desk-round-state")).toContainText("reviews in");
  await expect(editor.getByTestId("report-1")).toContainText("R1 confidential note");
  await expect(editor.getByTestId("report-2")).toContainText("R2 flag remark");
  await editor.getByRole("combobox", { name: "Decision", exact: true }).selectOption("major-revision");
  await writeInEditor(editor, "letter-editor", "Please reconcile the magnetic Prandtl number with the diffusivities.");
  await editor.getByRole("button", { name: "Release decision to the authors" }).click();
  await expect(editor.getByTestId("decision-released")).toContainText("Major revision");
  // The audit log in words, never the stored slugs.
  await expect(editor.getByTestId("audit-log")).toContainText("Decision on round 1 released to the authors");
  await expect(editor.getByTestId("audit-log")).toContainText(`${demo("reviewer1").email} accepted the invitation to review round 1`);
  await expect(editor.getByTestId("audit-log")).toContainText("Round 1 sent to the editor");
  await expect(editor.getByTestId("audit-log")).not.toContainText("decision.released");

  const packet = await editor.request.get(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/packet.pdf`);
  expect(packet.headers()["content-type"]).toBe("application/pdf");
  const packetText = await pdfText(await packet.body());
  expect(packetText).toContain("A.pm-from-diffusivities");
  expect(packetText).toContain("Flags are advisory");
  expect(packetText).toContain("strat-B");

  // Authors and co-authors get the decision with the letter PDF attached.
  const decisionMail = await waitForMail(demo("author").email, `Decision on round 1: ${title}`);
  await waitForMail(demo("coauthor1").email, `Decision on round 1: ${title}`);
  const letterText = await pdfText(await mailAttachment(decisionMail, "decision-round-1.pdf"));
  expect(letterText).toContain("Please reconcile the magnetic Prandtl number");
  expect(letterText).toContain("Reviewer 1");
  expect(letterText).toContain("R2 flag remark");
  // Formulas print as Unicode maths in the PDF, never as TeX source.
  expect(letterText).toContain("Pm is ν/η here");
  expect(letterText).not.toContain("\\nu");
  for (const name of [demo("reviewer1").name, demo("reviewer2").name, "confidential note"]) expect(letterText).not.toContain(name);

  const author = await as(browser, "author");
  await author.goto(linkIn(decisionMail, `${ORIGIN}/venues/`));
  await expect(author.getByRole("heading", { name: "Decision on round 1: Major revision" })).toBeVisible();
  const remarks = author.getByTestId("released-remark");
  await expect(remarks).toHaveCount(4);
  await expect(remarks.first()).toContainText("Reviewer 1");
  await expect(author.getByText("Reviewer 2").first()).toBeVisible();
  await expect(author.locator("body")).not.toContainText(demo("reviewer1").name);
  // The remark's formula is typeset by KaTeX on the page.
  await expect(author.locator(".katex").first()).toBeVisible();
  // What people read carries no TeX source (the hidden MathML annotation keeps it for copying only).
  const shown = await remarks.evaluateAll((els) =>
    els
      .map((e) => {
        const copy = e.cloneNode(true) as HTMLElement;
        copy.querySelectorAll("annotation").forEach((a) => a.remove());
        return copy.textContent ?? "";
      })
      .join(" "),
  );
  expect(shown).toContain("ν/η");
  expect(shown).not.toContain("\\nu");
  const first = remarks.first();
  await first.getByRole("textbox").fill("We recomputed Pm from the corrected diffusivity.");
  await first.getByRole("button", { name: "Save answer" }).click();
  await expect(first.getByRole("status")).toContainText("Answer saved");

  // The authors fix strat-B in round 2 and send it; the flags diff shows what was fixed.
  fixture("revise-round.ts", fx.submissionId, "2");
  await author.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/2/changes`);
  await expect(author.getByTestId("flags-resolved")).toContainText("A.pm-from-diffusivities");
  await expect(author.getByTestId("flags-persisting")).toContainText("D.min-magnetic-times");
  await expect(author.getByTestId("param-diff")).toContainText("material.eta");
  await expect(author.getByTestId("param-diff")).toContainText("version 1 → 2");
  await expect(author.getByText("We recomputed Pm from the corrected diffusivity.")).toBeVisible();

  // Round 2 on the desk: the editor invites round 1's reviewers again with one click.
  await editor.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/2/desk`);
  await editor.getByRole("button", { name: "Invite round 1's reviewers again" }).click();
  await expect(editor.getByRole("status")).toContainText(demo("reviewer1").email);
  await expect(editor.getByTestId("invitations")).toContainText(demo("reviewer2").email);
});
