import fc from "fast-check";
import { RouterContextProvider } from "react-router";
import { describe, expect, it } from "vitest";
import { safeNext } from "~/auth/sign-in-forms";
import { contentDisposition } from "~/lib/content-disposition";
import { badParam, cleanText, findBadText, MAX_ROUND, paramProblem, safeLocalPath, textProblem } from "~/lib/edge-input";
import { edgeInputMiddleware } from "~/middleware.server";

const ORIGIN = "https://app.runproof.example";

describe("next= after sign-in: same-origin paths only", () => {
  // Node's URL is the WHATWG URL Standard's parser, as browsers resolve a Location header.
  it("refuses the known open-redirect forms", () => {
    for (const evil of ["//evil.example", "/\\evil.example", "/\\/evil.example", "\\\\evil.example", "https://evil.example", "/\t/evil.example", "/\n/evil.example", "javascript:alert(1)", " /x"]) {
      expect(safeNext(evil), JSON.stringify(evil)).toBe("/dashboard");
    }
  });

  it("keeps ordinary paths with their query", () => {
    expect(safeNext("/submissions/abc/join?token=xyz")).toBe("/submissions/abc/join?token=xyz");
    expect(safeNext("/venues/v/desk#top")).toBe("/venues/v/desk#top");
  });

  it("whatever it is given, the result resolves to our own origin (fast-check, 5,000 cases)", () => {
    const hostile = fc.oneof(
      fc.string(),
      fc.string().map((s) => `/${s}`),
      fc.constantFrom("/", "//", "/\\", "\\", "/\t", "/%2F", "/%5C", "/.."),
    ).chain((prefix) => fc.tuple(fc.constant(prefix), fc.string()).map(([a, b]) => a + b));
    fc.assert(
      fc.property(hostile, (next) => {
        const out = safeLocalPath(next);
        expect(new URL(out, ORIGIN).origin).toBe(ORIGIN);
        expect(out.startsWith("/")).toBe(true);
      }),
      { numRuns: 5000 },
    );
  });
});

describe("route parameters are checked at the edge", () => {
  it("accepts UUIDs and round numbers 1..MAX_ROUND; refuses everything else", () => {
    expect(paramProblem("submissionId", "0b7c6f0e-6f3a-4a3e-9d5e-1f2a3b4c5d6e")).toBeNull();
    expect(paramProblem("submissionId", "not-a-uuid")).toMatch(/not an id/);
    expect(paramProblem("runId", "1' or 1=1 --")).not.toBeNull();
    expect(paramProblem("round", "1")).toBeNull();
    expect(paramProblem("round", String(MAX_ROUND))).toBeNull();
    for (const bad of ["0", "-1", "99999999999", "1e3", "1.5", "01", " 1", "NaN", ""]) expect(paramProblem("round", bad), bad).not.toBeNull();
    expect(badParam({ venueId: "0b7c6f0e-6f3a-4a3e-9d5e-1f2a3b4c5d6e", round: "2147483648" })).toMatch(/round/);
  });

  it("the router middleware answers 404 for a malformed id and JSON for the API", async () => {
    const run = async (url: string, params: Record<string, string>) => {
      try {
        await edgeInputMiddleware({ request: new Request(url), params, context: new RouterContextProvider(), unstable_pattern: "" } as never, async () => new Response("reached"));
        return { status: 200, json: false };
      } catch (thrown) {
        if (thrown instanceof Response) return { status: thrown.status, json: (thrown.headers.get("content-type") ?? "").includes("json") };
        return { status: (thrown as { init?: { status?: number } }).init?.status ?? 0, json: false };
      }
    };
    expect(await run("http://x/venues/v/submissions/s", { venueId: "v", submissionId: "s" })).toEqual({ status: 404, json: false });
    expect(await run("http://x/api/v1/submissions/s", { submissionId: "s" })).toEqual({ status: 404, json: true });
    expect(await run("http://x/api/v1/submissions/0b7c6f0e-6f3a-4a3e-9d5e-1f2a3b4c5d6e/rounds/99999999999", { submissionId: "0b7c6f0e-6f3a-4a3e-9d5e-1f2a3b4c5d6e", round: "99999999999" })).toEqual({ status: 404, json: true });
  });
});

describe("text with NUL, control characters or lone surrogates is refused with a clear message", () => {
  it("finds each kind and names the field", () => {
    expect(textProblem("plain text, tabs\tand\nnew lines")).toBeNull();
    expect(textProblem("emoji 🌀 pairs are fine")).toBeNull();
    expect(textProblem("a\u0000b")).toMatch(/NUL/);
    expect(textProblem("a\u0007b")).toMatch(/control character/);
    expect(textProblem("a\ud800b")).toMatch(/lone UTF-16 surrogate/);
    expect(textProblem("\udc00")).toMatch(/surrogate/);
    expect(findBadText({ runs: [{ label: "ok" }, { label: "bad\u0000" }] })).toEqual({ path: "runs[1].label", message: expect.stringContaining("runs[1].label contains a NUL") });
    expect(cleanText().safeParse("x\u0000").success).toBe(false);
  });

  it("agrees with the platform's own well-formedness check on any string (String.prototype.isWellFormed, 10,000 cases)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary" }), (s) => {
        const wellFormed = (s as string & { isWellFormed(): boolean }).isWellFormed();
        if (!wellFormed) expect(textProblem(s)).not.toBeNull();
        if (wellFormed && !/[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/.test(s)) expect(textProblem(s)).toBeNull();
      }),
      { numRuns: 10_000 },
    );
  });

  it("the router middleware refuses a form with a NUL byte before the action runs", async () => {
    let reached = false;
    const request = new Request("http://x/account", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: "name=Ada%00Lovelace",
    });
    let status = 0;
    let message = "";
    try {
      await edgeInputMiddleware({ request, params: {}, context: new RouterContextProvider() } as never, async () => {
        reached = true;
        return new Response("ok");
      });
    } catch (thrown) {
      status = (thrown as { init?: { status?: number } }).init?.status ?? 0;
      message = String((thrown as { data?: unknown }).data);
    }
    expect(reached).toBe(false);
    expect(status).toBe(400);
    expect(message).toMatch(/name contains a NUL/);
  });
});

describe("file names in downloads (RFC 6266 / RFC 8187)", () => {
  it("keeps any name exactly in filename* and an ASCII fallback in filename", () => {
    for (const name of ["Überströmung im Kern.pdf", 'say "hi".pdf', "日本語.pdf", "a\\b.pdf", "plain.pdf"]) {
      const value = contentDisposition("inline", name);
      expect(/^[\x20-\x7e]*$/.test(value), name).toBe(true);
      expect(() => new Headers({ "content-disposition": value })).not.toThrow();
      const star = /filename\*=UTF-8''(.+)$/.exec(value)![1]!;
      expect(decodeURIComponent(star)).toBe(name);
    }
  });
});

describe("deeply nested JSON is refused before parsing", () => {
  it("answers 400 for 500,000 levels and accepts ordinary records", async () => {
    const { readJsonBody } = await import("~/api/json-body.server");
    const deep = `${"[".repeat(500_000)}${"]".repeat(500_000)}`;
    const res = await readJsonBody(new Request("http://x/api/v1/check", { method: "POST", body: deep }), 2 * 1024 * 1024).catch((e) => e as Response);
    expect(res).toBeInstanceOf(Response);
    expect((res as Response).status).toBe(400);
    expect(((await (res as Response).json()) as { error: { code: string } }).error.code).toBe("too_deeply_nested");
    const ok = await readJsonBody(new Request("http://x", { method: "POST", body: JSON.stringify({ runs: [{ a: { b: ["[[[[", "}}}"] } }] }) }), 1024);
    expect(ok).toEqual({ runs: [{ a: { b: ["[[[[", "}}}"] } }] });
  });
});
