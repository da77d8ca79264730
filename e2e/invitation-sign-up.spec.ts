import { expect, test } from "@playwright/test";
import { linkIn, waitForMail } from "./support/mail";
import { ORIGIN } from "./support/origin";
import { fixture } from "./support/review";
import { login, uniqueEmail } from "./support/session";

// Someone invited to review who has no account yet: the invitation leads to sign-up, and
// confirming the new account brings the person back to the invitation, ready to accept.
test.setTimeout(180_000);

test("a new reviewer signs up from the invitation and comes back to it after confirming", async ({ browser, baseURL }) => {
  const title = `Invitation sign-up ${Date.now()}`;
  const fx = fixture<{ venueId: string; submissionId: string }>("make-sent-round.ts", title);
  const email = uniqueEmail("invited-newcomer");

  const editorContext = await browser.newContext({ baseURL: ORIGIN });
  const editor = await editorContext.newPage();
  editor.on("dialog", (dialog) => void dialog.accept());
  await login(editor, "editor");
  await editor.goto(`/venues/${fx.venueId}/desk`);
  await editor.getByTestId("queue-sent").getByRole("link", { name: title }).click();
  await editor.getByLabel("E-mail").fill(email);
  await editor.getByRole("button", { name: "Invite reviewer" }).click();
  await expect(editor.getByRole("status")).toContainText(`Invitation sent to ${email}`);
  await editorContext.close();

  const invitation = await waitForMail(email, title);
  const link = linkIn(invitation, `${baseURL}/invitations/`);
  const context = await browser.newContext({ baseURL: ORIGIN });
  const page = await context.newPage();
  await page.goto(link);
  await page.getByRole("main").getByRole("link", { name: "create an account", exact: true }).click();
  await expect(page).toHaveURL(/\/sign-up\?next=/);
  await page.getByLabel("Name").fill("Oren Valdastri");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password", { exact: true }).fill("a-long-enough-secret");
  await page.getByLabel("Repeat the password").fill("a-long-enough-secret");
  await page.getByRole("button", { name: "Create the account" }).click();
  await expect(page.getByRole("status")).toContainText(email);

  const confirm = await waitForMail(email, "Confirm your e-mail address");
  await page.goto(linkIn(confirm, `${baseURL}/api/auth/verify-email`));
  // Back at the invitation (not the dashboard), signed in, with accepting one click away.
  await expect(page).toHaveURL(/\/invitations\/[^/?]+\?answer=accept$/);
  await expect(page.getByRole("heading", { name: "Invitation to review" })).toBeVisible();
  await page.getByRole("button", { name: "Accept and open the review" }).click();
  await expect(page).toHaveURL(new RegExp(`/submissions/${fx.submissionId}/rounds/1/review$`));
  await context.close();
});
