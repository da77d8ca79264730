/**
 * Writes the demo's series and spectrum CSVs, deterministically (a fixed-seed generator), so the
 * committed files can be re-made and checked: `npx tsx database/demo/generate.ts`.
 */
import { writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const here = dirname(fileURLToPath(import.meta.url));

/** Park–Miller minimal standard generator: the same numbers on every machine. */
function rng(seed: number) {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return s / 2147483647;
  };
}

/** Energies that rise from a small seed field to a noisy plateau (the transient MSER-5 should find). */
export function seriesCsv(opts: { seed: number; rows: number; tEnd: number; ekin: number; emag: number; rise: number }) {
  const r = rng(opts.seed);
  const lines = ["t,kineticEnergy,magneticEnergy"];
  for (let i = 0; i < opts.rows; i++) {
    const t = (opts.tEnd * i) / (opts.rows - 1);
    const grow = 1 - Math.exp(-t / opts.rise);
    const noise = () => 1 + 0.04 * (r() + r() + r() - 1.5);
    lines.push(`${t.toPrecision(6)},${(opts.ekin * (0.3 + 0.7 * grow) * noise()).toPrecision(6)},${(opts.emag * grow * grow * noise()).toPrecision(6)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

/** Energy per degree falling by `decades` from ℓ = 2 (the peak) to ℓ = lmax. */
export function spectrumCsv(opts: { lmax: number; decades: number; kinetic: number; magnetic: number }) {
  const lines = ["l,kinetic,magnetic"];
  for (let l = 1; l <= opts.lmax; l++) {
    const fall = l <= 2 ? (l === 1 ? 0.6 : 1) : 10 ** (-(opts.decades * (l - 2)) / (opts.lmax - 2));
    lines.push(`${l},${(opts.kinetic * fall).toPrecision(5)},${(opts.magnetic * fall * (l === 1 ? 2 : 1)).toPrecision(5)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

export const DEMO_FILES = {
  "ref-A-series.csv": () => seriesCsv({ seed: 11, rows: 800, tEnd: 3, ekin: 2.0e4, emag: 5.0e4, rise: 0.25 }),
  "strat-B-series.csv": () => seriesCsv({ seed: 23, rows: 1500, tEnd: 3, ekin: 1.6e4, emag: 4.2e4, rise: 0.3 }),
  "strat-C-series.csv": () => seriesCsv({ seed: 37, rows: 400, tEnd: 1, ekin: 1.7e4, emag: 3.9e4, rise: 0.2 }),
  "ref-A-spectrum.csv": () => spectrumCsv({ lmax: 85, decades: 4.2, kinetic: 900, magnetic: 2400 }),
  "strat-B-spectrum.csv": () => spectrumCsv({ lmax: 85, decades: 3.6, kinetic: 800, magnetic: 2100 }),
  // Deliberately under-resolved: falls by only 1.5 decades from peak to truncation.
  "strat-C-spectrum.csv": () => spectrumCsv({ lmax: 64, decades: 1.5, kinetic: 820, magnetic: 2000 }),
} as const;

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const [name, make] of Object.entries(DEMO_FILES)) writeFileSync(join(here, name), make());
  console.log(`wrote ${Object.keys(DEMO_FILES).length} demo CSVs to ${here}`);
}
