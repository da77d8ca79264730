import { Form, href, redirect } from "react-router";
import { ClaimEditor, claimDraftOf } from "~/components/workspace/claim-editor";
import { FlagsPanel } from "~/components/workspace/flags-panel";
import { serviceError } from "~/workspace/action-errors.server";
import { notFound, requireRound } from "~/access/page-guards.server";
import { claimRunLabels, roundClaim } from "~/workspace/claims.server";
import { flagPanelView } from "~/workspace/flag-panel.server";
import { changeClaim, parseJsonText, removeClaim } from "~/workspace/run-edits.server";
import { roundRunLabels, roundRunVersionsLabelled } from "~/workspace/runs.server";
import { claimOverlayRuns } from "~/workspace/round-data.server";
import { ClaimOverlayPanel } from "~/components/workspace/claim-overlay-panel";
import { StatedTable } from "~/components/workspace/stated-table";
import type { Route } from "./+types/claim";

export const meta: Route.MetaFunction = () => [{ title: "Claim · Runproof" }];

async function claimOfRound(db: Parameters<typeof roundClaim>[0], roundId: string, claimId: string) {
  const row = await roundClaim(db, roundId, claimId);
  if (!row) throw notFound();
  return row;
}

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-claims");
  const { round } = access;
  const claim = await claimOfRound(db, round.id, args.params.claimId);
  // The runs of the claim with an analysed series, overlaid on one plot: the page names them; the
  // chart reads their stored downsampled copies from the claim's plots route once on screen.
  const named = claimRunLabels(claim.record);
  const [runs, flags, claimRuns] = await Promise.all([
    roundRunLabels(db, round.id),
    flagPanelView(db, round.id, { scope: { claim: claim.id }, groupings: ["rule", "run"], params: new URL(args.request.url).searchParams }),
    named.length > 1 ? roundRunVersionsLabelled(db, round.id, named) : [],
  ]);
  const overlay = claimRuns.length > 1 ? await claimOverlayRuns(db, claimRuns) : { labels: [], overlayKey: "", analysing: false };
  return {
    stated: claim.checkedKey === null ? null : (claim.statedResults ?? null),
    overlay: { labels: overlay.labels, key: overlay.overlayKey },
    checkError: round!.checkError,
    claim: { id: claim.id, version: claim.version, figure: claim.figure, statement: claim.statement, record: claim.record },
    runs: runs.map((r) => ({ id: r.runId, label: r.label })),
    flags,
    canEdit: access.can("write-claims"),
  };
}

export async function action(args: Route.ActionArgs) {
  const { db, access } = await requireRound(args, "write-claims");
  const { round } = access;
  const claim = await claimOfRound(db, round.id, args.params.claimId);
  const form = await args.request.formData();
  try {
    if (form.get("intent") === "delete") {
      await removeClaim(db, round.id, claim.id);
      throw redirect(href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims", args.params));
    }
    await changeClaim(db, round.id, claim.id, Number(form.get("version")), {
      record: parseJsonText(String(form.get("record") ?? "")),
      figure: String(form.get("figure") ?? "") || null,
      statement: String(form.get("statement") ?? ""),
    });
    return { ok: true };
  } catch (e) {
    if (e instanceof Response) throw e;
    return serviceError(e);
  }
}

export default function Claim({ loaderData: d, params }: Route.ComponentProps) {
  const p = { venueId: params.venueId, submissionId: params.submissionId, round: params.round };
  const runId = new Map(d.runs.map((r) => [r.label, r.id]));
  return (
    <div className="flex flex-col gap-6">
      <section className="card" aria-label="Claim">
        <ClaimEditor
          initial={claimDraftOf(d.claim)}
          runLabels={d.runs.map((r) => r.label)}
          intent="update"
          version={d.claim.version}
          readOnly={!d.canEdit}
        />
        {d.canEdit ? (
          <Form
            method="post"
            className="mt-4"
            onSubmit={(e) => {
              const title = [d.claim.figure, (d.claim.record as unknown as { title?: string } | null)?.title].filter(Boolean).join(": ") || "this claim";
              const stated = ((d.claim.record as unknown as { stated?: unknown[] } | null)?.stated ?? []).length;
              if (!window.confirm(`Delete the claim "${title}" from round ${params.round}? Its ${stated} stated value${stated === 1 ? "" : "s"} and its flags (with any answers to them) are removed; the runs stay.`)) e.preventDefault();
            }}
          >
            <input type="hidden" name="intent" value="delete" />
            <button type="submit" className="btn-quiet btn">
              Delete the claim
            </button>
          </Form>
        ) : null}
      </section>
      <StatedTable rows={d.stated} runIds={Object.fromEntries(runId)} params={p} />
      {d.overlay.labels.length > 1 ? (
        <ClaimOverlayPanel plotsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims/:claimId/plots", { ...p, claimId: d.claim.id })} overlayKey={d.overlay.key} />
      ) : null}
      <FlagsPanel
        view={d.flags}
        rowsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags", p)}
        checkError={d.checkError}
        runHref={(label) => (runId.get(label) ? href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...p, runId: runId.get(label)! }) : null)}
        claimHref={(_id, row) => (row !== null ? `#checked-${row}` : "#")}
        answerAction={d.canEdit ? (id) => href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags/:flagId/answer", { ...p, flagId: id }) : undefined}
      />
    </div>
  );
}
