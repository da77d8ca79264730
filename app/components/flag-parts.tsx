import { Fragment, type ReactNode } from "react";
import type { FlagCounts } from "~/review/flag-table";
import { severityLabel } from "~/review/labels";

/** Pieces both flag views share: the authors' panel and the reviewers' and editor's table. */

const tone: Record<string, string> = {
  mismatch: "border-ember bg-ember-wash text-ember",
  caution: "border-amber bg-amber-wash text-amber",
  note: "border-fjord bg-fjord-wash text-fjord",
};

/** A flag's severity in words, in its colour. */
export function SeverityBadge({ severity, children }: { severity: string; children?: ReactNode }) {
  return <span className={`inline-block rounded border px-1.5 text-caption font-semibold ${tone[severity] ?? ""}`}>{children ?? severityLabel(severity)}</span>;
}

/** "· 12 flags: 3 mismatch, 9 caution, 0 note" after a group's name. */
export function FlagGroupCounts({ total, counts }: { total: number; counts: FlagCounts }) {
  return (
    <span className="text-caption font-normal" data-testid="flag-group-counts">
      · {total} {total === 1 ? "flag" : "flags"}: {counts.mismatch} {severityLabel("mismatch").toLowerCase()}, {counts.caution} {severityLabel("caution").toLowerCase()},{" "}
      {counts.note} {severityLabel("note").toLowerCase()}
    </span>
  );
}

/** What a flag compared, as term–definition pairs inside a flag's `<dl>`; absent values are left out. */
export function FlagMeasures({ flag }: { flag: { expected: ReactNode | null; found: ReactNode | null; tolerance: ReactNode | null } }) {
  const rows: [string, ReactNode | null][] = [
    ["Expected", flag.expected],
    ["Found", flag.found],
    ["Tolerance", flag.tolerance],
  ];
  return (
    <>
      {rows.map(([term, value]) =>
        value !== null ? (
          <Fragment key={term}>
            <dt className="font-semibold">{term}</dt>
            <dd>{value}</dd>
          </Fragment>
        ) : null,
      )}
    </>
  );
}

/**
 * What stands behind a flag, as one definition list: what it compared, the claim, what the rule
 * checks, the source and the authors' answer; anything absent is left out.
 */
export function FlagFacts({
  flag,
  claim,
  explanation,
  source,
  answer,
}: {
  flag: { expected: string | null; found: string | null; tolerance: string | null };
  claim?: ReactNode;
  explanation?: string | null;
  source?: string | null;
  answer?: string | null;
}) {
  return (
    <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 text-caption">
      <FlagMeasures flag={flag} />
      {claim ? (
        <>
          <dt className="font-semibold">Claim</dt>
          <dd>{claim}</dd>
        </>
      ) : null}
      {explanation ? (
        <>
          <dt className="font-semibold">What the rule checks</dt>
          <dd>{explanation}</dd>
        </>
      ) : null}
      {source ? (
        <>
          <dt className="font-semibold">Source</dt>
          <dd>{source}</dd>
        </>
      ) : null}
      {answer ? (
        <>
          <dt className="font-semibold">Authors' answer</dt>
          <dd>{answer}</dd>
        </>
      ) : null}
    </dl>
  );
}
