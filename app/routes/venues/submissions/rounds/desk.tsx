import { parseWithZod } from "@conform-to/zod/v4";
import { useCallback, useMemo } from "react";
import { data, Form, href, Link, useNavigation, type ShouldRevalidateFunctionArgs } from "react-router";
import { FlagsTable } from "~/components/review/flags-table";
import { onlyFlagQueryChanged } from "~/review/flag-table";
import { requireRound } from "~/access/page-guards.server";
import { AdvisoryNote } from "~/components/advisory-note";
import { RichText } from "~/components/review/rich-text";
import { RichTextEditor } from "~/components/review/rich-text-editor";
import { asActionError } from "~/workspace/action-errors.server";
import { releaseDecision, saveDecisionDraft } from "~/review/decisions.server";
import { editorialView } from "~/review/editorial.server";
import { decisionSchema, inviteSchema, RECOMMENDATIONS, reinviteSchema } from "~/review/review-forms";
import { conflictCheck, inviteReviewer, reinvitePrevious, resendInvitation, withdrawInvitation } from "~/review/invitations.server";
import { isId } from "~/access/relation.server";
import type { Route } from "./+types/desk";
import { digestRecipients } from "~/review/digest.server";
import { DigestNow } from "~/components/review/digest-now";
import { auditEntryLabel, decisionLabel, invitationStateLabel, recommendationLabel, reviewStateLabel, roundStateLabel, verdictLabel } from "~/review/labels";

export const meta: Route.MetaFunction = ({ data: d }) => [{ title: `Round ${d?.round.number ?? ""} · Editor's desk · Runproof` }];

export async function loader(args: Route.LoaderArgs) {
  const { db, access: ctx } = await requireRound(args, "read-reports");
  const view = await editorialView(db, ctx, { showReviewerNames: ctx.can("read-reviewer-identities") });
  const { round } = ctx;
  return {
    venue: ctx.venue,
    submission: ctx.submission,
    round: { id: round.id, number: round.number, state: round.state, version: round.version, decision: round.decision, letter: round.letter, releasedAt: round.releasedAt },
    ...view,
    canInvite: ctx.can("invite"),
    canDecide: ctx.can("decide"),
    digestRecipients: ctx.can("send-digest") ? await digestRecipients(db, ctx.submission.id) : null,
  };
}

type ActionResult = { ok: boolean; error?: string; issues?: { path: string; message: string }[]; warnings?: string[]; warnedEmail?: string; message?: string; form?: string };

export async function action(args: Route.ActionArgs) {
  const form = await args.request.formData();
  const intent = String(form.get("intent"));
  const inviting = ["invite", "reinvite", "resend-invitation", "withdraw-invitation"].includes(intent);
  const { db, user, access: ctx } = await requireRound(args, inviting ? "invite" : "decide");
  try {
    if (intent === "resend-invitation" || intent === "withdraw-invitation") {
      const invitationId = String(form.get("invitationId") ?? "");
      if (!isId(invitationId)) return data<ActionResult>({ ok: false, form: "invite", error: "Choose the invitation to send again or withdraw." }, { status: 400 });
      if (intent === "resend-invitation") {
        await resendInvitation(db, { roundId: ctx.round.id, invitationId, editorId: user.id });
        return data<ActionResult>({ ok: true, form: "invite", message: "Invitation sent again with a new link; the old link now points to the new mail." });
      }
      await withdrawInvitation(db, { roundId: ctx.round.id, invitationId, editorId: user.id });
      return data<ActionResult>({ ok: true, form: "invite", message: "Invitation withdrawn; the person was told and the link no longer works." });
    }
    if (intent === "invite") {
      const parsed = parseWithZod(form, { schema: inviteSchema });
      if (parsed.status !== "success") return data<ActionResult>({ ok: false, form: "invite", error: Object.values(parsed.error ?? {}).flat().join(" ") }, { status: 400 });
      const check = await conflictCheck(db, ctx.submission.id, parsed.value.email);
      // A warning is confirmed for the address it was shown for, not for whoever is typed next.
      if (!check.blocked && check.warnings.length && String(form.get("confirm") ?? "").toLowerCase() !== parsed.value.email.toLowerCase()) {
        return data<ActionResult>({ ok: false, form: "invite", warnings: check.warnings, warnedEmail: parsed.value.email }, { status: 200 });
      }
      await inviteReviewer(db, { roundId: ctx.round.id, email: parsed.value.email, dueAt: parsed.value.dueAt, editorId: user.id });
      return data<ActionResult>({ ok: true, form: "invite", message: `Invitation sent to ${parsed.value.email}.` });
    }
    if (intent === "reinvite") {
      const parsed = parseWithZod(form, { schema: reinviteSchema });
      if (parsed.status !== "success") return data<ActionResult>({ ok: false, form: "reinvite", error: "Choose a due date." }, { status: 400 });
      const invited = await reinvitePrevious(db, { roundId: ctx.round.id, dueAt: parsed.value.dueAt, editorId: user.id });
      return data<ActionResult>({ ok: true, form: "reinvite", message: invited.length ? `Invited again: ${invited.join(", ")}.` : "Everyone from the previous round is already invited." });
    }
    const parsed = parseWithZod(form, { schema: decisionSchema });
    if (parsed.status !== "success") return data<ActionResult>({ ok: false, form: "decision", error: Object.values(parsed.error ?? {}).flat().join(" ") }, { status: 400 });
    const { decision, letter, version } = parsed.value;
    if (parsed.value.intent === "save-decision") {
      await saveDecisionDraft(db, { roundId: ctx.round.id, decision, letter, expectedVersion: version });
      return data<ActionResult>({ ok: true, form: "decision", message: "Decision draft saved." });
    }
    await releaseDecision(db, { roundId: ctx.round.id, decision, letter, expectedVersion: version, editorId: user.id });
    return data<ActionResult>({ ok: true, form: "decision", message: "Decision released; the authors were mailed." });
  } catch (error) {
    const res = asActionError(error);
    return data<ActionResult>({ ...res.data, form: inviting ? (intent === "reinvite" ? "reinvite" : "invite") : "decision" }, res.init ?? undefined);
  }
}

/** Changing the flags' grouping or filters re-reads nothing. */
export function shouldRevalidate({ formData, currentUrl, nextUrl, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (!formData && onlyFlagQueryChanged(currentUrl, nextUrl)) return false;
  return defaultShouldRevalidate;
}

function Notice({ result, form }: { result?: ActionResult; form: string }) {
  if (!result || result.form !== form) return null;
  if (result.ok) return <p role="status" className="rounded bg-lichen-wash p-2">{result.message}</p>;
  if (result.error) return <p role="alert" className="rounded border border-ember bg-ember-wash p-2 text-ember">{result.error}{result.issues?.length ? ` ${result.issues.map((i) => i.message).join(" ")}` : ""}</p>;
  return null;
}

export default function EditorialRound({ loaderData: d, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state !== "idle";
  const open = d.canInvite;
  const p = { venueId: d.venue.id, submissionId: d.submission.id, round: String(d.round.number) };
  const defaultDue = new Date(Date.now() + 21 * 86_400_000).toISOString().slice(0, 10);
  const mode = useMemo(() => ({ kind: "editor" as const, verdicts: d.flagVerdicts }), [d.flagVerdicts]);
  const runs = d.runs;
  const runHref = useCallback((label: string) => {
    const run = runs.find((r) => r.label === label);
    return run ? href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...p, runId: run.runId }) : href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs", p);
  }, [runs, p.venueId, p.submissionId, p.round]); // eslint-disable-line react-hooks/exhaustive-deps
  return (
    <div>
      <p className="text-caption">
        <Link to={href("/venues/:venueId/desk", { venueId: d.venue.id })} className="underline">Editor's desk</Link> · {d.venue.name}
      </p>
      <p className="mt-1" data-testid="desk-round-state">
        Round {d.round.number} · {roundStateLabel(d.round.state)}
        {d.round.decision ? ` · decision: ${decisionLabel(d.round.decision)}` : ""} · flags: {d.flagCounts.mismatch} mismatch, {d.flagCounts.caution} caution, {d.flagCounts.note} note
      </p>
      <AdvisoryNote className="mt-2" />
      <p className="mt-1 flex gap-3 text-caption">
        <a className="underline" href={href("/venues/:venueId/submissions/:submissionId/rounds/:round/packet.pdf", p)}>Reviewer packet (PDF)</a>
        {d.round.number > 1 ? <Link className="underline" to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/changes", p)}>Changes since round {d.round.number - 1}</Link> : null}
      </p>

      <section className="card mt-6" aria-labelledby="inv-h">
        <h2 id="inv-h" className="text-lead">Reviewers</h2>
        <ul className="mt-2 divide-y divide-rule" data-testid="invitations">
          {d.invites.map((i) => (
            <li key={i.id} className="flex flex-wrap items-center gap-3 py-1 text-caption">
              <span>
                {i.email} · {invitationStateLabel(i.state)} · due {new Date(i.dueAt).toISOString().slice(0, 10)}
              </span>
              {open && i.state === "pending" ? (
                <Form method="post" className="flex gap-2">
                  <input type="hidden" name="invitationId" value={i.id} />
                  <button className="btn-quiet" type="submit" name="intent" value="resend-invitation" disabled={busy}>
                    Send again
                  </button>
                  <button
                    className="btn-quiet"
                    type="submit"
                    name="intent"
                    value="withdraw-invitation"
                    disabled={busy}
                    onClick={(e) => {
                      if (!window.confirm(`Withdraw the invitation to ${i.email}? They will be told, and the link will stop working.`)) e.preventDefault();
                    }}
                  >
                    Withdraw
                  </button>
                </Form>
              ) : null}
            </li>
          ))}
        </ul>
        {open ? (
          <>
            <Form method="post" className="mt-3 flex flex-wrap items-end gap-3">
              <input type="hidden" name="intent" value="invite" />
              {actionData?.form === "invite" && actionData.warnedEmail ? <input type="hidden" name="confirm" value={actionData.warnedEmail} /> : null}
              <label className="flex flex-col text-caption">
                E-mail
                <input name="email" type="email" required className="field-input" />
              </label>
              <label className="flex flex-col text-caption">
                Due date
                <input name="dueAt" type="date" required defaultValue={defaultDue} className="field-input" />
              </label>
              <button className="btn" type="submit" disabled={busy}>
                {actionData?.form === "invite" && actionData.warnings?.length ? "Invite anyway" : "Invite reviewer"}
              </button>
            </Form>
            {actionData?.form === "invite" && actionData.warnings?.length ? (
              <p role="alert" className="mt-2 rounded border border-amber bg-amber-wash p-2" data-testid="affiliation-warning">
                {actionData.warnings.join(" ")} Enter the address again and choose "Invite anyway" if you still want this reviewer.
              </p>
            ) : null}
            <Notice result={actionData} form="invite" />
            {d.hasPrevious ? (
              <Form method="post" className="mt-3 flex items-end gap-3">
                <input type="hidden" name="intent" value="reinvite" />
                <input type="hidden" name="dueAt" value={defaultDue} />
                <button className="btn-quiet" type="submit" disabled={busy}>
                  Invite round {d.round.number - 1}'s reviewers again
                </button>
              </Form>
            ) : null}
            <Notice result={actionData} form="reinvite" />
          </>
        ) : null}
      </section>

      <section className="mt-6" aria-labelledby="rep-h">
        <h2 id="rep-h" className="text-lead">Reports</h2>
        {d.reports.length === 0 ? <p className="text-caption text-basalt-soft">No reviewer has accepted yet.</p> : null}
        {d.reports.map((r) => (
          <article key={r.id} className="card mt-3" data-testid={`report-${r.number}`}>
            <h3 className="font-semibold">
              Reviewer {r.number}: {r.name} ({r.email}) · {reviewStateLabel(r.state)}
              {r.state !== "submitted" && r.dueAt ? (new Date(r.dueAt).getTime() < Date.now() ? <span className="text-ember"> · overdue since {new Date(r.dueAt).toISOString().slice(0, 10)}</span> : ` · due ${new Date(r.dueAt).toISOString().slice(0, 10)}`) : ""}
              {r.recommendation ? ` · recommends ${recommendationLabel(r.recommendation)}` : ""}
            </h3>
            {r.editorNote ? (
              <div className="mt-2 rounded bg-fjord-wash p-2">
                <p className="text-caption font-semibold">Note for the editor only</p>
                <RichText html={r.editorNote} />
              </div>
            ) : null}
            {r.verdicts.length ? (
              <p className="mt-2 text-caption">
                Verdicts on {r.verdicts.length} {r.verdicts.length === 1 ? "flag" : "flags"}: agrees with {r.verdicts.filter((x) => x.verdict === "agree").length}, disputes {r.verdicts.filter((x) => x.verdict === "dispute").length}, asks the authors about {r.verdicts.filter((x) => x.verdict === "ask-authors").length} (each with its reason in the flags table below).
              </p>
            ) : null}
            <ul className="mt-2 flex flex-col gap-2">
              {r.remarks.map((m) => (
                <li key={m.id} className="border-l-2 border-rule pl-2">
                  <p className="text-caption text-basalt-soft">On {m.anchor}</p>
                  <RichText html={m.html} />
                </li>
              ))}
            </ul>
          </article>
        ))}
      </section>

      <section className="card mt-6" id="flags">
        <FlagsTable rowsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags/table", p)} total={d.flagTotal} mode={mode} runHref={runHref} title="Flags and the reviewers' verdicts" />
      </section>

      <section className="card mt-6" aria-labelledby="dec-h">
        <h2 id="dec-h" className="text-lead">Decision</h2>
        {d.canDecide ? (
          <Form method="post" className="mt-3 flex flex-col gap-3">
            <input type="hidden" name="version" value={d.round.version} />
            <label className="flex flex-col gap-1">
              <span className="font-semibold">Decision</span>
              <select name="decision" defaultValue={d.round.decision ?? ""} className="field-input" required>
                <option value="" disabled>Choose…</option>
                {RECOMMENDATIONS.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
              </select>
            </label>
            <RichTextEditor id="letter" name="letter" label="Decision letter" initial={d.round.letter ?? undefined} />
            <div className="flex gap-3">
              <button className="btn-quiet" type="submit" name="intent" value="save-decision" disabled={busy}>Save draft</button>
              <button
                  onClick={(e) => {
                    if (!window.confirm("Release the decision to the authors? They are mailed the letter and the reviewers' remarks (as Reviewer 1, 2, …); it cannot be taken back.")) e.preventDefault();
                  }}
                  className="btn" type="submit" name="intent" value="release" disabled={busy}>Release decision to the authors</button>
            </div>
            <Notice result={actionData} form="decision" />
          </Form>
        ) : (
          <>
            <p data-testid="decision-released">Released {d.round.releasedAt ? new Date(d.round.releasedAt).toISOString().slice(0, 16).replace("T", " ") : ""} UTC: {decisionLabel(d.round.decision)}</p>
            <Notice result={actionData} form="decision" />
          </>
        )}
      </section>

      {d.digestRecipients ? <DigestNow params={p} recipients={d.digestRecipients} /> : null}

      <section className="card mt-6" aria-labelledby="audit-h">
        <h2 id="audit-h" className="text-lead">Audit log</h2>
        <ol className="mt-2 text-caption" data-testid="audit-log">
          {d.audit.map((a) => (
            <li key={a.id}>
              {new Date(a.at).toISOString().slice(0, 19).replace("T", " ")} UTC · {auditEntryLabel(a.action, a.detail)} · {a.actor ?? "someone without an account"}
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
