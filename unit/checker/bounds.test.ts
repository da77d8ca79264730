import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseCsv, CsvFormatError } from "../../app/checker/csv.ts";
import { gridNodes, pointsInLayer } from "../../app/checker/grid.ts";
import { check } from "../../app/checker/index.ts";
import { runJsonSchema } from "../../app/checker/json-schema.ts";
import { LIMITS, runSchema } from "../../app/checker/schema.ts";
import { baseRun } from "./helpers.ts";

/** The definition: enumerate the grid's nodes and count those within δ of each boundary. */
function enumerate(kind: "chebyshev" | "uniform", n: number, ri: number, D: number, delta: number) {
  const nodes = gridNodes(kind, n, ri, D);
  const eps = 1e-12 * D;
  const inner = nodes.filter((r) => r - ri <= delta + eps).length;
  const outer = nodes.filter((r) => ri + D - r <= delta + eps).length;
  return Math.min(inner, outer);
}

describe("Ekman-layer points are counted by formula, not by building the grid", () => {
  it("agrees with enumerating the Chebyshev–Gauss–Lobatto and uniform nodes (fast-check, 2,000 grids)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom("chebyshev" as const, "uniform" as const),
        fc.integer({ min: 2, max: 1500 }),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.double({ min: 1e-8, max: 2, noNaN: true }),
        (kind, n, ri, D, frac) => {
          const delta = frac * D * 0.5;
          expect(pointsInLayer(kind, n, ri, D, delta).min).toBe(enumerate(kind, n, ri, D, delta));
        },
      ),
      { numRuns: 2000 },
    );
  });

  it("answers for a billion points without allocating them, matching k ≤ (N−1)/π·arccos(1 − 2δ/D)", () => {
    const N = 1_000_000_000;
    const delta = Math.sqrt(1e-6);
    const expected = Math.floor(((N - 1) / Math.PI) * Math.acos(1 - 2 * delta)) + 1;
    expect(Math.abs(pointsInLayer("chebyshev", N, 0.5, 1, delta).inner - expected)).toBeLessThanOrEqual(1);
  });
});

describe("every count in the run format has a ceiling", () => {
  it(`refuses radialPoints above ${LIMITS.radialPoints} and maxDegree above ${LIMITS.degree}, naming the field`, () => {
    const ok = runSchema.safeParse(baseRun({ resolution: { radialPoints: LIMITS.radialPoints, radialGrid: "chebyshev", maxDegree: LIMITS.degree } }));
    expect(ok.success).toBe(true);
    for (const [field, value] of [["radialPoints", 1e8], ["radialPoints", LIMITS.radialPoints + 1], ["maxDegree", 1e7], ["maxOrder", 1e9]] as const) {
      const res = runSchema.safeParse(baseRun({ resolution: { [field]: value } }));
      expect(res.success, `${field}=${value}`).toBe(false);
      expect(res.error!.issues[0]!.path).toEqual(["resolution", field]);
    }
  });

  it("publishes the ceilings in the JSON Schema (maximum, maxLength)", () => {
    const schema = JSON.stringify(runJsonSchema());
    expect(schema).toContain(`"maximum":${LIMITS.radialPoints}`);
    expect(schema).toContain(`"maxLength":${LIMITS.shortText}`);
  });

  it("the checker refuses a huge radialPoints as bad input instead of working on it", () => {
    expect(() => check({ runs: [baseRun({ resolution: { radialPoints: 1e8, radialGrid: "chebyshev" } })] })).toThrow();
  });

  it(`refuses series with more than ${LIMITS.seriesColumns} columns in a check`, () => {
    const columns = Object.fromEntries(Array.from({ length: LIMITS.seriesColumns + 1 }, (_, i) => [i === 0 ? "t" : `c${i}`, [0, 1]]));
    const run = baseRun();
    expect(() => check({ runs: [run], series: { [(run as { label: string }).label]: columns } })).toThrow();
  });
});

describe("CSV attachments have row and column ceilings", () => {
  it("refuses a header of a million columns at once, with a message", () => {
    const header = ["t", ...Array.from({ length: 1_000_000 }, (_, i) => `c${i}`)].join(",");
    expect(() => parseCsv(`${header}\n0,1\n`, "series")).toThrow(CsvFormatError);
  });

  it(`refuses more than ${LIMITS.seriesColumns} columns, naming the count`, () => {
    const header = ["t", ...Array.from({ length: LIMITS.seriesColumns }, (_, i) => `c${i}`)].join(",");
    expect(() => parseCsv(`${header}\n`, "series")).toThrow(/at most 32 are allowed/);
  });

  it(`refuses more than ${LIMITS.seriesRows.toLocaleString("en")} rows and says how to fix it`, () => {
    const rows = Array.from({ length: LIMITS.seriesRows + 1 }, (_, i) => `${i},1`).join("\n");
    expect(() => parseCsv(`t,Ek\n${rows}\n`, "series")).toThrow(/more than 200,000 data rows; thin it/);
  });
});
