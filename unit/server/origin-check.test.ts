import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import routes from "~/routes";
import { isExemptFromOriginCheck } from "../../server/request-rules";
import { startHarness, type Harness } from "./harness";

type Entry = { path?: string; file: string; index?: boolean; children?: Entry[] };

/** Every route module with an action, with its URL: read from app/routes.ts, so new and moved routes are covered. */
function routesWithActions(entries: Entry[], parent = ""): { url: string; file: string }[] {
  const out: { url: string; file: string }[] = [];
  for (const entry of entries) {
    const path = entry.path ? `${parent}/${entry.path}`.replace(/\/+/g, "/") : parent;
    const source = join("app", entry.file);
    const text = existsSync(source) ? readFileSync(source, "utf8") : "";
    if (/export\s+(async\s+)?(function|const)\s+action\b/.test(text)) {
      // Concrete values for the parameters; the check must refuse before any lookup happens.
      const url = (path || "/").replace(/:[A-Za-z]+\??/g, "00000000-0000-4000-8000-000000000001").replace(/\*$/, "anything");
      out.push({ url, file: entry.file });
    }
    if (entry.children) out.push(...routesWithActions(entry.children, path));
  }
  return out;
}

const all = routesWithActions(routes as Entry[]);
const checked = all.filter((r) => !isExemptFromOriginCheck(r.url));

describe("cross-site writes are refused on every route with an action (OWASP CSRF Prevention Cheat Sheet: verify Origin)", () => {
  let h: Harness;
  beforeAll(async () => (h = await startHarness()));
  afterAll(() => h.close());

  it("finds the routes (the list is read from app/routes.ts, not written here)", () => {
    expect(checked.length).toBeGreaterThan(20);
    expect(checked.map((r) => r.file)).toEqual(expect.arrayContaining(["routes/auth/sign-in.tsx"]));
  });

  it("exempts only the token-authenticated public API and the auth library's endpoint", () => {
    const exempt = all.filter((r) => isExemptFromOriginCheck(r.url)).map((r) => r.url);
    for (const url of exempt) expect(url).toMatch(/^\/api\/(v1|auth)\//);
  });

  for (const { url, file } of checked) {
    for (const [what, headers] of [
      ["a foreign Origin", { origin: "https://evil.example" }],
      ["a missing Origin", {}],
      ['Origin "null" (sandboxed frame)', { origin: "null" }],
      ["a look-alike Origin", { origin: "http://app.runproof.test.evil.example" }],
    ] as const) {
      it(`${file}: refuses ${what} for a form and for a text/plain body`, async () => {
        const before = h.reached.length;
        for (const [type, body] of [
          ["application/x-www-form-urlencoded", "intent=delete"],
          ["multipart/form-data; boundary=x", "--x\r\nContent-Disposition: form-data; name=\"a\"\r\n\r\nb\r\n--x--\r\n"],
          ["text/plain", "intent=delete"],
        ] as const) {
          for (const target of [url, `${url === "/" ? "/_root" : url}.data`]) {
            const res = await fetch(`${h.url}${target}`, { method: "POST", headers: { ...headers, "content-type": type }, body });
            expect([403, 415], `${target} ${type}`).toContain(res.status);
          }
        }
        expect(h.reached.length).toBe(before);
      });
    }
    it(`${file}: lets a form from our own origin through`, async () => {
      const res = await fetch(`${h.url}${url}`, {
        method: "POST",
        headers: { origin: "http://app.runproof.test", "content-type": "application/x-www-form-urlencoded" },
        body: "intent=x",
      });
      expect(res.status).toBe(200);
    });
  }
});
