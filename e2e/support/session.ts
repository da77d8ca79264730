import { expect, type Page } from "@playwright/test";
import { ORIGIN } from "./origin";
import { DEMO_PASSWORD, demoPeople, type DemoKey } from "../../database/demo-data";

export function demo(key: DemoKey) {
  const person = demoPeople.find((p) => p.key === key);
  if (!person) throw new Error(`no demo person ${key}`);
  return person;
}

/**
 * Signs in through better-auth's own HTTP endpoint (no typing), sharing the cookie with the page.
 */
export async function login(page: Page, key: DemoKey) {
  const person = demo(key);
  const res = await page.request.post("/api/auth/sign-in/email", {
    data: { email: person.email, password: DEMO_PASSWORD },
    headers: { origin: ORIGIN },
  });
  expect(res.status(), await res.text()).toBe(200);
  return person;
}

export function uniqueEmail(label: string) {
  return `${label}-${Date.now()}-${Math.floor(Math.random() * 1e6)}@e2e.runproof.example`;
}
