import { and, eq, isNotNull, sql } from "drizzle-orm";
import { href, Link, redirect } from "react-router";
import { flags } from "~db/schema";
import { ClaimEditor, claimDraftOf } from "~/components/workspace/claim-editor";
import { serviceError } from "~/workspace/action-errors.server";
import { requireRound } from "~/access/page-guards.server";
import { roundClaims } from "~/workspace/claims.server";
import { addClaim, parseJsonText } from "~/workspace/run-edits.server";
import { roundRunLabels } from "~/workspace/runs.server";
import type { Route } from "./+types/index";

export const meta: Route.MetaFunction = () => [{ title: "Claims · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-claims");
  const { round } = access;
  const [claims, runs, flagRows] = await Promise.all([
    roundClaims(db, round.id),
    roundRunLabels(db, round.id),
    db
      .select({ claimId: flags.claimId, all: sql<number>`count(*)::int`, mismatches: sql<number>`(count(*) filter (where ${flags.severity} = 'mismatch'))::int` })
      .from(flags)
      .where(and(eq(flags.roundId, round.id), isNotNull(flags.claimId)))
      .groupBy(flags.claimId),
  ]);
  const counts = new Map(flagRows.map((f) => [f.claimId, f]));
  return {
    claims: claims.map((c) => ({
      id: c.id,
      figure: c.figure,
      title: (c.record as { title?: string }).title ?? "",
      runs: ((c.record as { runs?: { label: string; part: string }[] }).runs ?? []).map((r) => `${r.label} (${r.part})`).join(", "),
      mismatches: counts.get(c.id)?.mismatches ?? 0,
      flags: counts.get(c.id)?.all ?? 0,
    })),
    runLabels: runs.map((r) => r.label),
    canEdit: access.can("write-claims"),
  };
}

export async function action(args: Route.ActionArgs) {
  const { db, access } = await requireRound(args, "write-claims");
  const { round } = access;
  const form = await args.request.formData();
  try {
    const row = await addClaim(db, round.id, {
      record: parseJsonText(String(form.get("record") ?? "")),
      figure: String(form.get("figure") ?? "") || null,
      statement: String(form.get("statement") ?? ""),
    });
    throw redirect(href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims/:claimId", { ...args.params, claimId: row.id }));
  } catch (e) {
    if (e instanceof Response) throw e;
    return serviceError(e);
  }
}

export default function Claims({ loaderData: d, params }: Route.ComponentProps) {
  const p = { venueId: params.venueId, submissionId: params.submissionId, round: params.round };
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="claims-h">
        <h3 id="claims-h" className="text-lead">
          Claims
        </h3>
        {d.claims.length === 0 ? (
          <p className="text-caption">No claims yet: a claim ties a figure or statement of the manuscript to the runs it rests on.</p>
        ) : (
          <table className="mt-2 w-full text-left text-caption" data-testid="claims-table">
            <thead>
              <tr className="border-b border-rule">
                <th scope="col">Figure</th>
                <th scope="col">Title</th>
                <th scope="col">Runs</th>
                <th scope="col">Flags</th>
              </tr>
            </thead>
            <tbody>
              {d.claims.map((c) => (
                <tr key={c.id} className="border-b border-rule">
                  <td className="py-1">{c.figure ?? "—"}</td>
                  <td>
                    <Link to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims/:claimId", { ...p, claimId: c.id })}>{c.title || "(untitled)"}</Link>
                  </td>
                  <td>{c.runs}</td>
                  <td className={c.mismatches ? "text-ember" : ""}>
                    {c.flags} ({c.mismatches} mismatch)
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      {d.canEdit ? (
        <section aria-labelledby="new-claim-h" className="card">
          <h3 id="new-claim-h" className="text-lead">
            Write a claim
          </h3>
          <ClaimEditor initial={claimDraftOf()} runLabels={d.runLabels} intent="create" action={href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims", p)} />
        </section>
      ) : null}
    </div>
  );
}
