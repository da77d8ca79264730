import { and, eq } from "drizzle-orm";
import { data, Form, href, redirect } from "react-router";
import { claims } from "~db/schema";
import { ClaimEditor, claimDraftOf } from "~/components/workspace/claim-editor";
import { FlagsPanel } from "~/components/workspace/flags-panel";
import { serviceError } from "~/workspace/action-errors.server";
import { requireRound } from "~/access/page-guards.server";
import { flagPanelView } from "~/workspace/flag-panel.server";
import { changeClaim, parseJsonText, removeClaim } from "~/workspace/run-edits.server";
import { roundRunLabels, roundRunsLabelled, type roundRunList } from "~/workspace/runs.server";
import { runPlotsMany } from "~/workspace/round-data.server";
import { ComparisonChart } from "~/components/workspace/lazy-plots";
import { StatedTable } from "~/components/workspace/stated-table";
import type { Route } from "./+types/claim";

export const meta: Route.MetaFunction = () => [{ title: "Claim · Runproof" }];

async function claimOfRound(db: Parameters<typeof roundRunList>[0], roundId: string, claimId: string) {
  if (!/^[0-9a-f-]{36}$/i.test(claimId)) throw data("Not found", { status: 404 });
  const [row] = await db.select().from(claims).where(and(eq(claims.id, claimId), eq(claims.roundId, roundId)));
  if (!row) throw data("Not found", { status: 404 });
  return row;
}

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-claims");
  const { round } = access;
  const claim = await claimOfRound(db, round.id, args.params.claimId);
  // The runs of the claim with an attached series, overlaid on one plot (stored downsampled copies).
  const named = [...new Set(((claim.record as { runs?: { label: string }[] }).runs ?? []).map((r) => r.label))].slice(0, 200);
  const [runs, flags, claimRuns] = await Promise.all([
    roundRunLabels(db, round.id),
    flagPanelView(db, round.id, { scope: { claim: claim.id }, groupings: ["rule", "run"], params: new URL(args.request.url).searchParams }),
    named.length > 1 ? roundRunsLabelled(db, round.id, named) : [],
  ]);
  const plots = claimRuns.length > 1 ? await runPlotsMany(db, claimRuns.map((r) => ({ versionId: r.versionId, label: r.label, record: r.record }))) : [];
  return {
    stated: claim.checkedKey === null ? null : (claim.statedResults ?? null),
    overlay: plots.flatMap((p) => (p.series ? [{ label: p.label, plot: p.series }] : [])),
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
      {d.overlay.length > 1 ? (
        <ComparisonChart runs={d.overlay} title={`The claim's runs overlaid: ${d.overlay.map((o) => o.label).join(", ")} (downsampled series)`} />
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
