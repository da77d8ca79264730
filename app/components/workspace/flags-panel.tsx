import { useEffect, useId, useState } from "react";
import { href, Link, useFetcher, useLocation, useNavigation, useSearchParams } from "react-router";
import { AdvisoryNote } from "~/components/advisory-note";
import { FlagFacts, FlagGroupCounts, SeverityBadge } from "~/components/flag-parts";
import { groupKeyOf, parseFlagQuery, withFlagQuery, type FlagGroupSummary, type FlagGrouping, type FlagQuery } from "~/review/flag-table";
import { severityLabel } from "~/review/labels";
import { PANEL_ROWS_STEP, panelRowsParams, type FlagPanelView, type PanelFlag, type PanelRows } from "~/workspace/flag-panel-shape";

type Links = {
  /** Link to the run (and the field) a flag concerns (null: no link). */
  runHref?: (label: string, field: string | null) => string | null;
  /** Link to the claim (and its stated value) a flag concerns. */
  claimHref?: (claimId: string, row: number | null) => string;
  /** Where an author's answer is posted; absent for readers who may not answer. */
  answerAction?: (flagId: string) => string;
};

type Props = Links & {
  view: FlagPanelView;
  /** The round's flag rows route, where a closed group's rows are read when it is opened. */
  rowsHref: string;
  /** Why the round's last check failed (null/absent: it succeeded); the flags are then out of date. */
  checkError?: string | null;
};

const GROUPING_LABEL: Record<FlagGrouping, string> = { rule: "Rule", claim: "Claim", run: "Run" };
const SEVERITIES = ["mismatch", "caution", "note"] as const;

function Answer({ flag, action }: { flag: PanelFlag; action: string }) {
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

function FlagCard({ flag: f, view, links }: { flag: PanelFlag; view: FlagPanelView; links: Links }) {
  const rule = view.rules[f.rule];
  const byRule = view.query.group === "rule";
  const runLink = f.runLabel && links.runHref ? links.runHref(f.runLabel, f.field) : null;
  const claimName = f.claimId ? `${view.claims[f.claimId] ?? "claim"}${f.claimRow !== null ? `, stated value ${f.claimRow + 1}` : ""}` : null;
  return (
    <li className="card" data-testid="flag" data-rule={f.rule} data-severity={f.severity} data-flag-id={f.id}>
      <div className="flex flex-wrap items-baseline gap-x-2 gap-y-1">
        <SeverityBadge severity={f.severity} />
        {byRule ? null : <span className="font-semibold">{rule?.title ?? f.rule}</span>}
        {f.runLabel ? (
          runLink ? (
            <Link to={runLink} className="text-caption">
              run {f.runLabel}
            </Link>
          ) : (
            <span className="text-caption">run {f.runLabel}</span>
          )
        ) : null}
        {f.claimId && claimName ? (
          links.claimHref ? (
            <Link to={links.claimHref(f.claimId, f.claimRow)} className="text-caption">
              {claimName}
            </Link>
          ) : (
            <span className="text-caption">{claimName}</span>
          )
        ) : null}
      </div>
      <p className="mt-1">{f.message}</p>
      <FlagFacts
        flag={f}
        explanation={byRule ? null : rule?.explanation}
        source={f.source ?? (byRule ? null : rule?.source)}
        answer={links.answerAction ? null : f.authorAnswer}
      />
      {links.answerAction ? (
        f.severity === "mismatch" || f.authorAnswer ? (
          <Answer flag={f} action={links.answerAction(f.id)} />
        ) : (
          <details className="mt-2">
            <summary className="cursor-pointer text-caption">Answer this flag (optional)</summary>
            <Answer flag={f} action={links.answerAction(f.id)} />
          </details>
        )
      ) : null}
    </li>
  );
}

/**
 * One group: its name and counts always; its flags once opened. With few flags in the view they
 * came with the page and the group starts open; otherwise they are read when it is opened, a step
 * at a time.
 */
function FlagGroup({ group, view, rowsHref, links }: { group: FlagGroupSummary; view: FlagPanelView; rowsHref: string; links: Links }) {
  const id = useId();
  const fetcher = useFetcher<PanelRows>();
  const [toggled, setToggled] = useState<boolean | null>(null);
  const [limit, setLimit] = useState(PANEL_ROWS_STEP);
  const withPage = view.rows?.filter((r) => groupKeyOf(r, view.query.group) === group.key) ?? null;
  const open = toggled ?? withPage !== null;
  const load = (n: number) => fetcher.load(`${rowsHref}?${panelRowsParams(view, group.key, n)}`);
  const rows = withPage ?? fetcher.data?.rows ?? [];
  const total = withPage ? withPage.length : (fetcher.data?.total ?? group.total);
  const busy = fetcher.state !== "idle";
  const rule = view.query.group === "rule" ? view.rules[group.key] : undefined;
  return (
    <li data-testid="flag-group" data-group={group.label} className="border-t border-rule pt-2">
      <h4>
        <button
          type="button"
          className="w-full text-left"
          aria-expanded={open}
          aria-controls={open ? id : undefined}
          onClick={() => {
            if (!open && !withPage && !fetcher.data) load(limit);
            setToggled(!open);
          }}
        >
          <span aria-hidden="true">{open ? "▾" : "▸"} </span>
          <span className="font-semibold">{group.label}</span> <FlagGroupCounts total={group.total} counts={group.counts} />
        </button>
      </h4>
      {open ? (
        <div id={id} className="mt-2 flex flex-col gap-3 pb-2" aria-busy={busy}>
          {rule ? (
            <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-caption" data-testid="flag-group-rule">
              <dt className="font-semibold">Rule</dt>
              <dd>
                <a className="font-mono" href={`${href("/help/checks")}#${group.key}`}>
                  {group.key}
                </a>
              </dd>
              {rule.explanation ? (
                <>
                  <dt className="font-semibold">What it checks</dt>
                  <dd>{rule.explanation}</dd>
                </>
              ) : null}
              {rule.source ? (
                <>
                  <dt className="font-semibold">Source</dt>
                  <dd>{rule.source}</dd>
                </>
              ) : null}
            </dl>
          ) : null}
          {rows.length ? (
            <ul className="flex flex-col gap-3">
              {rows.map((f) => (
                <FlagCard key={f.id} flag={f} view={view} links={links} />
              ))}
            </ul>
          ) : busy ? (
            <p role="status" className="text-caption text-basalt-soft">
              Reading the flags…
            </p>
          ) : fetcher.data ? (
            <p className="text-caption text-basalt-soft">These flags are gone: the round was checked again. The counts above update with the page.</p>
          ) : null}
          {rows.length < total ? (
            <button
              type="button"
              className="btn-quiet self-start py-0.5 text-caption"
              disabled={busy}
              onClick={() => {
                setLimit(limit + PANEL_ROWS_STEP);
                load(limit + PANEL_ROWS_STEP);
              }}
            >
              {busy ? "Reading…" : `Show ${Math.min(PANEL_ROWS_STEP, total - rows.length)} more of ${total - rows.length}`}
            </button>
          ) : null}
        </div>
      ) : null}
    </li>
  );
}

/**
 * The checker's flags of a round (or of one run or claim) for its authors: counts by severity, the
 * flags grouped by rule, claim or run with counts per group, filters by severity and rule family in
 * the address. With many flags the groups start closed and a group's flags are read when opened, so
 * the page stays small whatever the round holds.
 */
export function FlagsPanel({ view, rowsHref, checkError, ...links }: Props) {
  const [params, setParams] = useSearchParams();
  const navigation = useNavigation();
  const location = useLocation();
  // The controls show a choice at once; the address (and the groups below) follow once the page's
  // data is back, since the counts come from the server.
  const [asked, setAsked] = useState<Partial<FlagQuery>>({});
  useEffect(() => setAsked({}), [location.search]);
  const query = { ...parseFlagQuery(params, view.groupings), ...asked };
  const setQuery = (q: Partial<FlagQuery>) => {
    setAsked((a) => ({ ...a, ...q }));
    void setParams(
      (prev) => {
        const now = typeof window === "undefined" ? prev : new URLSearchParams(window.location.search);
        return withFlagQuery(now, { ...parseFlagQuery(now, view.groupings), verdict: "", ...q }, view.groupings[0]);
      },
      { replace: true, preventScrollReset: true },
    );
  };
  const select = (key: "severity" | "family", label: string, options: { value: string; label: string }[]) => (
    <label className="flex flex-col text-caption">
      <span className="font-semibold">{label}</span>
      <select className="field-input py-0.5" value={query[key]} onChange={(e) => setQuery({ [key]: e.target.value })} name={`flags-${key}`}>
        <option value="">All</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </label>
  );
  // A new grouping or filter reloads the page's data (the counts come from the server).
  const loading = navigation.state === "loading" && navigation.location.pathname === location.pathname;
  return (
    <section aria-labelledby="flags-h" data-testid="flags-panel" aria-busy={loading}>
      <h3 id="flags-h" className="text-lead">
        Flags{checkError ? " (out of date)" : ""}{" "}
        <span className="text-caption text-basalt-soft" data-testid="flags-shown">
          ({view.shown} of {view.total} shown)
        </span>
      </h3>
      {checkError ? (
        <div role="alert" className="mt-2 rounded border border-ember bg-ember-wash p-3 text-ember" data-testid="check-failed">
          <p className="font-semibold">Checking failed: the flags below are from the last successful check, not from what is stored now.</p>
          <p className="mt-1">{checkError}</p>
        </div>
      ) : null}
      <AdvisoryNote className="mt-2" />
      {view.total ? (
        <>
          <p className="mt-3 flex flex-wrap items-baseline gap-x-3 gap-y-1" data-testid="flags-summary">
            {SEVERITIES.map((s) => (
              <SeverityBadge key={s} severity={s}>
                {view.bySeverity[s]} {severityLabel(s).toLowerCase()}
              </SeverityBadge>
            ))}
            {view.bySeverity.mismatch ? (
              <span className="text-caption" data-testid="flags-unanswered">
                {view.unanswered === 0
                  ? "Every mismatch flag has an answer from the authors."
                  : `${view.unanswered} of ${view.bySeverity.mismatch} mismatch flags without an answer from the authors.`}
              </span>
            ) : null}
          </p>
          <div className="mt-3 flex flex-wrap items-end gap-3" role="group" aria-label="Group and filter the flags">
            {view.groupings.length > 1 ? (
              <fieldset className="flex flex-col text-caption">
                <legend className="font-semibold">Group by</legend>
                <div className="flex gap-3 py-0.5">
                  {view.groupings.map((g) => (
                    <label key={g} className="flex items-center gap-1">
                      <input type="radio" name="flags-group" value={g} checked={query.group === g} onChange={() => setQuery({ group: g })} /> {GROUPING_LABEL[g]}
                    </label>
                  ))}
                </div>
              </fieldset>
            ) : null}
            {select("severity", "Severity", SEVERITIES.map((s) => ({ value: s, label: `${severityLabel(s)} (${view.bySeverity[s]})` })))}
            {select("family", "Rule family", view.families.map((f) => ({ value: f.id, label: `${f.id}. ${f.title} (${f.n})` })))}
          </div>
        </>
      ) : null}
      {view.shown === 0 ? (
        <p className="mt-3 text-caption text-basalt-soft">{view.total ? "No flag matches these filters." : checkError ? "The last successful check found nothing to flag." : "The checker found nothing to flag."}</p>
      ) : (
        <>
          {view.rows === null ? (
            <p className="mt-3 text-caption text-basalt-soft" data-testid="flags-closed-note">
              {view.shown} flags in {view.groups.length} groups: open a group to read its flags.
            </p>
          ) : null}
          <ul className="mt-3 flex flex-col gap-2" data-testid="flag-groups">
            {view.groups.map((g) => (
              <FlagGroup key={`${view.query.group}|${view.query.severity}|${view.query.family}|${g.key}`} group={g} view={view} rowsHref={rowsHref} links={links} />
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
