import { expect, test } from "@playwright/test";
import { readFileSync } from "node:fs";

const example = (path: string) => JSON.parse(readFileSync(new URL(`../examples/${path}`, import.meta.url), "utf8"));

test("POST /api/v1/check recomputes and flags, the same output shape as the CLI", async ({ request }) => {
  const run = example("runs/strat-B.json");
  const res = await request.post("/api/v1/check", { data: { runs: [run] } });
  expect(res.status()).toBe(200);
  const body = await res.json();
  expect(body.runs[0].label).toBe(run.label);
  expect(typeof body.runs[0].derived.E).toBe("number");
  expect(Array.isArray(body.claimFlags)).toBe(true);
  for (const flag of body.runs[0].flags) {
    expect(["mismatch", "caution", "note"]).toContain(flag.severity);
    expect(flag.source).toBeTruthy();
  }
});

test("POST /api/v1/check answers bad input with 400 and the JSON path; a huge body with 413", async ({ request }) => {
  const run = { ...example("runs/strat-B.json"), colour: "blue" };
  const res = await request.post("/api/v1/check", { data: { runs: [run] } });
  expect(res.status()).toBe(400);
  const body = await res.json();
  expect(body.error.code).toBe("invalid_input");
  expect(JSON.stringify(body.error.details)).toContain("colour");

  const big = await request.post("/api/v1/check", {
    data: { runs: [run], padding: "x".repeat(3 * 1024 * 1024) },
  });
  expect(big.status()).toBe(413);
  expect((await big.json()).error.code).toBe("body_too_large");
});

test("the JSON Schemas and the checks reference are published", async ({ request, page }) => {
  const schema = await (await request.get("/schemas/run-1.json")).json();
  expect(schema.$schema).toContain("2020-12");
  expect(schema.$id).toContain("/schemas/run-1.json");
  const claim = await (await request.get("/schemas/claim-1.json")).json();
  expect(claim.$id).toContain("/schemas/claim-1.json");

  await page.goto("/help/checks");
  await expect(page.getByTestId("advisory-note")).toBeVisible();
  await expect(page.locator("tr#D\\.min-magnetic-times")).toContainText("common practice");
  await expect(page.getByTestId("rules-J")).toContainText("Christensen");
});
