import { href, Link } from "react-router";
import type { StatedComparison, StoredInterval } from "~/checker/comparisons";
import { sig4, sigFigs } from "~/lib/sig-figs";
import { statedOutcomeLabel } from "~/review/labels";

/** Interval ends keep six figures, so the stated digit is never rounded away (3.0e-5 → [2.95 × 10⁻⁵, 3.05 × 10⁻⁵)). */
const end = (x: number) => sigFigs(x, 6);

/** "[2.95 × 10⁻⁵, 3.05 × 10⁻⁵)", "≥ 1.5", "< 10". */
export function intervalText(iv: StoredInterval): string {
  if (iv.lo === null && iv.hi === null) return "any value";
  if (iv.lo === null) return `${iv.hiInclusive ? "≤" : "<"} ${end(iv.hi!)}`;
  if (iv.hi === null) return `${iv.loInclusive ? "≥" : ">"} ${end(iv.lo)}`;
  return `${iv.loInclusive ? "[" : "("}${end(iv.lo)}, ${end(iv.hi)}${iv.hiInclusive ? "]" : ")"}`;
}

const SOURCE_WORDS: Record<NonNullable<StatedComparison["against"]>["source"], string> = {
  record: "from the record",
  material: "from the material properties",
  series: "series mean; band of standard errors",
  ratio: "ratio of the two runs",
  exponent: "least-squares exponent ± 2 standard errors",
};

function against(c: StatedComparison): string {
  if (!c.against) return c.note ?? "—";
  const a = c.against;
  const band = a.lo !== undefined && a.hi !== undefined ? ` (band [${sig4(a.lo)}, ${sig4(a.hi)}])` : "";
  return `${sig4(a.value)}${band}`;
}

const TONE: Record<StatedComparison["outcome"], string> = {
  agrees: "bg-lichen-wash text-lichen border-lichen",
  differs: "bg-ember-wash text-ember border-ember",
  unverifiable: "bg-amber-wash text-amber border-amber",
  undecided: "bg-amber-wash text-amber border-amber",
};
const MARK: Record<StatedComparison["outcome"], string> = { agrees: "✓", differs: "✗", unverifiable: "?", undecided: "?" };

/**
 * A claim's stated values, each beside the value the check job compared it with and the interval
 * its precision stands for, coloured and worded by outcome. Read from the stored check.
 */
export function StatedTable({ rows, runIds, params }: { rows: StatedComparison[] | null; runIds: Record<string, string>; params: { venueId: string; submissionId: string; round: string } }) {
  return (
    <section className="card" aria-labelledby="stated-h" data-testid="stated-values">
      <h3 id="stated-h" className="text-lead">
        Stated against recomputed
      </h3>
      <p className="text-caption text-basalt-soft">
        Each value as stated, the interval its precision stands for (3e-5 means [2.5 × 10⁻⁵, 3.5 × 10⁻⁵); "≈" at least ±10 %), and the value the checker compared it with, to four
        significant figures. Advisory: the checker's reading, for the reviewers to weigh.
      </p>
      {rows === null ? (
        <p className="mt-2 text-caption" role="status">
          Not checked yet: the comparison appears when the check of this claim is done.
        </p>
      ) : rows.length === 0 ? (
        <p className="mt-2 text-caption">The claim states no values.</p>
      ) : (
        <div className="mt-2 overflow-x-auto">
          <table className="w-full text-left text-caption">
            <thead>
              <tr className="border-b border-rule">
                <th scope="col" className="pr-3">Quantity</th>
                <th scope="col" className="pr-3">Run</th>
                <th scope="col" className="pr-3">Stated → interval used</th>
                <th scope="col" className="pr-3">Recomputed</th>
                <th scope="col">Outcome</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((c, i) => (
                <tr key={i} id={rows.findIndex((r) => r.row === c.row) === i ? `checked-${c.row}` : undefined} className="border-b border-rule align-top" data-testid="stated-check" data-outcome={c.outcome}>
                  <td className="py-1 pr-3 font-mono">{c.quantity}</td>
                  <td className="py-1 pr-3 font-mono">
                    {c.run === null ? "all runs" : runIds[c.run] ? <Link className="underline" to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...params, runId: runIds[c.run]! })}>{c.run}</Link> : c.run}
                  </td>
                  <td className="py-1 pr-3 font-mono">
                    {c.stated} → {intervalText(c.interval)}
                  </td>
                  <td className="py-1 pr-3">
                    <span className="font-mono">{against(c)}</span>
                    {c.against ? <span className="block text-basalt-soft">{SOURCE_WORDS[c.against.source]}</span> : null}
                  </td>
                  <td className="py-1">
                    <span className={`inline-block rounded border px-2 font-semibold ${TONE[c.outcome]}`}>
                      <span aria-hidden="true">{MARK[c.outcome]} </span>
                      {statedOutcomeLabel(c.outcome)}
                    </span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
