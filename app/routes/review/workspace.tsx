import { parseWithZod } from "@conform-to/zod/v4";
import { useCallback, useState } from "react";
import { data, Form, useFetcher } from "react-router";
import { AdvisoryNote } from "~/components/advisory-note";
import { FlagItem } from "~/components/review/flag-item";
import { RemarkForm, type AnchorOption } from "~/components/review/remark-form";
import { RichText } from "~/components/review/rich-text";
import { RichTextEditor } from "~/components/review/rich-text-editor";
import { VerdictButtons } from "~/components/review/verdict-buttons";
import { SeriesChart, SpectrumChart } from "~/components/workspace/lazy-plots";
import { RunsTable } from "~/components/workspace/runs-table";
import { asActionError, reviewerRound } from "~/review/access.server";
import { RECOMMENDATIONS, remarkSchema, reportMetaSchema, verdictSchema } from "~/review/forms";
import { deleteRemark, saveRemark, saveReportMeta, setVerdict, submitReview } from "~/review/reviews.server";
import { OPEN_STATES } from "~/review/states";
import { reviewerView } from "~/review/workspace.server";
import type { Route } from "./+types/workspace";

export const meta: Route.MetaFunction = ({ data: d }) => [{ title: `Review of round ${d?.round.number ?? ""} · Runproof` }];

export async function loader(args: Route.LoaderArgs) {
  const { db, ctx, review } = await reviewerRound(args);
  const view = await reviewerView(db, ctx, review);
  return {
    venue: { id: ctx.venue.id, name: ctx.venue.name, blinding: ctx.venue.blinding },
    submission: { id: ctx.submission.id, title: ctx.submission.title },
    round: { number: ctx.round.number, state: ctx.round.state },
    review: { number: review.number, state: review.state, recommendation: review.recommendation, editorNote: review.editorNote, dueAt: review.dueAt?.toISOString().slice(0, 10) ?? null },
    ...view,
  };
}

const bad = (error: string) => data({ ok: false as const, error }, { status: 400 });

export async function action(args: Route.ActionArgs) {
  const { db, user, review, ctx } = await reviewerRound(args);
  if (!(OPEN_STATES as readonly string[]).includes(ctx.round.state)) {
    return data({ ok: false as const, error: "The editor has decided on this round; the report can no longer change." }, { status: 409 });
  }
  const form = await args.request.formData();
  const intent = String(form.get("intent"));
  try {
    if (intent === "verdict") {
      const p = parseWithZod(form, { schema: verdictSchema });
      if (p.status !== "success") return bad("Choose agree, dispute or ask the authors.");
      await setVerdict(db, review, p.value.flagId, p.value.verdict);
      return { ok: true as const };
    }
    if (intent === "remark") {
      const p = parseWithZod(form, { schema: remarkSchema });
      if (p.status !== "success") return bad(Object.values(p.error ?? {}).flat().join(" ") || "The remark could not be read.");
      await saveRemark(db, review, p.value);
      return { ok: true as const };
    }
    if (intent === "delete-remark") {
      await deleteRemark(db, review, String(form.get("remarkId")));
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

const isLocked = (d: Route.ComponentProps["loaderData"]) => d.review.state === "submitted" || !(OPEN_STATES as readonly string[]).includes(d.round.state);

function ReportForm({ d }: { d: Route.ComponentProps["loaderData"] }) {
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
          <button className="btn" type="submit" name="intent" value="submit" disabled={fetcher.state !== "idle"}>Submit the report</button>
        </div>
      )}
      {fetcher.data && !fetcher.data.ok ? <p role="alert" className="field-error">{fetcher.data.error}</p> : null}
      {fetcher.state === "idle" && fetcher.data?.ok ? <p role="status" className="text-caption">Saved.</p> : null}
    </fetcher.Form>
  );
}

export default function ReviewWorkspace({ loaderData: d }: Route.ComponentProps) {
  const locked = isLocked(d);
  const [editing, setEditing] = useState<string | null>(null);
  const stopEditing = useCallback(() => setEditing(null), []);
  const anchors: AnchorOption[] = [
    { value: "round:", label: "The round as a whole" },
    ...d.claims.map((c) => ({ value: `claim:${c.id}`, label: `Claim ${c.figure ?? ""} ${c.title}`.trim() })),
    ...d.runRows.map((r) => ({ value: `run:${r.label}`, label: `Run ${r.label}` })),
    ...d.flags.map((f) => ({ value: `flag:${f.id}`, label: `Flag ${f.rule}${f.runLabel ? ` on ${f.runLabel}` : ""}: ${f.message.slice(0, 60)}` })),
  ];
  return (
    <main className="mx-auto max-w-7xl p-gutter">
      <p className="text-caption">{d.venue.name} · your report as Reviewer {d.review.number}{d.review.dueAt ? ` · due ${d.review.dueAt}` : ""}</p>
      <h1 className="text-title">{d.submission.title}</h1>
      <p className="mt-1">
        Round {d.round.number} (frozen) ·{" "}
        {d.review.state === "submitted" ? <strong data-testid="report-locked">Report submitted and locked</strong> : locked ? <strong>The round was decided; this report stays as it is</strong> : "report in progress"} ·{" "}
        <a className="underline" href={`/venues/${d.venue.id}/desk/${d.submission.id}/rounds/${d.round.number}/packet.pdf`}>Packet (PDF)</a>
        {d.round.number > 1 ? <> · <a className="underline" href={`/venues/${d.venue.id}/submissions/${d.submission.id}/rounds/${d.round.number}/changes`}>Changes since round {d.round.number - 1}</a></> : null}
      </p>
      {d.authors.length ? <p className="mt-1 text-caption" data-testid="authors">{d.authors.map((a) => `${a.name}${a.affiliation ? ` (${a.affiliation})` : ""}`).join("; ")}</p> : null}
      <div className="mt-6 grid gap-6 lg:grid-cols-2">
        <div className="flex flex-col gap-4">
          <section className="card" aria-labelledby="claims-h">
            <h2 id="claims-h" className="text-lead">Claims</h2>
            <ul className="mt-2 flex flex-col gap-2">
              {d.claims.map((c) => (
                <li key={c.id} data-testid="claim">
                  <p className="font-semibold">{c.figure ? `${c.figure}: ` : ""}{c.title}</p>
                  {c.statement ? <p className="text-caption">{c.statement}</p> : null}
                  <p className="text-caption text-basalt-soft">Runs: {c.runs.map((r) => `${r.label} (${r.part})`).join(", ")}</p>
                  <p className="text-caption text-basalt-soft">Stated: {c.stated.map((s) => `${s.quantity} ${s.value}${s.run ? ` (${s.run})` : ""}`).join("; ")}</p>
                </li>
              ))}
            </ul>
          </section>
          <section className="card" aria-labelledby="runs-h">
            <h2 id="runs-h" className="text-lead">Runs</h2>
            <RunsTable rows={d.runRows} runHref={() => "#plots"} />
          </section>
          <section className="card" aria-labelledby="plots-h" id="plots">
            <h2 id="plots-h" className="text-lead">Plots</h2>
            {d.plots.every((p) => !p.series && !p.spectrum) ? <p className="text-caption text-basalt-soft">No series or spectra were uploaded for these runs.</p> : null}
            {d.plots.map((p) => (
              <div key={p.label} className="mt-2">
                {p.series ? <SeriesChart plot={p.series} title={`${p.label}: time series`} /> : null}
                {p.spectrum ? <SpectrumChart plot={p.spectrum} title={`${p.label}: spectrum`} /> : null}
              </div>
            ))}
          </section>
        </div>
        <div className="flex flex-col gap-4">
          <section className="card" aria-labelledby="flags-h">
            <h2 id="flags-h" className="text-lead">Flags ({d.flags.length})</h2>
            <AdvisoryNote className="mt-2" />
            <ul className="mt-2 flex flex-col gap-2">
              {d.flags.map((f) => (
                <FlagItem key={f.id} flag={f}>
                  <VerdictButtons flagId={f.id} saved={d.verdicts[f.id]} locked={locked} />
                </FlagItem>
              ))}
            </ul>
          </section>
          <section className="card" aria-labelledby="remarks-h">
            <h2 id="remarks-h" className="text-lead">Your remarks</h2>
            <ul className="mt-2 flex flex-col gap-2" data-testid="my-remarks">
              {d.remarks.map((m) =>
                editing === m.id ? (
                  <li key={m.id} className="border-l-2 border-lichen pl-2">
                    <RemarkForm anchors={anchors} locked={locked} defaultAnchor={`${m.anchorKind}:${m.anchorRef ?? ""}`} remark={{ id: m.id, body: m.body }} onDone={stopEditing} />
                  </li>
                ) : (
                  <li key={m.id} className="border-l-2 border-rule pl-2">
                    <p className="text-caption text-basalt-soft">On {m.anchor}</p>
                    <RichText html={m.html} />
                    {locked ? null : (
                      <div className="flex gap-3">
                        <button className="text-caption underline" type="button" onClick={() => setEditing(m.id)}>Edit</button>
                        <Form method="post" navigate={false}>
                          <input type="hidden" name="intent" value="delete-remark" />
                          <input type="hidden" name="remarkId" value={m.id} />
                          <button className="text-caption underline" type="submit">Delete</button>
                        </Form>
                      </div>
                    )}
                  </li>
                ),
              )}
            </ul>
            <div className="mt-3">
              <RemarkForm anchors={anchors} locked={locked} />
            </div>
          </section>
          <section className="card" aria-labelledby="report-h">
            <h2 id="report-h" className="text-lead">Recommendation and note</h2>
            <ReportForm d={d} />
          </section>
        </div>
      </div>
    </main>
  );
}
