import { expect, test } from "@playwright/test";
import { fixture } from "./support/review";
import { login } from "./support/session";

// Links in mail sent before the one round tree keep working: each old address answers a
// permanent redirect into the tree, and the page there decides what this person may see.
type Fx = { venueId: string; submissionId: string; roundId: string };
let fx: Fx;

test.beforeAll(() => {
  fx = fixture<Fx>("make-decided-round.ts", `Old addresses ${Date.now()}`, "single");
});

test("the editor's, the reviewer's and the short links of earlier mail lead into the round tree", async ({ browser }) => {
  const round = `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1`;

  const editor = await browser.newPage();
  await login(editor, "editor");
  const old = await editor.request.get(`/venues/${fx.venueId}/desk/${fx.submissionId}/rounds/1`, { maxRedirects: 0 });
  expect(old.status()).toBe(301);
  await editor.goto(`/venues/${fx.venueId}/desk/${fx.submissionId}/rounds/1`);
  await expect(editor).toHaveURL(new RegExp(`${round}/desk$`));
  await expect(editor.getByRole("heading", { name: "Reports" })).toBeVisible();

  const reviewer = await browser.newPage();
  await login(reviewer, "reviewer1");
  await reviewer.goto(`/review/${fx.submissionId}/rounds/1`);
  await expect(reviewer).toHaveURL(new RegExp(`${round}/review$`));
  await expect(reviewer.getByText(/Your report as Reviewer \d/)).toBeVisible();

  const author = await browser.newPage();
  await login(author, "author");
  await author.goto(`/submissions/${fx.submissionId}`);
  // Round 1 was decided with a major revision: the short link opens the authors' round 2.
  await expect(author).toHaveURL(new RegExp(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/2$`));
  await expect(author.getByTestId("round-state")).toContainText("Draft, private to the authors");

  // A reviewer following the editor's old address meets the missing page, not the desk.
  await reviewer.goto(`/venues/${fx.venueId}/desk/${fx.submissionId}/rounds/1`);
  await expect(reviewer.getByRole("heading", { name: "Nothing here" })).toBeVisible();
  await expect(reviewer.getByRole("link", { name: "Back to the start page" })).toBeVisible();
});
