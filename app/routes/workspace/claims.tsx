import { eq } from "drizzle-orm";
import { Link, redirect } from "react-router";
import { flags } from "~db/schema";
import { ClaimEditor, claimDraftOf } from "~/components/workspace/claim-editor";
import { serviceError } from "~/workspace/action-errors.server";
import { requireWorkspace } from "~/workspace/access.server";
import { roundClaims } from "~/workspace/claims.server";
import { addClaim, parseJsonText } from "~/workspace/run-edits.server";
import { roundRunList } from "~/workspace/runs.server";
import type { Route } from "./+types/claims";

export const meta: Route.MetaFunction = () => [{ title: "Claims · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db, round, isAuthor } = await requireWorkspace(args, args.params.submissionId, { round: args.params.round });
  const [claims, runs, flagRows] = await Promise.all([
    roundClaims(db, round!.id),
    roundRunList(db, round!.id),
    db.select({ claimId: flags.claimId, severity: flags.severity }).from(flags).where(eq(flags.roundId, round!.id)),
  ]);
  return {
    claims: claims.map((c) => ({
      id: c.id,
      figure: c.figure,
      title: (c.record as { title?: string }).title ?? "",
      runs: ((c.record as { runs?: { label: string; part: string }[] }).runs ?? []).map((r) => `${r.label} (${r.part})`).join(", "),
      mismatches: flagRows.filter((f) => f.claimId === c.id && f.severity === "mismatch").length,
      flags: flagRows.filter((f) => f.claimId === c.id).length,
    })),
    runLabels: runs.map((r) => r.label),
    canEdit: isAuthor && round!.state === "draft",
  };
}

export async function action(args: Route.ActionArgs) {
  const { db, round, submission } = await requireWorkspace(args, args.params.submissionId, { round: args.params.round, write: true });
  const form = await args.request.formData();
  try {
    const row = await addClaim(db, round!.id, {
      record: parseJsonText(String(form.get("record") ?? "")),
      figure: String(form.get("figure") ?? "") || null,
      statement: String(form.get("statement") ?? ""),
    });
    throw redirect(`/venues/${submission.venueId}/submissions/${submission.id}/rounds/${round!.number}/claims/${row.id}`);
  } catch (e) {
    if (e instanceof Response) throw e;
    return serviceError(e);
  }
}

export default function Claims({ loaderData: d, params }: Route.ComponentProps) {
  const base = `/venues/${params.venueId}/submissions/${params.submissionId}/rounds/${params.round}`;
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
                    <Link to={`${base}/claims/${c.id}`}>{c.title || "(untitled)"}</Link>
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
          <ClaimEditor initial={claimDraftOf()} runLabels={d.runLabels} intent="create" action={`${base}/claims`} />
        </section>
      ) : null}
    </div>
  );
}
