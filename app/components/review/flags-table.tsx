import { FlagFacts, FlagGroupCounts, SeverityBadge } from "~/components/flag-parts";
import { memo, useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from "react";
import { href, Link, useFetcher, useSearchParams, useSubmit } from "react-router";
import { AdvisoryNote } from "~/components/advisory-note";
import { filterFlags, groupFlags, parseFlagQuery, withFlagQuery, type FlagQuery } from "~/review/flag-table";
import { severityLabel, verdictLabel } from "~/review/labels";
import { expandFlagTable, type FlagTableData } from "~/workspace/flag-table-shape";
import type { FlagView } from "~/workspace/view-types";

/** A verdict as stored: the reviewer's choice and, for a dispute or a question, the reason. */
export type SavedVerdict = { verdict: string; reason: string | null };
export type ReviewerVerdicts = Record<string, SavedVerdict>;
/** The editor's view: every submitted report's verdict per flag, with who gave it. */
export type EditorVerdicts = Record<string, { reviewer: string; verdict: string; reason: string | null }[]>;

type Mode =
  | { kind: "reviewer"; verdicts: ReviewerVerdicts; locked: boolean; renderRemark?: (flag: FlagView, close: () => void) => ReactNode }
  | { kind: "editor"; verdicts: EditorVerdicts };

/** Rows rendered per open group before "Show more": a page of hundreds of flags stays quick. */
const ROWS_PER_STEP = 100;
/** Up to this many flags every group starts open; above it, only the first. */
const OPEN_ALL_UP_TO = 150;

type Item = { type: "group"; key: string } | { type: "row"; id: string; group: string } | { type: "more"; group: string };
const itemKey = (i: Item) => (i.type === "group" ? `g:${i.key}` : i.type === "row" ? `f:${i.id}` : `m:${i.group}`);
const domId = (key: string) => (key.startsWith("f:") ? `flag-${key.slice(2)}` : key.startsWith("g:") ? `flag-group-${key.slice(2) || "none"}` : `flag-more-${key.slice(2) || "none"}`);

/** True when typing: keys then belong to the field, never to the table. */
function isTyping(target: EventTarget | null) {
  const el = target as HTMLElement | null;
  return !!el?.closest?.("input, textarea, select, [contenteditable='true'], [role='textbox']");
}

/** The event the remarks side list sends to bring a flag into view (its group may be closed). */
export const REVEAL_FLAG_EVENT = "runproof:reveal-flag";

const VERDICT_CHOICES = [
  { value: "agree", label: "Agree", key: "a" },
  { value: "dispute", label: "Dispute", key: "d" },
  { value: "ask-authors", label: "Ask", key: "" },
] as const;

type RowProps = {
  flag: FlagView;
  focused: boolean;
  expanded: boolean;
  reasonFor: string | null;
  mode: Mode;
  saved: SavedVerdict | undefined;
  remarkOpen: boolean;
  runHref?: (label: string) => string;
  onFocusRow: (id: string) => void;
  onToggle: (id: string) => void;
  onChoose: (id: string, verdict: string) => void;
  onSubmitReason: (id: string, verdict: string, reason: string) => void;
  onCancelReason: (id: string) => void;
  onSaved: (id: string, v: SavedVerdict) => void;
  onRemark: (id: string | null) => void;
};

const COLS = 6;

const FlagRow = memo(function FlagRow(p: RowProps) {
  const { flag: f, mode } = p;
  const fetcher = useFetcher<{ ok: boolean; error?: string; verdict?: SavedVerdict & { flagId: string } }>({ key: `verdict-${f.id}` });
  const pendingVerdict = fetcher.formData?.get("verdict");
  const pendingReason = fetcher.formData?.get("reason");
  const current: SavedVerdict | undefined = typeof pendingVerdict === "string" ? { verdict: pendingVerdict, reason: typeof pendingReason === "string" ? pendingReason : null } : p.saved;
  const failed = fetcher.state === "idle" && fetcher.data && !fetcher.data.ok ? fetcher.data.error : null;
  const { onSaved } = p;
  useEffect(() => {
    if (fetcher.state === "idle" && fetcher.data?.ok && fetcher.data.verdict) onSaved(f.id, fetcher.data.verdict);
  }, [fetcher.state, fetcher.data, f.id, onSaved]);
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  useEffect(() => {
    if (p.reasonFor) reasonRef.current?.focus();
  }, [p.reasonFor]);
  const locked = mode.kind === "reviewer" ? mode.locked : true;
  const editorVerdicts = mode.kind === "editor" ? (mode.verdicts[f.id] ?? []) : [];
  const runLink = f.runLabel && p.runHref ? p.runHref(f.runLabel) : null;
  return (
    <>
      <tr
        id={`flag-${f.id}`}
        data-testid="flag-row"
        data-flag-id={f.id}
        data-rule={f.rule}
        data-severity={f.severity}
        tabIndex={p.focused ? 0 : -1}
        aria-selected={p.focused}
        onFocus={(e) => e.target === e.currentTarget && p.onFocusRow(f.id)}
        onClick={(e) => {
          if (!(e.target as HTMLElement).closest("a, button, input, textarea, select")) p.onFocusRow(f.id);
        }}
        className={`border-b border-rule align-top ${p.focused ? "bg-lichen-wash outline outline-2 outline-fjord" : ""}`}
      >
        <td className="py-1 pr-2">
          <SeverityBadge severity={f.severity} />
        </td>
        <td className="py-1 pr-2 text-caption whitespace-nowrap">
          <a className="font-mono underline" href={`${href("/help/checks")}#${f.rule}`} title={f.ruleTitle}>
            {f.rule}
          </a>
        </td>
        <td className="py-1 pr-2 text-caption whitespace-nowrap">{f.runLabel ? runLink ? <Link to={runLink}>{f.runLabel}</Link> : f.runLabel : <span className="text-basalt-soft">—</span>}</td>
        <td className="py-1 pr-2">
          <button type="button" className="text-left" aria-expanded={p.expanded} aria-controls={`flag-detail-${f.id}`} onClick={() => p.onToggle(f.id)}>
            <span className="line-clamp-2 text-caption" data-testid="flag-message">{f.message}</span>
          </button>
        </td>
        <td className="py-1 pr-2 text-caption">
          {mode.kind === "reviewer" ? (
            <div className="flex gap-1" role="group" aria-label={`Your verdict on ${f.rule}${f.runLabel ? ` for run ${f.runLabel}` : ""}`}>
              {VERDICT_CHOICES.map((c) => (
                <button
                  key={c.value}
                  type="button"
                  disabled={locked}
                  aria-pressed={current?.verdict === c.value}
                  title={c.value === "ask-authors" ? "Ask the authors" : undefined}
                  className={`whitespace-nowrap rounded px-1.5 py-0.5 ${current?.verdict === c.value ? "bg-lichen text-vellum" : "bg-vellum-deep"}`}
                  onClick={() => p.onChoose(f.id, c.value)}
                >
                  {c.label}
                </button>
              ))}
            </div>
          ) : editorVerdicts.length ? (
            <ul data-testid="flag-verdicts">
              {editorVerdicts.map((v) => (
                <li key={v.reviewer}>
                  {v.reviewer}: {verdictLabel(v.verdict).toLowerCase()}
                </li>
              ))}
            </ul>
          ) : (
            <span className="text-basalt-soft">no verdict yet</span>
          )}
          {failed ? (
            <p role="alert" className="text-ember">
              {failed}
            </p>
          ) : null}
        </td>
        <td className="py-1 text-caption">
          {mode.kind === "reviewer" && mode.renderRemark && !locked ? (
            <button type="button" className="underline" aria-expanded={p.remarkOpen} onClick={() => p.onRemark(p.remarkOpen ? null : f.id)}>
              Remark
            </button>
          ) : null}
        </td>
      </tr>
      {p.expanded || p.reasonFor ? (
        <tr id={`flag-detail-${f.id}`} className="border-b border-rule bg-vellum" data-testid="flag-detail">
          <td colSpan={COLS} className="px-2 py-2">
            <p>{f.message}</p>
            <p className="mt-1 font-semibold">{f.ruleTitle}</p>
            <FlagFacts
              flag={f}
              claim={f.claimTitle ? `${f.claimTitle}${f.claimRow !== null ? `, stated value ${f.claimRow + 1}` : ""}` : null}
              explanation={f.explanation}
              source={f.source}
              answer={f.authorAnswer}
            />
            {mode.kind === "editor" && editorVerdicts.length ? (
              <ul className="mt-2 text-caption" aria-label="Reviewers' verdicts">
                {editorVerdicts.map((v) => (
                  <li key={v.reviewer}>
                    <strong>{v.reviewer}</strong>: {verdictLabel(v.verdict).toLowerCase()}
                    {v.reason ? ` — ${v.reason}` : ""}
                  </li>
                ))}
              </ul>
            ) : null}
            {mode.kind === "reviewer" && current?.reason && !p.reasonFor ? (
              <p className="mt-2 text-caption">
                <strong>Your reason:</strong> {current.reason}
              </p>
            ) : null}
            {mode.kind === "reviewer" && p.reasonFor && !locked ? (
              <form
                className="mt-2 flex flex-col gap-1"
                data-testid="verdict-reason-form"
                onSubmit={(e) => {
                  e.preventDefault();
                  p.onSubmitReason(f.id, p.reasonFor!, reasonRef.current?.value ?? "");
                }}
              >
                <label htmlFor={`reason-${f.id}`} className="text-caption font-semibold">
                  {p.reasonFor === "dispute" ? "Why do you dispute this flag? (the authors read this)" : "Your question for the authors"}
                </label>
                <textarea
                  ref={reasonRef}
                  id={`reason-${f.id}`}
                  name="reason"
                  rows={2}
                  maxLength={2000}
                  required
                  defaultValue={current?.verdict === p.reasonFor ? (current.reason ?? "") : ""}
                  className="field-input"
                  onKeyDown={(e) => {
                    if (e.key === "Escape") {
                      e.preventDefault();
                      p.onCancelReason(f.id);
                    }
                  }}
                />
                <div className="flex gap-2">
                  <button type="submit" className="btn py-0.5">
                    {p.reasonFor === "dispute" ? "Save the dispute" : "Save the question"}
                  </button>
                  <button type="button" className="btn-quiet py-0.5" onClick={() => p.onCancelReason(f.id)}>
                    Cancel
                  </button>
                </div>
              </form>
            ) : null}
          </td>
        </tr>
      ) : null}
      {p.remarkOpen && mode.kind === "reviewer" && mode.renderRemark ? (
        <tr className="border-b border-rule bg-white" data-testid="flag-remark">
          <td colSpan={COLS} className="px-2 py-2">
            {mode.renderRemark(f, () => p.onRemark(null))}
          </td>
        </tr>
      ) : null}
    </>
  );
});

/**
 * The round's flags for reading hundreds: a compact table grouped by claim or by run, filters and
 * grouping in the URL, counts per group, a row expanding to the numbers behind it, and keys —
 * j/k move, a agrees, d disputes (asks for the reason), x or Enter expands.
 */
export function FlagsTable({ rowsHref, total, mode, runHref, title = "Flags" }: { rowsHref: string; total: number; mode: Mode; runHref?: (label: string) => string; title?: string }) {
  const read = useFlagTableRows(rowsHref);
  if (read.state !== "done")
    return (
      <section aria-labelledby="flags-table-h" data-testid="flags-table">
        <h2 id="flags-table-h" className="text-lead">
          {title}{" "}
          <span className="text-caption font-normal text-basalt-soft" data-testid="flags-shown">
            ({total} in this round)
          </span>
        </h2>
        <AdvisoryNote className="mt-2" />
        {read.state === "failed" ? (
          <p role="alert" className="mt-3 field-error">
            The flags could not be read ({read.error}).{" "}
            <button type="button" className="underline" onClick={read.retry}>
              Try again
            </button>
          </p>
        ) : (
          <p role="status" className="mt-3 text-caption text-basalt-soft">
            {total ? `Reading the round's ${total} ${total === 1 ? "flag" : "flags"}…` : "Reading the round's flags…"}
          </p>
        )}
      </section>
    );
  return <FlagsGrid flags={read.flags} mode={mode} runHref={runHref} title={title} />;
}

type RowsRead = { state: "reading" } | { state: "failed"; error: string; retry: () => void } | { state: "done"; flags: FlagView[] };

/**
 * The round's flags from the table's rows route, read once the page is on screen. A plain fetch, not
 * a fetcher: fetchers' loads are read again after every action (each verdict), while a round's
 * flags change only when its check lands; the browser revalidates with the route's entity tag.
 */
function useFlagTableRows(rowsHref: string): RowsRead {
  const [attempt, setAttempt] = useState(0);
  const [read, setRead] = useState<RowsRead>({ state: "reading" });
  useEffect(() => {
    const abort = new AbortController();
    setRead({ state: "reading" });
    fetch(rowsHref, { signal: abort.signal, headers: { accept: "application/json" } })
      .then(async (res) => {
        if (!res.ok) throw new Error(res.status === 404 ? "the round is no longer open to you" : `the server answered ${res.status}`);
        const flags = expandFlagTable((await res.json()) as FlagTableData);
        if (!abort.signal.aborted) setRead({ state: "done", flags });
      })
      .catch((e: unknown) => {
        if (abort.signal.aborted) return;
        setRead({ state: "failed", error: e instanceof Error && !(e instanceof SyntaxError) ? e.message : "the answer could not be read", retry: () => setAttempt((n) => n + 1) });
      });
    return () => abort.abort();
  }, [rowsHref, attempt]);
  return read;
}

function FlagsGrid({ flags, mode, runHref, title }: { flags: FlagView[]; mode: Mode; runHref?: (label: string) => string; title: string }) {
  const [params, setParams] = useSearchParams();
  const query = parseFlagQuery(params);
  // From the address as it is now: two quick changes (grouping, then a filter) must not undo each other,
  // and the `prev` React Router passes is the one of the last render.
  const setQuery = (q: Partial<FlagQuery>) =>
    setParams(
      (prev) => {
        const now = typeof window === "undefined" ? prev : new URLSearchParams(window.location.search);
        return withFlagQuery(now, { ...parseFlagQuery(now), ...q });
      },
      { replace: true, preventScrollReset: true },
    );

  // Verdicts saved in this visit (the page does not reload its data after each verdict).
  const [savedHere, setSavedHere] = useState<ReviewerVerdicts>({});
  const onSaved = useCallback((id: string, v: SavedVerdict) => setSavedHere((s) => (s[id]?.verdict === v.verdict && s[id]?.reason === v.reason ? s : { ...s, [id]: v })), []);
  const savedOf = useCallback((id: string) => (mode.kind === "reviewer" ? (savedHere[id] ?? mode.verdicts[id]) : undefined), [mode, savedHere]);
  const verdictsOf = (id: string): string[] => (mode.kind === "reviewer" ? [savedOf(id)?.verdict].filter((v): v is string => !!v) : (mode.verdicts[id] ?? []).map((v) => v.verdict));

  const shown = filterFlags(flags, query, verdictsOf);
  const groups = useMemo(() => groupFlags(shown, query.group), [shown.length, query.group, flags]); // eslint-disable-line react-hooks/exhaustive-deps
  const families = useMemo(() => [...new Map(flags.map((f) => [f.family, f.familyTitle])).entries()].sort(([a], [b]) => a.localeCompare(b)), [flags]);

  const [open, setOpen] = useState<Record<string, boolean>>({});
  const isOpen = (key: string, index: number) => open[`${query.group}:${key}`] ?? (flags.length <= OPEN_ALL_UP_TO || index === 0);
  const [limit, setLimit] = useState<Record<string, number>>({});
  const limitOf = (key: string) => limit[`${query.group}:${key}`] ?? ROWS_PER_STEP;
  const [expanded, setExpanded] = useState<Record<string, boolean>>({});
  const [reasonFor, setReasonFor] = useState<{ id: string; verdict: string } | null>(null);
  const [remarkFor, setRemarkFor] = useState<string | null>(null);
  const [focus, setFocus] = useState<string | null>(null);
  const containerRef = useRef<HTMLDivElement>(null);
  // The keys work once the page has hydrated; the attribute lets tests (and styles) know.
  const [ready, setReady] = useState(false);
  useEffect(() => setReady(true), []);
  // Bumped with every focus change made by keys, so the effect below moves the browser's focus
  // in the same commit as the new `focus` (a ref flag could be consumed by an unrelated render).
  const [focusRequest, setFocusRequest] = useState(0);
  const requestFocus = useCallback(() => setFocusRequest((n) => n + 1), []);

  const items: Item[] = [];
  groups.forEach((g, i) => {
    items.push({ type: "group", key: g.key });
    if (!isOpen(g.key, i)) return;
    for (const f of g.flags.slice(0, limitOf(g.key))) items.push({ type: "row", id: f.id, group: g.key });
    if (g.flags.length > limitOf(g.key)) items.push({ type: "more", group: g.key });
  });

  const submit = useSubmit();
  const sendVerdict = useCallback(
    (id: string, verdict: string, reason: string) => {
      const form = new FormData();
      form.set("intent", "verdict");
      form.set("flagId", id);
      form.set("verdict", verdict);
      if (reason) form.set("reason", reason);
      void submit(form, { method: "post", navigate: false, fetcherKey: `verdict-${id}`, preventScrollReset: true });
    },
    [submit],
  );
  const onChoose = useCallback(
    (id: string, verdict: string) => {
      if (verdict === "agree") {
        setReasonFor((r) => (r?.id === id ? null : r));
        sendVerdict(id, "agree", "");
      } else {
        setReasonFor({ id, verdict });
        setFocus(`f:${id}`);
      }
    },
    [sendVerdict],
  );
  const onSubmitReason = useCallback(
    (id: string, verdict: string, reason: string) => {
      sendVerdict(id, verdict, reason);
      setReasonFor(null);
      setFocus(`f:${id}`);
      requestFocus();
    },
    [sendVerdict, requestFocus],
  );
  const onCancelReason = useCallback((id: string) => {
    setReasonFor(null);
    setFocus(`f:${id}`);
    requestFocus();
  }, [requestFocus]);
  const onToggle = useCallback((id: string) => setExpanded((e) => ({ ...e, [id]: !e[id] })), []);
  const onFocusRow = useCallback((id: string) => setFocus(`f:${id}`), []);
  const toggleGroup = (key: string, index: number) => setOpen((o) => ({ ...o, [`${query.group}:${key}`]: !isOpen(key, index) }));
  const showMore = (key: string) => setLimit((l) => ({ ...l, [`${query.group}:${key}`]: limitOf(key) + ROWS_PER_STEP }));

  // Move the browser's focus to the focused item after j/k (never while the person types).
  useEffect(() => {
    if (!focusRequest || !focus) return;
    const el = document.getElementById(domId(focus));
    const target = el?.tagName === "TR" ? el : (el?.querySelector<HTMLElement>("button") ?? el);
    target?.focus({ preventScroll: true });
    target?.scrollIntoView({ block: "nearest" });
  }, [focusRequest]); // eslint-disable-line react-hooks/exhaustive-deps

  // Keys act only while the focus is in the table (or on nothing), never in a field.
  const keyState = useRef({ items, focus, onChoose, onToggle, toggleGroup, showMore, groups });
  keyState.current = { items, focus, onChoose, onToggle, toggleGroup, showMore, groups };
  useEffect(() => {
    function onKey(e: KeyboardEvent) {
      if (e.defaultPrevented || e.altKey || e.ctrlKey || e.metaKey || isTyping(e.target)) return;
      const active = document.activeElement;
      if (active && active !== document.body && !containerRef.current?.contains(active)) return;
      const s = keyState.current;
      const at = s.items.findIndex((i) => itemKey(i) === s.focus);
      const item = at >= 0 ? s.items[at] : undefined;
      if (e.key === "j" || e.key === "k") {
        e.preventDefault();
        const next = s.items[at < 0 ? 0 : Math.min(s.items.length - 1, Math.max(0, at + (e.key === "j" ? 1 : -1)))];
        if (next) {
          requestFocus();
          setFocus(itemKey(next));
        }
        return;
      }
      if (!item) return;
      if (e.key === "x" || (e.key === "Enter" && (e.target === document.body || (e.target as HTMLElement).tagName === "TR"))) {
        e.preventDefault();
        if (item.type === "row") s.onToggle(item.id);
        else if (item.type === "group") s.toggleGroup(item.key, s.groups.findIndex((g) => g.key === item.key));
        else s.showMore(item.group);
        return;
      }
      if (item.type === "row" && mode.kind === "reviewer" && !mode.locked && (e.key === "a" || e.key === "d")) {
        e.preventDefault();
        s.onChoose(item.id, e.key === "a" ? "agree" : "dispute");
      }
    }
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [mode]);

  // The remarks side list (or a #flag-… address) brings a flag into view, opening its group.
  const pendingReveal = useRef<string | null>(null);
  const reveal = useCallback(
    (id: string) => {
      const g = groupFlags(flags, query.group).find((x) => x.flags.some((f) => f.id === id));
      if (!g) return;
      const index = g.flags.findIndex((f) => f.id === id);
      if (query.severity || query.family || query.verdict) setQuery({ severity: "", family: "", verdict: "" });
      setOpen((o) => ({ ...o, [`${query.group}:${g.key}`]: true }));
      setLimit((l) => ({ ...l, [`${query.group}:${g.key}`]: Math.max(ROWS_PER_STEP, Math.ceil((index + 1) / ROWS_PER_STEP) * ROWS_PER_STEP) }));
      setExpanded((e) => ({ ...e, [id]: true }));
      setFocus(`f:${id}`);
      requestFocus();
      pendingReveal.current = id;
    },
    [flags, query.group, query.severity, query.family, query.verdict], // eslint-disable-line react-hooks/exhaustive-deps
  );
  useEffect(() => {
    const onReveal = (e: Event) => reveal((e as CustomEvent<string>).detail);
    const fromHash = () => {
      const m = /^#flag-([0-9a-f-]{36})$/.exec(window.location.hash);
      if (m) reveal(m[1]!);
    };
    window.addEventListener(REVEAL_FLAG_EVENT, onReveal);
    window.addEventListener("hashchange", fromHash);
    return () => {
      window.removeEventListener(REVEAL_FLAG_EVENT, onReveal);
      window.removeEventListener("hashchange", fromHash);
    };
  }, [reveal]);
  useEffect(() => {
    const m = /^#flag-([0-9a-f-]{36})$/.exec(window.location.hash);
    if (m) reveal(m[1]!);
    // Only on arrival.
  }, []); // eslint-disable-line react-hooks/exhaustive-deps

  const select = (key: "severity" | "family" | "verdict", label: string, options: { value: string; label: string }[]) => (
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
  const verdictOptions =
    mode.kind === "reviewer"
      ? [
          { value: "none", label: "Not judged yet" },
          { value: "agree", label: "You agree" },
          { value: "dispute", label: "You dispute" },
          { value: "ask-authors", label: "You ask the authors" },
        ]
      : [
          { value: "none", label: "No verdict yet" },
          { value: "agree", label: "A reviewer agrees" },
          { value: "dispute", label: "A reviewer disputes" },
          { value: "ask-authors", label: "A reviewer asks the authors" },
        ];

  return (
    <section aria-labelledby="flags-table-h" data-testid="flags-table" data-ready={ready ? "true" : undefined} ref={containerRef as never}>
      <h2 id="flags-table-h" className="text-lead">
        {title}{" "}
        <span className="text-caption font-normal text-basalt-soft" data-testid="flags-shown">
          ({shown.length} of {flags.length} shown)
        </span>
      </h2>
      <AdvisoryNote className="mt-2" />
      <div className="mt-3 flex flex-wrap items-end gap-3" role="group" aria-label="Group and filter the flags">
        <fieldset className="flex flex-col text-caption">
          <legend className="font-semibold">Group by</legend>
          <div className="flex gap-3 py-0.5">
            {(["claim", "run"] as const).map((g) => (
              <label key={g} className="flex items-center gap-1">
                <input type="radio" name="flags-group" value={g} checked={query.group === g} onChange={() => setQuery({ group: g })} /> {g === "claim" ? "Claim" : "Run"}
              </label>
            ))}
          </div>
        </fieldset>
        {select("severity", "Severity", ["mismatch", "caution", "note"].map((s) => ({ value: s, label: severityLabel(s) })))}
        {select("family", "Rule family", families.map(([id, t]) => ({ value: id, label: `${id}. ${t || "Other"}` })))}
        {select("verdict", "Verdict", verdictOptions)}
      </div>
      <p className="mt-2 text-caption text-basalt-soft" data-testid="flags-keys">
        Keys: <kbd className="font-mono">j</kbd>/<kbd className="font-mono">k</kbd> move
        {mode.kind === "reviewer" && !mode.locked ? (
          <>
            {" "}
            · <kbd className="font-mono">a</kbd> agree · <kbd className="font-mono">d</kbd> dispute
          </>
        ) : null}{" "}
        · <kbd className="font-mono">x</kbd> or <kbd className="font-mono">Enter</kbd> open or close
      </p>
      {shown.length === 0 ? (
        <p className="mt-3 text-caption text-basalt-soft">{flags.length ? "No flag matches these filters." : "The checker found nothing to flag."}</p>
      ) : (
        <div className="mt-2 overflow-x-auto">
          <table className="w-full text-left" data-testid="flags-grid">
            <caption className="sr-only">Flags of this round, grouped by {query.group}</caption>
            <thead>
              <tr className="border-b border-rule text-caption">
                <th scope="col" className="py-1 pr-2">Severity</th>
                <th scope="col" className="py-1 pr-2">Rule</th>
                <th scope="col" className="py-1 pr-2">Run</th>
                <th scope="col" className="py-1 pr-2">Message</th>
                <th scope="col" className="py-1 pr-2">{mode.kind === "reviewer" ? "Your verdict" : "Verdicts"}</th>
                <th scope="col" className="py-1">
                  <span className="sr-only">Remark</span>
                </th>
              </tr>
            </thead>
            {groups.map((g, gi) => {
              const opened = isOpen(g.key, gi);
              const gKey = `g:${g.key}`;
              const rows = opened ? g.flags.slice(0, limitOf(g.key)) : [];
              return (
                <tbody key={g.key || "none"} data-testid="flag-group" data-group={g.label}>
                  <tr className="border-b border-rule bg-vellum-deep">
                    <th scope="colgroup" colSpan={COLS} className="py-1 text-left">
                      <button
                        type="button"
                        id={domId(gKey)}
                        tabIndex={focus === gKey || (!focus && gi === 0) ? 0 : -1}
                        className={`w-full text-left ${focus === gKey ? "underline" : ""}`}
                        aria-expanded={opened}
                        onFocus={() => setFocus(gKey)}
                        onClick={() => toggleGroup(g.key, gi)}
                      >
                        <span aria-hidden="true">{opened ? "▾" : "▸"} </span>
                        <span className="font-semibold">{g.label}</span>{" "}
                        <FlagGroupCounts total={g.flags.length} counts={g.counts} />
                      </button>
                    </th>
                  </tr>
                  {rows.map((f) => (
                    <FlagRow
                      key={f.id}
                      flag={f}
                      focused={focus === `f:${f.id}`}
                      expanded={!!expanded[f.id]}
                      reasonFor={reasonFor?.id === f.id ? reasonFor.verdict : null}
                      mode={mode}
                      saved={savedOf(f.id)}
                      remarkOpen={remarkFor === f.id}
                      runHref={runHref}
                      onFocusRow={onFocusRow}
                      onToggle={onToggle}
                      onChoose={onChoose}
                      onSubmitReason={onSubmitReason}
                      onCancelReason={onCancelReason}
                      onSaved={onSaved}
                      onRemark={setRemarkFor}
                    />
                  ))}
                  {opened && g.flags.length > rows.length ? (
                    <tr>
                      <td colSpan={COLS} className="py-1">
                        <button type="button" id={domId(`m:${g.key}`)} tabIndex={focus === `m:${g.key}` ? 0 : -1} className="btn-quiet py-0.5 text-caption" onClick={() => showMore(g.key)}>
                          Show {Math.min(ROWS_PER_STEP, g.flags.length - rows.length)} more of {g.flags.length - rows.length}
                        </button>
                      </td>
                    </tr>
                  ) : null}
                </tbody>
              );
            })}
          </table>
        </div>
      )}
    </section>
  );
}
