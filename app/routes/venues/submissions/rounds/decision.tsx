import { parseWithZod } from "@conform-to/zod/v4";
import { and, eq } from "drizzle-orm";
import { data, href, Link, useFetcher } from "react-router";
import { requireRound } from "~/access/page-guards.server";
import { rounds } from "~db/schema";
import { RichText } from "~/components/review/rich-text";
import { asActionError } from "~/workspace/action-errors.server";
import { responseSchema, verdictAnswerSchema } from "~/review/review-forms";
import { ANSWERABLE, releasedVerdicts, saveVerdictAnswer } from "~/review/verdicts.server";
import { severityLabel, verdictLabel } from "~/review/labels";
import { releasedRemarks, responsesTo } from "~/review/remarks.server";
import { saveRemarkResponse } from "~/review/revision.server";
import { renderRichText } from "~/review/tiptap/render.server";
import type { Route } from "./+types/decision";
import { decisionLabel, roundStateLabel } from "~/review/labels";

export const meta: Route.MetaFunction = () => [{ title: "Decision · Runproof" }];

/** The authors' view of a released decision: the letter and remarks by "Reviewer N" only. */
export async function loader(args: Route.LoaderArgs) {
  const { db, access: ctx } = await requireRound(args, "read-decision");
  if (!ctx.round.releasedAt) throw data("No decision has been released for this round yet.", { status: 404 });
  const remarks = await releasedRemarks(db, ctx.round);
  const [answers, verdicts] = await Promise.all([responsesTo(db, remarks.map((r) => r.id)), releasedVerdicts(db, ctx.round)]);
  const [next] = await db
    .select({ number: rounds.number, state: rounds.state })
    .from(rounds)
    .where(and(eq(rounds.submissionId, ctx.submission.id), eq(rounds.number, ctx.round.number + 1)));
  return {
    venue: { id: ctx.venue.id, name: ctx.venue.name },
    submission: { id: ctx.submission.id, title: ctx.submission.title },
    round: { number: ctx.round.number, decision: ctx.round.decision, releasedAt: ctx.round.releasedAt.toISOString().slice(0, 10) },
    letter: renderRichText(ctx.round.letter),
    remarks: remarks.map((r) => ({ id: r.id, reviewer: r.reviewer, anchor: r.anchor, html: renderRichText(r.body), response: answers.get(r.id) ?? "" })),
    // Reviewers as "Reviewer N" only: releasedVerdicts selects no id or name of theirs.
    verdicts: verdicts.map((f) => ({ ...f, verdicts: f.verdicts.map((v) => ({ ...v, answerable: ANSWERABLE.has(v.verdict) })) })),
    next: next ?? null,
  };
}

export async function action(args: Route.ActionArgs) {
  const { db, user, access: ctx } = await requireRound(args, "answer-remarks");
  const form = await args.request.formData();
  try {
    if (form.get("intent") === "answer-verdict") {
      const parsed = parseWithZod(form, { schema: verdictAnswerSchema });
      if (parsed.status !== "success") return data({ ok: false as const, error: Object.values(parsed.error ?? {}).flat().join(" ") }, { status: 400 });
      await saveVerdictAnswer(db, { submissionId: ctx.submission.id, decidedRound: ctx.round.number, flagId: parsed.value.flagId, reviewer: parsed.value.reviewer, answer: parsed.value.answer, authorId: user.id });
      return { ok: true as const, error: null };
    }
    const parsed = parseWithZod(form, { schema: responseSchema });
    if (parsed.status !== "success") return data({ ok: false as const, error: Object.values(parsed.error ?? {}).flat().join(" ") }, { status: 400 });
    await saveRemarkResponse(db, { submissionId: ctx.submission.id, remarkId: parsed.value.remarkId, response: parsed.value.response, authorId: user.id });
    return { ok: true as const, error: null };
  } catch (error) {
    const res = asActionError(error);
    return data({ ok: false as const, error: res.data.error }, res.init ?? undefined);
  }
}

/** The authors' answer to one reviewer's dispute or question on a flag, carried into the next round. */
function VerdictAnswerForm({ flagId, reviewer, number, initial, open }: { flagId: string; reviewer: string; number: number; initial: string; open: boolean }) {
  const fetcher = useFetcher<typeof action>();
  if (!open) return <p className="mt-1 text-caption"><strong>Your answer:</strong> {initial || "not answered"}</p>;
  const id = `verdict-answer-${flagId}-${number}`;
  return (
    <fetcher.Form method="post" className="mt-1 flex flex-col gap-1" data-testid="verdict-answer-form">
      <input type="hidden" name="intent" value="answer-verdict" />
      <input type="hidden" name="flagId" value={flagId} />
      <input type="hidden" name="reviewer" value={number} />
      <label className="text-caption font-semibold" htmlFor={id}>Your answer to {reviewer} (part of the next round)</label>
      <textarea id={id} name="answer" defaultValue={initial} rows={2} maxLength={20000} className="field-input" required />
      <button className="btn-quiet self-start" type="submit" disabled={fetcher.state !== "idle"}>Save answer</button>
      {fetcher.data && !fetcher.data.ok ? <p role="alert" className="field-error">{fetcher.data.error}</p> : null}
      {fetcher.state === "idle" && fetcher.data?.ok ? <p role="status" className="text-caption">Answer saved.</p> : null}
    </fetcher.Form>
  );
}

function ResponseForm({ remarkId, initial, open }: { remarkId: string; initial: string; open: boolean }) {
  const fetcher = useFetcher<typeof action>();
  if (!open) return <p className="mt-1 text-caption"><strong>Your answer:</strong> {initial || "not answered"}</p>;
  return (
    <fetcher.Form method="post" className="mt-2 flex flex-col gap-1" data-testid="response-form">
      <input type="hidden" name="intent" value="respond" />
      <input type="hidden" name="remarkId" value={remarkId} />
      <label className="text-caption font-semibold" htmlFor={`resp-${remarkId}`}>Your answer (part of the next round)</label>
      <textarea id={`resp-${remarkId}`} name="response" defaultValue={initial} rows={3} className="field-input" required />
      <button className="btn-quiet self-start" type="submit" disabled={fetcher.state !== "idle"}>Save answer</button>
      {fetcher.data && !fetcher.data.ok ? <p role="alert" className="field-error">{fetcher.data.error}</p> : null}
      {fetcher.state === "idle" && fetcher.data?.ok ? <p role="status" className="text-caption">Answer saved.</p> : null}
    </fetcher.Form>
  );
}

export default function Decision({ loaderData: d }: Route.ComponentProps) {
  const at = (round: number) => ({ venueId: d.venue.id, submissionId: d.submission.id, round: String(round) });
  const open = d.next?.state === "draft";
  return (
    <div>
      <h3 className="text-lead">Decision on round {d.round.number}: {decisionLabel(d.round.decision)}</h3>
      <p className="mt-1">{d.submission.title} · released {d.round.releasedAt} · <a className="underline" href={href("/venues/:venueId/submissions/:submissionId/rounds/:round/letter.pdf", at(d.round.number))}>Letter as PDF</a></p>
      {d.next ? (
        <p className="mt-2 rounded bg-lichen-wash p-2">
          Round {d.next.number} is {d.next.state === "draft" ? "open for your revision" : roundStateLabel(d.next.state).toLowerCase()}:{" "}
          <Link className="underline" to={href("/venues/:venueId/submissions/:submissionId/rounds/:round", at(d.next.number))}>open round {d.next.number}</Link> ·{" "}
          <Link className="underline" to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/changes", at(d.next.number))}>changes since round {d.round.number}</Link>
        </p>
      ) : null}
      <section className="card mt-4" aria-labelledby="letter-h">
        <h2 id="letter-h" className="text-lead">Letter from the editor</h2>
        <RichText html={d.letter} className="mt-2" />
      </section>
      <section className="mt-4" aria-labelledby="verdicts-h">
        <h2 id="verdicts-h" className="text-lead">Reviewers' verdicts on the checker's flags</h2>
        {d.verdicts.length === 0 ? <p className="text-caption text-basalt-soft">No reviewer gave a verdict on a flag.</p> : null}
        <ul className="mt-2 flex flex-col gap-3">
          {d.verdicts.map((f) => (
            <li key={f.flagId} className="card" data-testid="released-verdict">
              <p className="text-caption">
                <strong>{severityLabel(f.severity)}</strong> · <a className="font-mono underline" href={`${href("/help/checks")}#${f.rule}`}>{f.rule}</a>
                {f.runLabel ? ` · run ${f.runLabel}` : ""}
              </p>
              <p>{f.message}</p>
              <ul className="mt-2 flex flex-col gap-2">
                {f.verdicts.map((v) => (
                  <li key={v.number} className="border-l-2 border-rule pl-2">
                    <p><strong>{v.reviewer}</strong> {verdictLabel(v.verdict).toLowerCase()}{v.reason ? ":" : "."}</p>
                    {v.reason ? <p className="whitespace-pre-line" data-testid="verdict-reason">{v.reason}</p> : null}
                    {v.answerable ? <VerdictAnswerForm flagId={f.flagId} reviewer={v.reviewer} number={v.number} initial={v.answer ?? ""} open={open} /> : null}
                  </li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      </section>
      <section className="mt-4" aria-labelledby="rem-h">
        <h2 id="rem-h" className="text-lead">Reviewers' remarks</h2>
        <ul className="mt-2 flex flex-col gap-3">
          {d.remarks.map((m) => (
            <li key={m.id} className="card" data-testid="released-remark">
              <p className="text-caption text-basalt-soft"><strong>{m.reviewer}</strong>, on {m.anchor}</p>
              <RichText html={m.html} />
              <ResponseForm remarkId={m.id} initial={m.response} open={open} />
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
