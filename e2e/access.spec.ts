import { expect, test } from "@playwright/test";
import { ORIGIN } from "./support/origin";
import { login } from "./support/session";

test("a co-author cannot open the instance pages", async ({ page }) => {
  await login(page, "coauthor1");
  for (const path of ["/admin", "/admin/users", "/admin/venues"]) {
    const res = await page.goto(path);
    expect(res?.status(), path).toBe(403);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Not open to your account");
  }
  // The action refuses too, not only the page.
  const post = await page.request.post("/admin/users", {
    form: { intent: "set-role", userId: "x", role: "admin" },
    headers: { origin: ORIGIN },
  });
  expect(post.status()).toBe(403);
});

test("an anonymous visitor is sent to sign-in", async ({ page }) => {
  for (const path of ["/dashboard", "/account", "/admin/venues"]) {
    const direct = await page.request.get(path, { maxRedirects: 0 });
    expect(direct.status(), path).toBe(302);
    expect(direct.headers()["location"]).toBe(`/sign-in?next=${encodeURIComponent(path)}`);
    const res = await page.goto(path);
    expect(res?.status()).toBe(200);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Sign in");
  }
});

test("the admin opens the instance pages; an unknown address is a 404 page", async ({ page }) => {
  await login(page, "admin");
  const res = await page.goto("/admin/venues");
  expect(res?.status()).toBe(200);
  await expect(page.getByText("corvane-annals")).toBeVisible();
  const missing = await page.goto("/no/such/page");
  expect(missing?.status()).toBe(404);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Nothing here");
});
