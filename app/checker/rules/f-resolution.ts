/** Family F: spectral decay, pile-up, Ekman-layer points, hyperdiffusion, truncation. */
import type { RunContext } from "../context.ts";
import { shellRadii } from "../conventions.ts";
import { pointsInLayer } from "../grid.ts";
import { spectrumStats } from "../spectra.ts";
import { flagOf, fmt, type Flag, type RuleInfo } from "../types.ts";

const CP = "common practice";

export const RULES_F = {
  decay: {
    id: "F.spectrum-decay", family: "F", title: "Spectrum falls too little from peak to truncation",
    explanation: "Energy spectra should fall by at least two decades from their peak to the truncation degree.",
    severities: ["caution", "mismatch"], policyKey: "spectrumCautionDecades",
    threshold: "caution below policy.spectrumCautionDecades (default 2, ratio 100), mismatch below policy.spectrumMismatchDecades (default 1, ratio 10)",
    source: CP,
  },
  pileup: {
    id: "F.spectrum-pileup", family: "F", title: "Energy piles up at the truncation degree",
    explanation: "The spectrum should not rise over its last degrees; a rise means energy accumulates at the truncation.",
    severities: ["caution"], policyKey: "pileupDegrees",
    threshold: "least-squares slope of log10 E over the last policy.pileupDegrees (default 5) degrees above policy.pileupMaxSlope (default 0)",
    source: CP,
  },
  truncation: {
    id: "F.spectrum-truncation", family: "F", title: "Spectrum ends at another degree than the declared truncation",
    explanation: "The attached spectrum's last degree should be the declared resolution.maxDegree.",
    severities: ["note"], source: CP,
  },
  ekman: {
    id: "F.ekman-layer-points", family: "F", title: "Few radial points inside the Ekman layer",
    explanation: "The declared radial grid should put at least five points inside the Ekman layer δ = E^½·L at each boundary.",
    severities: ["caution", "note"], policyKey: "ekmanLayerPoints",
    threshold: "fewer than policy.ekmanLayerPoints (default 5) points, boundary node included", source: CP,
  },
  hyper: {
    id: "F.hyperdiffusion", family: "F", title: "Hyperdiffusion declared",
    explanation: "The run damps small scales with hyperdiffusion, which changes the effective Ekman and magnetic Prandtl numbers at high degree.",
    severities: ["note"], source: CP,
  },
  maxOrder: {
    id: "F.max-order", family: "F", title: "Maximum order above maximum degree",
    explanation: "A spherical-harmonic truncation cannot have maxOrder greater than maxDegree.",
    severities: ["mismatch"], source: "spherical harmonics: |m| ≤ l",
  },
} satisfies Record<string, RuleInfo>;

export function checkResolution(ctx: RunContext): Flag[] {
  const out: Flag[] = [];
  const p = ctx.policy;
  const label = ctx.label;
  const res = ctx.run.resolution;
  if (ctx.spectrum) {
    for (const s of spectrumStats(ctx.spectrum, p.pileupDegrees)) {
      const q = [`spectrum.${s.column}`];
      const sev = s.decades < p.spectrumMismatchDecades ? "mismatch" : s.decades < p.spectrumCautionDecades ? "caution" : undefined;
      if (sev) {
        out.push(flagOf(RULES_F.decay, sev, q,
          `${label}: the ${s.column} spectrum falls by ${fmt(s.decades)} decades (ratio ${fmt(10 ** s.decades)}) from its peak at l = ${s.peakDegree} to l = ${s.truncationDegree}.`,
          { expected: `≥ ${p.spectrumCautionDecades} decades`, found: s.decades, run: label }));
      }
      if (s.tailSlope !== undefined && s.tailSlope > p.pileupMaxSlope) {
        out.push(flagOf(RULES_F.pileup, "caution", q,
          `${label}: the ${s.column} spectrum rises over its last ${p.pileupDegrees} degrees (slope ${fmt(s.tailSlope)} decades per degree).`,
          { found: s.tailSlope, tolerance: p.pileupMaxSlope, run: label }));
      }
      if (res?.maxDegree !== undefined && s.truncationDegree !== res.maxDegree) {
        out.push(flagOf(RULES_F.truncation, "note", q.concat("resolution.maxDegree"),
          `${label}: the ${s.column} spectrum ends at l = ${s.truncationDegree}, the record declares maxDegree ${res.maxDegree}.`,
          { expected: res.maxDegree, found: s.truncationDegree, run: label }));
      }
    }
  }
  const E = ctx.derived.E;
  if (res?.radialPoints !== undefined && res.radialGrid !== undefined && E !== undefined) {
    const need = p.ekmanLayerPoints;
    if (res.radialGrid === "stretched") {
      out.push(flagOf(RULES_F.ekman, "note", ["resolution.radialGrid"],
        `${label}: points inside the Ekman layer cannot be counted on a stretched grid; the reviewer should check them.`, { run: label }));
    } else {
      const { ri, D } = shellRadii(ctx.run.conventions.lengthScale, ctx.run.geometry.radiusRatio);
      const delta = Math.sqrt(E);
      const n = pointsInLayer(res.radialGrid, res.radialPoints, ri, D, delta);
      if (n.min < need) {
        out.push(flagOf(RULES_F.ekman, "caution", ["resolution.radialPoints", "E"],
          `${label}: ${n.min} radial points lie inside the Ekman layer δ = E^½·L = ${fmt(delta)} (inner ${n.inner}, outer ${n.outer}) on a ${res.radialGrid} grid of ${res.radialPoints}.`,
          { expected: `≥ ${need}`, found: n.min, run: label }));
      }
    }
  }
  if (res?.hyperdiffusion) {
    out.push(flagOf(RULES_F.hyper, "note", ["resolution.hyperdiffusion"], `${label}: hyperdiffusion is declared.`, { run: label }));
  }
  if (res?.maxOrder !== undefined && res.maxDegree !== undefined && res.maxOrder > res.maxDegree) {
    out.push(flagOf(RULES_F.maxOrder, "mismatch", ["resolution.maxOrder", "resolution.maxDegree"],
      `${label}: maxOrder ${res.maxOrder} exceeds maxDegree ${res.maxDegree}.`, { expected: `≤ ${res.maxDegree}`, found: res.maxOrder, run: label }));
  }
  return out;
}
