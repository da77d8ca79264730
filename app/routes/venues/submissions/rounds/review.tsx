import { parseWithZod } from "@conform-to/zod/v4";
import { useCallback, useMemo, useState } from "react";
import { data, Form, href, redirect, useFetcher, type ShouldRevalidateFunctionArgs } from "react-router";
import { notFound, requireRound } from "~/access/page-guards.server";
import { isId } from "~/access/relation.server";
import { FlagsTable, REVEAL_FLAG_EVENT } from "~/components/review/flags-table";
import { RemarkForm } from "~/components/review/remark-form";
import { RichText } from "~/components/review/rich-text";
import { RichTextEditor } from "~/components/review/rich-text-editor";
import { RunPlotsOnDemand } from "~/components/review/run-plots-on-demand";
import { runAnchorId, RunsTable } from "~/components/workspace/runs-table";
import type { FlagView } from "~/workspace/view-types";
import { onlyFlagQueryChanged } from "~/review/flag-table";
import { asActionError } from "~/workspace/action-errors.server";
import { respondAsInvitee } from "~/review/invitations.server";
import { RECOMMENDATIONS, remarkSchema, reportMetaSchema, verdictSchema } from "~/review/review-forms";
import { deleteRemark, saveRemark, saveReportMeta, setVerdict, submitReview } from "~/review/reviews.server";
import { OPEN_STATES } from "~/review/states";
import { reviewerView } from "~/review/workspace.server";
import type { Route } from "./+types/review";

export const meta: Route.MetaFunction = ({ params }) => [{ title: `Review of round ${params.round} · Runproof` }];

export async function loader(args: Route.LoaderArgs) {
  const { db, access: ctx } = await requireRound(args, "open-round");
  if (ctx.can("respond-invitation") && ctx.invitation) {
    return {
      invitation: { dueAt: ctx.invitation.dueAt.toISOString().slice(0, 10), title: ctx.submission.title, abstract: ctx.submission.abstract, venue: ctx.venue.name, round: ctx.round.number },
    };
  }
  const review = ctx.review;
  if (!review || !ctx.can("read-own-review")) throw notFound();
  const view = await reviewerView(db, ctx, review, { showAuthors: ctx.can("read-author-identities") });
  return {
    invitation: null,
    venue: { id: ctx.venue.id, name: ctx.venue.name, blinding: ctx.venue.blinding },
    submission: { id: ctx.submission.id, title: ctx.submission.title },
    round: { number: ctx.round.number, state: ctx.round.state },
    review: { number: review.number, state: review.state, recommendation: review.recommendation, editorNote: review.editorNote, dueAt: review.dueAt?.toISOString().slice(0, 10) ?? null },
    ...view,
  };
}

const bad = (error: string) => data({ ok: false as const, error }, { status: 400 });

export async function action(args: Route.ActionArgs) {
  const form = await args.request.formData();
  const intent = String(form.get("intent"));
  if (intent === "accept-invitation" || intent === "decline-invitation") {
    const { db, user, access } = await requireRound(args, "respond-invitation");
    if (!access.invitation) throw notFound();
    try {
      await respondAsInvitee(db, { invitation: access.invitation, answer: intent === "accept-invitation" ? "accept" : "decline", userId: user.id });
    } catch (error) {
      const res = asActionError(error);
      return data({ ok: false as const, error: res.data.error }, res.init ?? undefined);
    }
    throw redirect(intent === "accept-invitation" ? href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", args.params) : href("/dashboard"));
  }
  const { db, user, access: ctx } = await requireRound(args, "review");
  const review = ctx.review!;
  try {
    if (intent === "verdict") {
      const p = parseWithZod(form, { schema: verdictSchema });
      if (p.status !== "success") return bad(Object.values(p.error ?? {}).flat()[0] ?? "Choose agree, dispute or ask the authors.");
      const verdict = await setVerdict(db, review, p.value.flagId, p.value.verdict, p.value.reason);
      return { ok: true as const, verdict };
    }
    if (intent === "remark") {
      const p = parseWithZod(form, { schema: remarkSchema });
      if (p.status !== "success") return bad(Object.values(p.error ?? {}).flat().join(" ") || "The remark could not be read.");
      await saveRemark(db, review, p.value);
      return { ok: true as const };
    }
    if (intent === "delete-remark") {
      const remarkId = String(form.get("remarkId") ?? "");
      if (!isId(remarkId)) return bad("Choose the remark to delete.");
      await deleteRemark(db, review, remarkId);
      return { ok: true as const };
    }
    if (intent === "meta" || intent === "submit") {
      const parsed = parseWithZod(form, { schema: reportMetaSchema.omit({ intent: true }) });
      if (parsed.status !== "success") return bad("The recommendation or note could not be read.");
      await saveReportMeta(db, review, parsed.value);
      if (intent === "submit") await submitReview(db, { ...review, recommendation: (parsed.value.recommendation ?? null) as never }, user.id);
      return { ok: true as const };
    }
    return bad("Unknown action.");
  } catch (error) {
    const res = asActionError(error);
    return data({ ok: false as const, error: res.data.error }, res.init ?? undefined);
  }
}

/**
 * A verdict answers with what was stored and the table keeps it, so the page does not reload its
 * data after every key press; nor when only the flags' grouping or filters change in the URL.
 */
export function shouldRevalidate({ formData, actionResult, currentUrl, nextUrl, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (formData?.get("intent") === "verdict" && (actionResult as { ok?: boolean } | undefined)?.ok) return false;
  if (!formData && onlyFlagQueryChanged(currentUrl, nextUrl)) return false;
  return defaultShouldRevalidate;
}

type WorkspaceData = Extract<Route.ComponentProps["loaderData"], { invitation: null }>;
type InvitationData = Exclude<Route.ComponentProps["loaderData"], { invitation: null }>["invitation"];

const isLocked = (d: WorkspaceData) => d.review.state === "submitted" || !(OPEN_STATES as readonly string[]).includes(d.round.state);

function ReportForm({ d }: { d: WorkspaceData }) {
  const fetcher = useFetcher<{ ok: boolean; error?: string }>();
  const locked = isLocked(d);
  return (
    <fetcher.Form method="post" className="flex flex-col gap-3" data-testid="report-form">
      <label className="flex flex-col gap-1">
        <span className="font-semibold">Recommendation</span>
        <select name="recommendation" defaultValue={d.review.recommendation ?? ""} disabled={locked} className="field-input">
          <option value="">Choose…</option>
          {RECOMMENDATIONS.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
        </select>
      </label>
      {locked ? null : <RichTextEditor id="note" name="editorNote" label="Note for the editor only (never shown to the authors)" initial={d.review.editorNote ?? undefined} />}
      {locked ? null : (
        <div className="flex gap-3">
          <button className="btn-quiet" type="submit" name="intent" value="meta" disabled={fetcher.state !== "idle"}>Save</button>
          <button
                  onClick={(e) => {
                    if (!window.confirm("Submit the report? It locks, and the editor is told; remarks reach the authors only when the editor releases the decision.")) e.preventDefault();
                  }}
                  className="btn" type="submit" name="intent" value="submit" disabled={fetcher.state !== "idle"}>Submit the report</button>
        </div>
      )}
      {fetcher.data && !fetcher.data.ok ? <p role="alert" className="field-error">{fetcher.data.error}</p> : null}
      {fetcher.state === "idle" && fetcher.data?.ok ? <p role="status" className="text-caption">Saved.</p> : null}
    </fetcher.Form>
  );
}

function InvitationAnswer({ invitation: i, error }: { invitation: NonNullable<InvitationData>; error?: string }) {
  return (
    <section className="card max-w-2xl" aria-labelledby="inv-h" data-testid="invitation-answer">
      <h3 id="inv-h" className="text-lead">
        You are invited to review round {i.round}
      </h3>
      <p className="mt-1 text-caption">
        {i.venue} · report due {i.dueAt}
      </p>
      <h4 className="mt-3 font-semibold">{i.title}</h4>
      {i.abstract ? <p className="mt-1 whitespace-pre-line">{i.abstract}</p> : null}
      {error ? (
        <p role="alert" className="field-error mt-2">
          {error}
        </p>
      ) : null}
      <Form method="post" className="mt-4 flex gap-3">
        <button className="btn" type="submit" name="intent" value="accept-invitation">
          Accept and start the review
        </button>
        <button className="btn-quiet" type="submit" name="intent" value="decline-invitation">
          Decline
        </button>
      </Form>
    </section>
  );
}

export default function ReviewPage({ loaderData, actionData, params }: Route.ComponentProps) {
  if (loaderData.invitation) return <InvitationAnswer invitation={loaderData.invitation} error={actionData && !actionData.ok ? String(actionData.error) : undefined} />;
  return <ReviewWorkspace d={loaderData} p={{ venueId: params.venueId, submissionId: params.submissionId, round: params.round }} />;
}

type P = { venueId: string; submissionId: string; round: string };
type MyRemark = WorkspaceData["remarks"][number];

/** Where a remark's anchor sits on this page; a flag in a closed group is opened by the table. */
function anchorTarget(m: { anchorKind: string; anchorRef: string | null }) {
  if (m.anchorKind === "flag") return `#flag-${m.anchorRef}`;
  if (m.anchorKind === "claim") return `#claim-${m.anchorRef}`;
  if (m.anchorKind === "run") return `#${runAnchorId(m.anchorRef ?? "")}`;
  return "#round-remark";
}

/** The reviewer's remarks in the order written, each linking to what it is about. */
function RemarksList({ remarks, locked }: { remarks: MyRemark[]; locked: boolean }) {
  const [editing, setEditing] = useState<string | null>(null);
  const stopEditing = useCallback(() => setEditing(null), []);
  return (
    <ol className="mt-2 flex flex-col gap-3" data-testid="my-remarks">
      {remarks.length === 0 ? <li className="text-caption text-basalt-soft">No remarks yet: use "Remark" beside a claim, a run or a flag.</li> : null}
      {remarks.map((m, i) =>
        editing === m.id ? (
          <li key={m.id} className="border-l-2 border-lichen pl-2">
            <RemarkForm fixedAnchor={{ value: `${m.anchorKind}:${m.anchorRef ?? ""}`, label: m.anchor }} locked={locked} remark={{ id: m.id, body: m.body }} onDone={stopEditing} />
          </li>
        ) : (
          <li key={m.id} className="border-l-2 border-rule pl-2" data-testid="my-remark">
            <p className="text-caption text-basalt-soft">
              {i + 1}. On{" "}
              <a
                className="underline"
                href={anchorTarget(m)}
                onClick={() => {
                  if (m.anchorKind === "flag" && m.anchorRef) window.dispatchEvent(new CustomEvent(REVEAL_FLAG_EVENT, { detail: m.anchorRef }));
                }}
              >
                {m.anchor}
              </a>
            </p>
            <RichText html={m.html} />
            {locked ? null : (
              <div className="flex gap-3">
                <button className="text-caption underline" type="button" onClick={() => setEditing(m.id)}>
                  Edit
                </button>
                <Form method="post" navigate={false}>
                  <input type="hidden" name="intent" value="delete-remark" />
                  <input type="hidden" name="remarkId" value={m.id} />
                  <button className="text-caption underline" type="submit">
                    Delete
                  </button>
                </Form>
              </div>
            )}
          </li>
        ),
      )}
    </ol>
  );
}

function ReviewWorkspace({ d, p }: { d: WorkspaceData; p: P }) {
  const locked = isLocked(d);
  // One composer open at a time, beside what it is about: "claim:<id>", "run:<label>", "round:".
  const [composer, setComposer] = useState<string | null>(null);
  const close = useCallback(() => setComposer(null), []);
  const runHref = useCallback((label: string) => {
    const row = d.runRows.find((r) => r.label === label);
    return row ? href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...p, runId: row.runId }) : href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs", p);
  }, [d.runRows, p.venueId, p.submissionId, p.round]); // eslint-disable-line react-hooks/exhaustive-deps
  const renderRemark = useCallback(
    (f: FlagView, done: () => void) => (
      <RemarkForm
        fixedAnchor={{ value: `flag:${f.id}`, label: `flag ${f.rule}${f.runLabel ? ` on ${f.runLabel}` : ""}` }}
        locked={locked}
        onDone={done}
        editorId={`remark-flag-${f.id}`}
      />
    ),
    [locked],
  );
  const mode = useMemo(() => ({ kind: "reviewer" as const, verdicts: d.verdicts, locked, renderRemark }), [d.verdicts, locked, renderRemark]);
  const remarkButton = (key: string, label: string) =>
    locked ? null : (
      <button type="button" className="text-caption underline" aria-expanded={composer === key} onClick={() => setComposer(composer === key ? null : key)}>
        Remark<span className="sr-only"> on {label}</span>
      </button>
    );
  return (
    <div>
      <p className="text-caption">
        Your report as Reviewer {d.review.number}
        {d.review.dueAt ? ` · due ${d.review.dueAt}` : ""}
      </p>
      <p className="mt-1">
        Round {d.round.number} (frozen) ·{" "}
        {d.review.state === "submitted" ? (
          <strong data-testid="report-locked">Report submitted and locked</strong>
        ) : locked ? (
          <strong>The round was decided; this report stays as it is</strong>
        ) : (
          "report in progress"
        )}{" "}
        ·{" "}
        <a className="underline" href={href("/venues/:venueId/submissions/:submissionId/rounds/:round/packet.pdf", p)}>
          Packet (PDF)
        </a>
        {d.round.number > 1 ? (
          <>
            {" "}
            ·{" "}
            <a className="underline" href={href("/venues/:venueId/submissions/:submissionId/rounds/:round/changes", p)}>
              Changes since round {d.round.number - 1}
            </a>
          </>
        ) : null}
      </p>
      {d.authors.length ? (
        <p className="mt-1 text-caption" data-testid="authors">
          {d.authors.map((a) => `${a.name}${a.affiliation ? ` (${a.affiliation})` : ""}`).join("; ")}
        </p>
      ) : null}
      <div className="mt-6 grid gap-6 xl:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="flex min-w-0 flex-col gap-4">
          <section className="card" aria-labelledby="claims-h">
            <h2 id="claims-h" className="text-lead">
              Claims
            </h2>
            <ul className="mt-2 flex flex-col gap-3">
              {d.claims.map((c) => {
                const label = `claim ${c.figure ? `${c.figure} ` : ""}${c.title}`.trim();
                return (
                  <li key={c.id} id={`claim-${c.id}`} data-testid="claim">
                    <div className="flex items-baseline justify-between gap-3">
                      <p className="font-semibold">
                        {c.figure ? `${c.figure}: ` : ""}
                        {c.title}
                      </p>
                      <span className="flex shrink-0 gap-3">
                        <a className="text-caption underline" href={href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims/:claimId", { ...p, claimId: c.id })}>
                          Open<span className="sr-only"> {label}</span>
                        </a>
                        {remarkButton(`claim:${c.id}`, label)}
                      </span>
                    </div>
                    {c.statement ? <p className="text-caption">{c.statement}</p> : null}
                    <p className="text-caption text-basalt-soft">Runs: {c.runs.map((r) => `${r.label} (${r.part})`).join(", ")}</p>
                    <p className="text-caption text-basalt-soft">Stated: {c.stated.map((s) => `${s.quantity} ${s.value}${s.run ? ` (${s.run})` : ""}`).join("; ")}</p>
                    {composer === `claim:${c.id}` ? (
                      <div className="mt-2 rounded border border-lichen p-2" data-testid="claim-remark">
                        <RemarkForm fixedAnchor={{ value: `claim:${c.id}`, label }} locked={locked} onDone={close} editorId={`remark-claim-${c.id}`} />
                      </div>
                    ) : null}
                  </li>
                );
              })}
            </ul>
          </section>
          <section className="card" aria-labelledby="runs-h">
            <h2 id="runs-h" className="text-lead">
              Runs
            </h2>
            <p className="text-caption text-basalt-soft">Each run's name opens its full record: every parameter group and the recomputed numbers.</p>
            <RunsTable
              rows={d.runRows}
              runHref={(r) => href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...p, runId: r.runId })}
              rowAction={locked ? undefined : (r) => remarkButton(`run:${r.label}`, `run ${r.label}`)}
              rowDetail={(r) =>
                composer === `run:${r.label}` ? (
                  <div className="rounded border border-lichen p-2" data-testid="run-remark">
                    <RemarkForm fixedAnchor={{ value: `run:${r.label}`, label: `run ${r.label}` }} locked={locked} onDone={close} editorId={`remark-run-${runAnchorId(r.label)}`} />
                  </div>
                ) : null
              }
            />
          </section>
          <section className="card" id="flags">
            <FlagsTable rowsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags/table", p)} total={d.flagTotal} mode={mode} runHref={runHref} />
          </section>
          <section className="card" aria-labelledby="plots-h" id="plots">
            <h2 id="plots-h" className="text-lead">
              Plots
            </h2>
            {d.plots.length === 0 ? (
              <p className="text-caption text-basalt-soft">No series or spectra were uploaded for these runs.</p>
            ) : (
              <ul className="mt-2 divide-y divide-rule">
                {d.plots.map((r) => (
                  <RunPlotsOnDemand
                    key={r.runId}
                    label={r.label}
                    kinds={[r.series ? "time series" : "", r.spectrum ? "spectrum" : ""].filter(Boolean).join(" and ")}
                    plotsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId/plots", { ...p, runId: r.runId })}
                  />
                ))}
              </ul>
            )}
          </section>
          <section className="card" aria-labelledby="report-h">
            <h2 id="report-h" className="text-lead">
              Recommendation and note
            </h2>
            <ReportForm d={d} />
          </section>
        </div>
        <aside className="card self-start xl:sticky xl:top-4 xl:max-h-[calc(100vh-2rem)] xl:overflow-y-auto" aria-labelledby="remarks-h">
          <h2 id="remarks-h" className="text-lead">
            Your remarks ({d.remarks.length})
          </h2>
          <p className="text-caption text-basalt-soft">Released to the authors with the decision, as Reviewer {d.review.number}.</p>
          <RemarksList remarks={d.remarks} locked={locked} />
          {locked ? null : (
            <div className="mt-3" id="round-remark">
              {composer === "round:" ? (
                <RemarkForm fixedAnchor={{ value: "round:", label: "the round as a whole" }} locked={locked} onDone={close} editorId="remark-round" />
              ) : (
                <button type="button" className="btn-quiet" onClick={() => setComposer("round:")}>
                  Remark on the round as a whole
                </button>
              )}
            </div>
          )}
        </aside>
      </div>
    </div>
  );
}
