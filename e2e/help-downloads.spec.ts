import { expect, test } from "@playwright/test";
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

test("the help pages offer the command-line checker and push-run.mjs; the downloaded checker runs on its own", async ({ page, request }) => {
  test.setTimeout(120_000);
  await page.goto("/help/checks");
  const cliLink = page.getByRole("link", { name: "Download the command-line checker" });
  await expect(cliLink).toHaveAttribute("href", "/help/downloads/runproof-check.mjs");
  await page.goto("/help/api");
  await expect(page.getByTestId("push-run-download")).toHaveAttribute("href", "/help/downloads/push-run.mjs");

  // Anyone may download both, signed in or not (this request context has no session).
  const pushRun = await request.get("/help/downloads/push-run.mjs");
  expect(pushRun.status()).toBe(200);
  expect(pushRun.headers()["content-disposition"]).toBe('attachment; filename="push-run.mjs"');
  expect(await pushRun.text()).toBe(readFileSync(new URL("../examples/push-run.mjs", import.meta.url), "utf8"));

  const cli = await request.get("/help/downloads/runproof-check.mjs");
  expect(cli.status()).toBe(200);
  expect(cli.headers()["content-disposition"]).toBe('attachment; filename="runproof-check.mjs"');
  // Outside the repository, with no node_modules next to it: usage on --help, a JSON answer on a record.
  const dir = mkdtempSync(join(tmpdir(), "runproof-cli-"));
  writeFileSync(join(dir, "runproof-check.mjs"), await cli.body());
  const record = { format: "runproof.run/1", label: "lone-run", geometry: { radiusRatio: 0.35 }, conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" }, controls: { E: 1e-4, Ra: 2e7, Pr: 1, Pm: 2 } };
  writeFileSync(join(dir, "run.json"), JSON.stringify(record));
  expect(execFileSync(process.execPath, ["runproof-check.mjs", "--help"], { cwd: dir, encoding: "utf8" })).toContain("usage:");
  const out = JSON.parse(execFileSync(process.execPath, ["runproof-check.mjs", "run.json"], { cwd: dir, encoding: "utf8" }));
  expect(out.runs[0].label).toBe("lone-run");
  // Ra·E/Pr, the rotating Rayleigh number of the 2001 dynamo benchmark (Phys. Earth Planet. Inter. 128, 25–34): 2e7·1e-4/1 = 2000.
  expect(out.runs[0].derived.RaRotating).toBeCloseTo(2000, 9);
});
