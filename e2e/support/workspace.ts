import { expect, type Page } from "@playwright/test";

/** Creates a draft submission through the UI and returns the round 1 base URL. */
export async function startSubmission(page: Page, title: string) {
  await page.goto("/dashboard");
  await page.getByRole("link", { name: /Start a submission to Annals of the Corvane Society/ }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Start a submission" })).toBeVisible();
  await page.getByLabel("Title").fill(title);
  await page.getByLabel("Abstract").fill("Runs in a Mars-sized shell with and without a stable layer.");
  await page.getByLabel("Keywords").fill("stable layer, zonal flow");
  await page.getByLabel("DOIs cited in the statement").fill("10.5281/zenodo.1234567");
  await page.getByRole("button", { name: "Create the draft" }).click();
  await expect(page).toHaveURL(/\/rounds\/1$/);
  await expect(page.getByRole("heading", { level: 1, name: title })).toBeVisible();
  return new URL(page.url()).pathname;
}

/** A run record in runproof.run/1 for the JSON upload. */
export function runJson(label: string, extra: Record<string, unknown> = {}) {
  return JSON.stringify({
    format: "runproof.run/1",
    label,
    geometry: { radiusRatio: 0.35 },
    conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
    controls: { E: 1e-4, Ra: 2.5e7, Pr: 1, Pm: 2 },
    time: { start: 0, end: 3 },
    resolution: { radialPoints: 97, radialGrid: "chebyshev", maxDegree: 40, maxOrder: 40 },
    ...extra,
  });
}

/** A deterministic time series over [0, tEnd] in the run's time unit. */
export function seriesCsv(rows: number, tEnd: number) {
  const lines = ["t,kineticEnergy,magneticEnergy"];
  for (let i = 0; i < rows; i++) {
    const t = (tEnd * i) / (rows - 1);
    const wobble = Math.sin(i * 1.7) * 0.03;
    lines.push(`${t},${(2e4 * (1 - Math.exp(-t / 0.2)) * (1 + wobble)).toFixed(3)},${(5e4 * (1 - Math.exp(-t / 0.3)) * (1 - wobble)).toFixed(3)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

/** A spectrum to degree lmax falling by `decades` from its peak at l = 1. */
export function spectrumCsv(lmax: number, decades: number) {
  const lines = ["l,kinetic,magnetic"];
  for (let l = 1; l <= lmax; l++) {
    const f = 10 ** (-(decades * (l - 1)) / (lmax - 1));
    lines.push(`${l},${(900 * f).toPrecision(5)},${(2400 * f).toPrecision(5)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

/** axe-core's serious and critical findings on the page as it stands. */
export async function seriousViolations(page: Page) {
  const { default: AxeBuilder } = await import("@axe-core/playwright");
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
}
