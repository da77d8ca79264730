import { expect, test } from "@playwright/test";
import { linkIn, waitForMail } from "./support/mail";
import { login, uniqueEmail } from "./support/session";

test("sign up, confirm through the mailed link, land on the dashboard, sign out", async ({ page, baseURL }) => {
  const email = uniqueEmail("newcomer");
  await page.goto("/sign-up");
  await page.getByLabel("Name").fill("Ines Korvald");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password", { exact: true }).fill("a-long-enough-secret");
  await page.getByLabel("Repeat the password").fill("a-long-enough-secret");
  await page.getByRole("button", { name: "Create the account" }).click();
  await expect(page.getByRole("status")).toContainText(email);

  // Unconfirmed accounts cannot sign in yet.
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("a-long-enough-secret");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toContainText("Confirm your e-mail address first");

  const mail = await waitForMail(email, "Confirm your e-mail address");
  expect(mail.html).toContain("Confirm my address");
  await page.goto(linkIn(mail, `${baseURL}/api/auth/verify-email`));
  await expect(page).toHaveURL(/\/dashboard$/);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("What needs you, Ines Korvald");
  await expect(page.getByTestId("viewer-name")).toHaveText("Ines Korvald");
  await expect(page.getByTestId("no-roles")).toBeVisible();

  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/sign-in$/);
  const res = await page.goto("/dashboard");
  expect(res?.status()).toBe(200);
  await expect(page).toHaveURL(/\/sign-in\?next=%2Fdashboard$/);
});

test("the dashboard shows the roles a person holds", async ({ page }) => {
  await login(page, "editor");
  await page.goto("/dashboard");
  await expect(page.getByTestId("viewer-roles")).toContainText("editor");
  await expect(page.getByTestId("role-editor")).toContainText("Annals of the Corvane Society");

  await page.context().clearCookies();
  await login(page, "author");
  await page.goto("/dashboard");
  await expect(page.getByTestId("viewer-roles")).toContainText("author");
  await expect(page.getByTestId("role-author")).toContainText("thin stable layer");
});

test("password reset by mail", async ({ page, baseURL }) => {
  const email = uniqueEmail("forgetful");
  // A confirmed account of its own, so the demo passwords stay as README says.
  await page.goto("/sign-up");
  await page.getByLabel("Name").fill("Bram Oltvedt");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password", { exact: true }).fill("first-password-1");
  await page.getByLabel("Repeat the password").fill("first-password-1");
  await page.getByRole("button", { name: "Create the account" }).click();
  await page.goto(linkIn(await waitForMail(email, "Confirm your e-mail"), `${baseURL}/api/auth/verify-email`));
  await expect(page).toHaveURL(/\/dashboard$/);
  await page.getByRole("button", { name: "Sign out" }).click();

  await page.goto("/forgot-password");
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Send me a link" }).click();
  await expect(page.getByRole("status")).toContainText("on its way");
  const mail = await waitForMail(email, "Choose a new Runproof password");
  await page.goto(linkIn(mail, `${baseURL}/api/auth/reset-password/`));
  await expect(page).toHaveURL(/\/reset-password\?token=/);
  await page.getByLabel("New password", { exact: true }).fill("second-password-2");
  await page.getByLabel("Repeat the new password").fill("second-password-2");
  await page.getByRole("button", { name: "Save the new password" }).click();
  await expect(page).toHaveURL(/\/sign-in\?reset=1$/);

  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("first-password-1");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toContainText("do not match");
  await page.getByLabel("Password").fill("second-password-2");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/dashboard$/);
});
