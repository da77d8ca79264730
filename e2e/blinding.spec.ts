import { expect, test, type Page, type Response } from "@playwright/test";
import { ORIGIN } from "./support/origin";
import { fixture, pdfText } from "./support/review";
import { demo, login } from "./support/session";

// Confidential data of the review: reviewer identities never reach authors (pages, fetcher
// and JSON responses, PDFs); one reviewer never sees another's editor-only note; a used
// invitation link stays used.
type Fx = { venueId: string; submissionId: string; roundId: string; pendingToken: string };
let fx: Fx;
const title = `Blinding ${Date.now()}`;

test.beforeAll(() => {
  fx = fixture<Fx>("make-decided-round.ts", title, "single");
});

const reviewerSecrets = () => [demo("reviewer1").name, demo("reviewer1").email, demo("reviewer2").name, demo("reviewer2").email, "SECRET-NOTE"];

/** Records the body of every response the page receives (documents, data requests, fetchers). */
function recordResponses(page: Page) {
  const seen: { url: string; body: string }[] = [];
  page.on("response", async (res: Response) => {
    const type = res.headers()["content-type"] ?? "";
    if (!/html|json|text|x-script|turbo|octet/.test(type) && !res.url().includes(".data")) return;
    try {
      seen.push({ url: res.url(), body: await res.text() });
    } catch {
      // Redirects have no body to read.
    }
  });
  return seen;
}

test("an author's pages and responses of a decided round carry no reviewer identity", async ({ page }) => {
  await login(page, "author");
  const seen = recordResponses(page);
  const base = `/venues/${fx.venueId}/submissions/${fx.submissionId}`;
  await page.goto(`${base}/rounds/1/decision`);
  await expect(page.getByTestId("released-remark")).toHaveCount(4);
  await expect(page.getByText("Reviewer 1").first()).toBeVisible();
  await expect(page.getByText("Reviewer 2").first()).toBeVisible();
  // A fetcher round trip: answer a remark.
  const remark = page.getByTestId("released-remark").first();
  await remark.getByRole("textbox").fill("Answered in round 2.");
  await remark.getByRole("button", { name: "Save answer" }).click();
  await expect(remark.getByRole("status")).toContainText("Answer saved");
  // Client-side navigation requests the loader data as a .data response.
  await page.goto("/dashboard");
  await page.goto(`${base}/rounds/2/changes`);
  await expect(page.getByTestId("flags-diff-counts")).toBeVisible();
  for (const path of [`${base}/rounds/1/decision.data`, `${base}/rounds/2/changes.data`, `${base}/rounds/1`, `${base}/rounds/2`]) {
    const res = await page.request.get(path);
    seen.push({ url: path, body: await res.text() });
  }
  const letter = await page.request.get(`${base}/rounds/1/letter.pdf`);
  expect(letter.status()).toBe(200);
  seen.push({ url: "letter.pdf", body: await pdfText(await letter.body()) });
  // The reviewer workspace and the editor's page are closed to authors.
  expect((await page.request.get(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/review`)).status()).toBe(404);
  expect((await page.request.get(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/desk`)).status()).toBe(404);
  expect((await page.request.get(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/packet.pdf`)).status()).toBe(404);

  expect(seen.length).toBeGreaterThan(5);
  expect(seen.some((s) => s.body.includes("reviewer1 remark on the round"))).toBe(true);
  for (const s of seen) for (const secret of reviewerSecrets()) expect(s.body, `${secret} leaked in ${s.url}`).not.toContain(secret);
});

test("a reviewer cannot see another reviewer's editor-only note", async ({ page }) => {
  await login(page, "reviewer2");
  const seen = recordResponses(page);
  await page.goto(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/review`);
  await expect(page.getByRole("heading", { level: 1, name: title })).toBeVisible();
  const html = await page.content();
  expect(html).not.toContain("SECRET-NOTE-reviewer1");
  expect(html).not.toContain("reviewer1 remark");
  const dataRes = await page.request.get(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/review.data`);
  seen.push({ url: "workspace.data", body: await dataRes.text() });
  for (const s of seen) expect(s.body, s.url).not.toContain("SECRET-NOTE-reviewer1");
  // Their own note is theirs to read; the editor's page stays closed.
  expect(seen.some((s) => s.body.includes("SECRET-NOTE-reviewer2"))).toBe(true);
  expect((await page.request.get(`/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/desk`)).status()).toBe(404);
});

test("a declined invitation link cannot be used again", async ({ page }) => {
  await page.goto(`/invitations/${fx.pendingToken}?answer=decline`);
  await page.getByRole("button", { name: "Decline" }).click();
  await expect(page.getByRole("heading", { name: "Invitation declined" })).toBeVisible();
  await page.goto(`/invitations/${fx.pendingToken}?answer=accept`);
  await expect(page.getByTestId("invitation-problem")).toContainText("already used");
  // Replaying the form post fails as well, signed in or not.
  await login(page, "reviewer1");
  const replay = await page.request.post(`/invitations/${fx.pendingToken}`, { form: { answer: "accept" }, headers: { origin: ORIGIN } });
  expect(replay.status()).not.toBe(200);
  await page.goto(`/invitations/${fx.pendingToken}`);
  await expect(page.getByTestId("invitation-problem")).toContainText("already used");
});
