import { FlagMeasures } from "~/components/flag-measures";
import { useMemo, useState } from "react";
import { Link, useFetcher } from "react-router";
import { AdvisoryNote } from "~/components/advisory-note";
import type { FlagView } from "~/workspace/view-types";
import { severityLabel } from "~/review/labels";

type Props = {
  flags: FlagView[];
  runLabels: string[];
  claims: { id: string; title: string }[];
  /** Link to the run field a flag concerns (null: no link). */
  runHref?: (label: string, quantities: string[]) => string | null;
  /** Link to the claim (and its row) a flag concerns. */
  claimHref?: (claimId: string, row: number | null) => string;
  /** Where an author's answer is posted; absent for readers who may not answer. */
  answerAction?: (flagId: string) => string;
  /** Filters to start from (e.g. from the URL). */
  initial?: Partial<Record<"severity" | "rule" | "run" | "claim", string>>;
  /** Why the round's last check failed (null/absent: it succeeded); the flags are then out of date. */
  checkError?: string | null;
};

const tone: Record<string, string> = {
  mismatch: "border-ember bg-ember-wash text-ember",
  caution: "border-amber bg-amber-wash text-amber",
  note: "border-fjord bg-fjord-wash text-fjord",
};

function Answer({ flag, action }: { flag: FlagView; action: string }) {
  const fetcher = useFetcher<{ ok?: boolean; error?: { message: string } }>();
  const saved = fetcher.state === "idle" && fetcher.data?.ok;
  return (
    <fetcher.Form method="post" action={action} className="mt-2 flex flex-col gap-1">
      <label htmlFor={`answer-${flag.id}`} className="text-caption font-semibold">
        Your answer to this flag {flag.severity === "mismatch" ? "(needed to send unless you fix it)" : "(optional)"}
      </label>
      <textarea id={`answer-${flag.id}`} name="answer" rows={2} defaultValue={flag.authorAnswer ?? ""} className="field-input" />
      <div className="flex items-center gap-2">
        <button type="submit" className="btn-quiet btn py-0.5" disabled={fetcher.state !== "idle"}>
          Save the answer
        </button>
        <span role="status" className="text-caption">
          {fetcher.state !== "idle" ? "Saving…" : saved ? "Answer saved." : ""}
        </span>
        {fetcher.data?.error ? (
          <span role="alert" className="field-error">
            {fetcher.data.error.message}
          </span>
        ) : null}
      </div>
    </fetcher.Form>
  );
}

/** The checker's flags of a round, filterable by severity, rule, run and claim. Props in, no loaders. */
export function FlagsPanel({ flags, runLabels, claims, runHref, claimHref, answerAction, initial = {}, checkError }: Props) {
  const [filter, setFilter] = useState({ severity: initial.severity ?? "", rule: initial.rule ?? "", run: initial.run ?? "", claim: initial.claim ?? "" });
  const rulesSeen = useMemo(() => [...new Set(flags.map((f) => f.rule))].sort(), [flags]);
  const shown = flags.filter(
    (f) =>
      (!filter.severity || f.severity === filter.severity) &&
      (!filter.rule || f.rule === filter.rule) &&
      (!filter.run || f.runLabel === filter.run) &&
      (!filter.claim || f.claimId === filter.claim),
  );
  const select = (key: keyof typeof filter, label: string, options: { value: string; label: string }[]) => (
    <label className="flex flex-col text-caption">
      <span className="font-semibold">{label}</span>
      <select className="field-input py-0.5" value={filter[key]} onChange={(e) => setFilter({ ...filter, [key]: e.target.value })} name={`filter-${key}`}>
        <option value="">all</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <section aria-labelledby="flags-h" data-testid="flags-panel">
      <h3 id="flags-h" className="text-lead">
        Flags{checkError ? " (out of date)" : ""} <span className="text-caption text-basalt-soft">({shown.length} of {flags.length} shown)</span>
      </h3>
      {checkError ? (
        <div role="alert" className="mt-2 rounded border border-ember bg-ember-wash p-3 text-ember" data-testid="check-failed">
          <p className="font-semibold">Checking failed: the flags below are from the last successful check, not from what is stored now.</p>
          <p className="mt-1">{checkError}</p>
        </div>
      ) : null}
      <AdvisoryNote className="mt-2" />
      <div className="mt-3 flex flex-wrap gap-3" role="group" aria-label="Filter the flags">
        {select("severity", "Severity", ["mismatch", "caution", "note"].map((s) => ({ value: s, label: severityLabel(s) })))}
        {select("rule", "Rule", rulesSeen.map((r) => ({ value: r, label: r })))}
        {select("run", "Run", runLabels.map((r) => ({ value: r, label: r })))}
        {select("claim", "Claim", claims.map((c) => ({ value: c.id, label: c.title })))}
      </div>
      {shown.length === 0 ? (
        <p className="mt-3 text-caption text-basalt-soft">{flags.length ? "No flag matches these filters." : checkError ? "The last successful check found nothing to flag." : "The checker found nothing to flag."}</p>
      ) : (
        <ul className="mt-3 flex flex-col gap-3">
          {shown.map((f) => {
            const runLink = f.runLabel && runHref ? runHref(f.runLabel, f.quantities) : null;
            return (
              <li key={f.id} className="card" data-testid="flag" data-rule={f.rule} data-severity={f.severity} data-flag-id={f.id}>
                <div className="flex flex-wrap items-baseline gap-2">
                  <span className={`rounded border px-1.5 text-caption font-semibold ${tone[f.severity]}`}>{severityLabel(f.severity)}</span>
                  <span className="font-semibold">{f.ruleTitle}</span>
                  <code className="text-caption text-basalt-soft">{f.rule}</code>
                  {f.runLabel ? (
                    runLink ? (
                      <Link to={runLink} className="text-caption">
                        run {f.runLabel}
                      </Link>
                    ) : (
                      <span className="text-caption">run {f.runLabel}</span>
                    )
                  ) : null}
                  {f.claimId && claimHref ? (
                    <Link to={claimHref(f.claimId, f.claimRow)} className="text-caption">
                      {f.claimTitle}
                      {f.claimRow !== null ? `, stated value ${f.claimRow + 1}` : ""}
                    </Link>
                  ) : null}
                </div>
                <p className="mt-1">{f.message}</p>
                <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 text-caption">
                  <FlagMeasures flag={f} lowercase />
                  <dt className="font-semibold">rule</dt>
                  <dd>{f.explanation}</dd>
                  <dt className="font-semibold">source</dt>
                  <dd>{f.source}</dd>
                </dl>
                {answerAction ? (
                  f.severity === "mismatch" || f.authorAnswer ? (
                    <Answer flag={f} action={answerAction(f.id)} />
                  ) : (
                    <details className="mt-2">
                      <summary className="cursor-pointer text-caption">Answer this flag (optional)</summary>
                      <Answer flag={f} action={answerAction(f.id)} />
                    </details>
                  )
                ) : f.authorAnswer ? (
                  <p className="mt-2 border-l-2 border-lichen pl-2 text-caption">
                    <span className="font-semibold">Authors' answer:</span> {f.authorAnswer}
                  </p>
                ) : null}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
