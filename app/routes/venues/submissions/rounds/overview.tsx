import { Form, href, redirect } from "react-router";
import { requireRound } from "~/access/page-guards.server";
import { FlagsPanel } from "~/components/workspace/flags-panel";
import { ParameterSpaceChart } from "~/components/workspace/lazy-plots";
import { serviceError } from "~/workspace/action-errors.server";
import { flagPanelView } from "~/workspace/flag-panel.server";
import { roundRunPoints } from "~/workspace/round-data.server";
import { sendRound } from "~/workspace/send.server";
import { deleteDraftSubmission, draftSubmissionContents } from "~/workspace/removals.server";
import type { Route } from "./+types/overview";

export const meta: Route.MetaFunction = () => [{ title: "Round overview · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "open-round");
  // Someone invited to review, who has not answered yet, starts at the invitation.
  if (!access.can("read-flags")) throw redirect(href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", args.params));
  const round = access.round;
  const params = new URL(args.request.url).searchParams;
  const [flags, runs] = await Promise.all([flagPanelView(db, round.id, { groupings: ["rule", "claim", "run"], params }), roundRunPoints(db, round.id)]);
  return {
    checkError: round!.checkError,
    flags,
    runs,
    draft: round.state === "draft",
    version: round.version,
    canAnswer: access.can("answer-flags"),
    canSend: access.can("send-round"),
    showSendPanel: access.can("write-runs"),
    // Only a submission that was never sent can be deleted (round 1 still a draft).
    deletable: access.can("delete-draft") && round.number === 1 ? await draftSubmissionContents(db, access.submission.id) : null,
  };
}

export async function action(args: Route.ActionArgs) {
  const form = await args.request.formData();
  if (form.get("intent") === "delete-draft") {
    const { db, access } = await requireRound(args, "delete-draft");
    try {
      await deleteDraftSubmission(db, access.submission.id);
    } catch (e) {
      return serviceError(e);
    }
    throw redirect(`${href("/dashboard")}?deleted=1`);
  }
  const { db, access, user } = await requireRound(args, "send-round");
  try {
    await sendRound(db, { roundId: access.round.id, userId: user.id, expectedVersion: Number(form.get("version")) });
  } catch (e) {
    return serviceError(e);
  }
  throw redirect(new URL(args.request.url).pathname + "?sent=1");
}

export default function RoundOverview({ loaderData: d, actionData, params }: Route.ComponentProps) {
  const p = { venueId: params.venueId, submissionId: params.submissionId, round: params.round };
  const runId = new Map(d.runs.map((r) => [r.label, r.runId]));
  const open = d.flags.unanswered;
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <FlagsPanel
        view={d.flags}
        rowsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags", p)}
        checkError={d.checkError}
        runHref={(label, field) => {
          const id = runId.get(label);
          return id ? `${href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...p, runId: id })}${field ? `#${field}` : ""}` : null;
        }}
        claimHref={(id, row) => `${href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims/:claimId", { ...p, claimId: id })}${row !== null ? `#stated-${row}` : ""}`}
        answerAction={d.canAnswer ? (id) => href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags/:flagId/answer", { ...p, flagId: id }) : undefined}
      />
      <aside className="flex flex-col gap-4">
        {d.showSendPanel ? (
          <section className="card" aria-labelledby="send-h" data-testid="send-panel">
            <h3 id="send-h" className="text-lead">
              Send to the editor
            </h3>
            <p className="mt-1 text-caption">
              Sending freezes this round: its run versions and claims. Every mismatch flag must first be fixed (change the run or claim) or answered with an
              explanation.
            </p>
            <p className="mt-2 font-semibold" data-testid="open-mismatches">
              {open === 0 ? "No mismatch is left open." : `${open} mismatch flag(s) still open.`}
            </p>
            {actionData?.error ? (
              <p role="alert" className="field-error mt-2">
                {actionData.error.message}
              </p>
            ) : null}
            {d.canSend ? (
              <Form method="post" className="mt-3">
                <input type="hidden" name="version" value={d.version} />
                <button
                  onClick={(e) => {
                    if (!window.confirm(`Send round ${params.round} to the editor? The round freezes (runs, claims, manuscript as they are now); the venue's editors and your co-authors are told.`)) e.preventDefault();
                  }}
                  type="submit" className="btn disabled:cursor-not-allowed disabled:opacity-50" disabled={open > 0}>
                  Send round {params.round} to the editor
                </button>
              </Form>
            ) : (
              <p className="mt-2 text-caption">The corresponding author sends the round.</p>
            )}
            {d.deletable?.neverSent ? (
              <Form
                method="post"
                className="mt-4 border-t border-rule pt-3"
                onSubmit={(e) => {
                  const c = d.deletable!;
                  const what = `its ${c.runs} run${c.runs === 1 ? "" : "s"}, ${c.claims} claim${c.claims === 1 ? "" : "s"}, their flags and attached files, the manuscript file and the list of co-authors`;
                  if (!window.confirm(`Delete this draft submission for good? This removes ${what}. It was never sent, so nobody else has seen it.`)) e.preventDefault();
                }}
              >
                <input type="hidden" name="intent" value="delete-draft" />
                <button type="submit" className="btn-quiet btn">
                  Delete this draft submission
                </button>
              </Form>
            ) : null}
          </section>
        ) : (
          <p className="card text-caption" data-testid="sent-note">
            {d.draft ? "This round is a draft." : "This round was sent to the editor and is frozen."}
          </p>
        )}
        <ParameterSpaceChart points={d.runs} />
      </aside>
    </div>
  );
}
