import { request as httpRequest } from "node:http";
import { expect, test } from "@playwright/test";
import { DEMO_PASSWORD } from "../database/demo-data";
import { ORIGIN } from "./support/origin";
import { demo } from "./support/session";

const ID = "0b7c6f0e-6f3a-4a3e-9d5e-1f2a3b4c5d6e";

/** A request with a declared length and no body sent: the server must answer before reading it. */
function declaredOnly(path: string, length: number) {
  return new Promise<{ status: number; ms: number }>((resolve, reject) => {
    const t0 = Date.now();
    const req = httpRequest(`${ORIGIN}${path}`, {
      method: "POST",
      headers: { origin: ORIGIN, "content-type": "application/x-www-form-urlencoded", "content-length": String(length) },
    });
    req.on("response", (res) => {
      res.resume();
      resolve({ status: res.statusCode ?? 0, ms: Date.now() - t0 });
      req.destroy();
    });
    req.on("error", reject);
    req.flushHeaders();
  });
}

test("pages run under a nonce-only script policy, hydrate, and cannot be framed", async ({ page }) => {
  await page.addInitScript(() => {
    (window as unknown as { cspViolations: string[] }).cspViolations = [];
    document.addEventListener("securitypolicyviolation", (e) =>
      (window as unknown as { cspViolations: string[] }).cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`),
    );
  });
  const res = await page.goto("/sign-in");
  const headers = res!.headers();
  expect(headers["content-security-policy"]).toMatch(/script-src 'self' 'nonce-[^']+'/);
  expect(headers["content-security-policy"]).toContain("frame-ancestors 'none'");
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["x-request-id"]).toBeTruthy();
  // The router exists in the page only once the nonce'd module scripts ran and hydrated it, and
  // a link then navigates on the client (no new document is loaded).
  await page.waitForFunction(() => "__reactRouterDataRouter" in window);
  await page.evaluate(() => ((window as unknown as { sameDocument: boolean }).sameDocument = true));
  await page.getByRole("link", { name: "Forgot your password?" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Forgot your password?");
  expect(await page.evaluate(() => (window as unknown as { sameDocument?: boolean }).sameDocument)).toBe(true);
  expect(await page.evaluate(() => (window as unknown as { cspViolations: string[] }).cspViolations)).toEqual([]);
  // An inline script without the nonce is blocked.
  const ran = await page.evaluate(async () => {
    const s = document.createElement("script");
    s.textContent = "window.injected = true";
    document.body.append(s);
    await new Promise((r) => setTimeout(r, 100));
    return (window as unknown as { injected?: boolean }).injected === true;
  });
  expect(ran).toBe(false);
});

test("cross-site writes are refused on resource routes too", async ({ request }) => {
  for (const path of [`/venues/${ID}/submissions/${ID}/rounds/1/flags/${ID}/answer`, `/venues/${ID}/submissions/${ID}/rounds/1/runs/${ID}/attachments`, "/account/digest"]) {
    const res = await request.post(path, { headers: { origin: "https://evil.example", "content-type": "text/plain" }, data: "intent=x" });
    expect(res.status(), path).toBe(403);
  }
});

test("malformed ids and round numbers answer 404, not 500", async ({ request }) => {
  for (const path of ["/venues/not-a-uuid/submissions/also-not/rounds/1/runs", `/venues/${ID}/submissions/${ID}/rounds/99999999999/runs`, `/review/${ID}/rounds/0`]) {
    expect((await request.get(path)).status(), path).toBe(404);
  }
  const api = await request.get("/api/v1/submissions/not-a-uuid");
  expect(api.status()).toBe(404);
  expect((await api.json()).error.code).toBe("not_found");
});

test("bodies over the limit are refused before they are read", async () => {
  const big = await declaredOnly("/sign-in", 200 * 1024 * 1024);
  expect(big.status).toBe(413);
});

test("non-form and NUL-bearing bodies on page actions answer 4xx with a reason", async ({ request }) => {
  const json = await request.post("/sign-in", { headers: { origin: ORIGIN, "content-type": "application/json" }, data: JSON.stringify({ a: [[[[[[[[[[1]]]]]]]]]] }) });
  expect(json.status()).toBe(415);
  const nul = await request.post("/forgot-password", { headers: { origin: ORIGIN }, form: { email: "a\u0000@b.example" } });
  expect(nul.status()).toBe(400);
  expect(await nul.text()).toContain("NUL");
});

test("after sign-in, next= leads only to our own pages", async ({ request }) => {
  const person = demo("author");
  const res = await request.post(`/sign-in`, {
    headers: { origin: ORIGIN },
    form: { email: person.email, password: DEMO_PASSWORD, next: "/\\evil.example" },
    maxRedirects: 0,
  });
  expect(res.status()).toBe(302);
  expect(res.headers()["location"]).toBe("/dashboard");
});

test("health, readiness and metrics", async ({ request }) => {
  expect((await request.get("/healthz")).status()).toBe(200);
  const ready = await request.get("/readyz");
  expect(ready.status()).toBe(200);
  expect((await ready.json()).checks).toMatchObject({ database: { ok: true }, objectStorage: { ok: true }, mail: { ok: true } });
  // Loopback may read the metrics (the test runs on the same machine); a proxied request may not.
  const metrics = await request.get("/metrics");
  expect(await metrics.text()).toContain("runproof_http_request_duration_seconds");
  expect((await request.get("/metrics", { headers: { "x-forwarded-for": "203.0.113.9" } })).status()).toBe(404);
});
