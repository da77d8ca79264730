/**
 * Stored XSS: every text field of a round (names, affiliations, venue name, title, abstract,
 * keywords, run labels, claim texts, flag answers, remarks, editor-only note, decision letter)
 * holds an OWASP filter-evasion payload (support/xss-payloads.ts). Checked where people read them:
 * pages in Chromium (no dialog opens, no on* handler, javascript: address, frame, object or foreign
 * script in the DOM, and the payload shows as text), the mails in the catcher (rendered in
 * Chromium without any policy, so a surviving script would run) and the PDFs (the text layer
 * shows the payload as text).
 */
import { expect, test, type Page } from "@playwright/test";
import { href } from "react-router";
import { mailsTo, type CaughtMail } from "./support/mail";
import { XSS_PASSWORD, type XssRound } from "./support/make-xss-round";
import { ORIGIN } from "./support/origin";
import { fixture, pdfText } from "./support/review";
import { printable, XSS_PAYLOADS } from "./support/xss-payloads";

let fx: XssRound;
const tag = `x${Date.now()}`;
test.beforeAll(() => {
  fx = fixture<XssRound>("make-xss-round.ts", tag);
});

/** What in the DOM could run script: handlers, script addresses, frames and objects, scripts without our nonce. */
async function scriptSurface(page: Page, allowNonced: boolean) {
  return page.evaluate((allowNonced) => {
    const bad: string[] = [];
    const urlAttrs = ["href", "src", "action", "formaction", "data", "background", "xlink:href", "poster", "srcdoc"];
    for (const el of Array.from(document.querySelectorAll("*"))) {
      const tag = el.tagName.toLowerCase();
      for (const a of Array.from(el.attributes)) {
        const name = a.name.toLowerCase();
        if (name.startsWith("on")) bad.push(`<${tag} ${name}="${a.value.slice(0, 60)}">`);
        if (urlAttrs.includes(name) && /^(javascript|vbscript|data:text\/html)/i.test(a.value.replace(/[\u0000-\u0020]/g, ""))) bad.push(`<${tag} ${name}="${a.value.slice(0, 60)}">`);
        if (name === "style" && /javascript:|expression\(|url\(/i.test(a.value)) bad.push(`<${tag} style="${a.value.slice(0, 60)}">`);
      }
      if (["iframe", "frame", "object", "embed", "base", "applet"].includes(tag)) bad.push(`<${tag}>`);
      if (tag === "meta" && el.getAttribute("http-equiv")) bad.push(`<meta http-equiv=${el.getAttribute("http-equiv")}>`);
      if (tag === "script" && !(allowNonced && (el as HTMLScriptElement).nonce)) bad.push(`<script> ${el.textContent?.slice(0, 60)}`);
    }
    return bad;
  }, allowNonced);
}

async function signIn(page: Page, who: keyof XssRound["people"]) {
  await page.context().clearCookies();
  const res = await page.request.post("/api/auth/sign-in/email", { data: { email: fx.people[who].email, password: XSS_PASSWORD }, headers: { origin: ORIGIN } });
  expect(res.status(), await res.text()).toBe(200);
}

test("payloads in every text field stay text on every page that shows them", async ({ page }) => {
  test.setTimeout(180_000);
  const dialogs: string[] = [];
  page.on("dialog", async (d) => {
    dialogs.push(`${page.url()}: ${d.type()} ${d.message()}`);
    await d.dismiss();
  });
  const r = { venueId: fx.venueId, submissionId: fx.submissionId, round: String(fx.round) };
  const pages: Record<keyof XssRound["people"], string[]> = {
    author: [
      href("/dashboard"),
      href("/venues/:venueId/submissions/:submissionId/details", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round/decision", r),
      href("/account"),
    ],
    reviewer: [
      href("/dashboard"),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims", r),
    ],
    editor: [
      href("/venues/:venueId/desk", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round", r),
      href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims", r),
    ],
  };
  let visited = 0;
  for (const who of ["author", "reviewer", "editor"] as const) {
    await signIn(page, who);
    for (const url of pages[who]) {
      const res = await page.goto(url);
      expect(res!.status(), `${who} ${url}`).toBe(200);
      await page.waitForLoadState("networkidle");
      visited++;
      expect(await scriptSurface(page, true), `${who} ${url}`).toEqual([]);
      // Pages reached from here: each run and claim, where labels and texts are shown in full.
      if (url.endsWith("/runs") || url.endsWith("/claims")) {
        const links = await page.locator(`a[href^="${url}/"]`).evaluateAll((as) => as.map((a) => a.getAttribute("href")!));
        for (const link of [...new Set(links)].slice(0, 4)) {
          await page.goto(link);
          await page.waitForLoadState("networkidle");
          visited++;
          expect(await scriptSurface(page, true), `${who} ${link}`).toEqual([]);
        }
      }
    }
  }
  // The title (a polyglot payload) is shown as the very characters typed.
  await page.goto(pages.editor[2]!);
  await expect(page.getByRole("heading", { level: 1 })).toContainText(`${XSS_PAYLOADS[1]} ${tag}`);
  expect(dialogs).toEqual([]);
  expect(visited).toBeGreaterThan(14);
});

test("the mails carrying payloads run nothing when their HTML is opened", async ({ page }) => {
  test.setTimeout(90_000);
  const dialogs: string[] = [];
  page.on("dialog", async (d) => {
    dialogs.push(`${d.type()} ${d.message()}`);
    await d.dismiss();
  });
  let mails: CaughtMail[] = [];
  await expect
    .poll(async () => {
      mails = (await Promise.all(Object.values(fx.people).map((p) => mailsTo(p.email)))).flat();
      return mails.length;
    }, { timeout: 30_000 })
    .toBeGreaterThanOrEqual(3);
  let withPayload = 0;
  for (const mail of mails) {
    if (XSS_PAYLOADS.some((p) => mail.text.includes(p))) withPayload++;
    // No policy here: if markup survived, it would run.
    await page.setContent(mail.html, { waitUntil: "load" });
    await page.waitForTimeout(200);
    expect(await scriptSurface(page, false), mail.subject).toEqual([]);
  }
  expect(withPayload, "mails quoting a payload in their text part").toBeGreaterThan(0);
  expect(dialogs).toEqual([]);
});

test("the PDFs show the payloads as text", async ({ page }) => {
  const r = { venueId: fx.venueId, submissionId: fx.submissionId, round: String(fx.round) };
  const squash = (s: string) => s.replace(/\s+/g, "");
  await signIn(page, "author");
  const letter = await page.request.get(href("/venues/:venueId/submissions/:submissionId/rounds/:round/letter.pdf", r));
  expect(letter.status()).toBe(200);
  const letterText = squash(await pdfText(await letter.body()));
  const checked = XSS_PAYLOADS.filter(printable);
  expect(checked.length).toBeGreaterThan(25);
  for (const p of checked) expect(letterText, `letter.pdf shows ${p}`).toContain(squash(p));
  await signIn(page, "editor");
  const packet = await page.request.get(href("/venues/:venueId/submissions/:submissionId/rounds/:round/packet.pdf", r));
  expect(packet.status()).toBe(200);
  const packetText = squash(await pdfText(await packet.body()));
  for (const p of checked) expect(packetText, `packet.pdf shows the remark ${p}`).toContain(squash(p));
});
