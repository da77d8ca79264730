import { data } from "react-router";
import { AdvisoryNote } from "~/components/advisory-note";
import { RichText } from "~/components/review/rich-text";
import { requireRound } from "~/access/page-guards.server";
import { roundChanges } from "~/review/changes.server";
import type { Route } from "./+types/changes";
import { verdictLabel } from "~/review/labels";

export const meta: Route.MetaFunction = () => [{ title: "Changes between rounds · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-changes");
  const ctx = access;
  const changes = await roundChanges(db, ctx);
  if (!changes) throw data("Round 1 has no earlier round to compare with.", { status: 404 });
  return { title: ctx.submission.title, round: ctx.round.number, ...changes };
}

type Groups = Route.ComponentProps["loaderData"]["flags"]["added"];

function FlagGroups({ groups, testId }: { groups: Groups; testId: string }) {
  if (!groups.length) return <p className="text-caption text-basalt-soft" data-testid={testId}>None.</p>;
  return (
    <ul className="text-caption" data-testid={testId}>
      {groups.map((g) => (
        <li key={g.rule} className="mt-1">
          <strong>{g.rule}</strong>
          <ul className="ml-4">
            {g.runs.map((r) => (
              <li key={r.run}>
                {r.run}: {r.flags.map((f) => f.message).join(" · ")}
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ul>
  );
}

export default function Changes({ loaderData: d }: Route.ComponentProps) {
  return (
    <div>
      <h3 className="text-lead">Round {d.round} against round {d.previousNumber}</h3>
      <section className="card mt-4" aria-labelledby="fd-h">
        <h2 id="fd-h" className="text-lead">Flags diff</h2>
        <AdvisoryNote className="mt-2" />
        <p className="mt-2" data-testid="flags-diff-counts">
          {d.flags.counts.added} new · {d.flags.counts.resolved} resolved · {d.flags.counts.persisting} persisting
        </p>
        <div className="mt-2 grid gap-4 md:grid-cols-3">
          <div><h3 className="font-semibold">New</h3><FlagGroups groups={d.flags.added} testId="flags-new" /></div>
          <div><h3 className="font-semibold">Resolved</h3><FlagGroups groups={d.flags.resolved} testId="flags-resolved" /></div>
          <div><h3 className="font-semibold">Persisting</h3><FlagGroups groups={d.flags.persisting} testId="flags-persisting" /></div>
        </div>
      </section>
      <section className="card mt-4" aria-labelledby="pd-h">
        <h2 id="pd-h" className="text-lead">Parameters of each run</h2>
        <ul className="mt-2 flex flex-col gap-2" data-testid="param-diff">
          {d.runs.map((r) => (
            <li key={r.label}>
              <p className="font-semibold">
                {r.label}: {r.status === "revised" ? `version ${r.fromVersion} → ${r.toVersion}` : r.status === "new" ? `new in this round (version ${r.toVersion})` : `unchanged (version ${r.toVersion})`}
              </p>
              {r.changes.length ? (
                <table className="mt-1 text-caption">
                  <thead><tr><th scope="col" className="pr-3 text-left">Parameter</th><th scope="col" className="pr-3 text-left">Round {d.previousNumber}</th><th scope="col" className="text-left">Round {d.round}</th></tr></thead>
                  <tbody>
                    {r.changes.map((c) => (
                      <tr key={c.path}><td className="pr-3 font-mono">{c.path}</td><td className="pr-3">{c.before}</td><td>{c.after}</td></tr>
                    ))}
                  </tbody>
                </table>
              ) : null}
            </li>
          ))}
          {d.removed.map((l) => <li key={l}>{l}: removed in this round</li>)}
        </ul>
      </section>
      <section className="card mt-4" aria-labelledby="vr-h">
        <h2 id="vr-h" className="text-lead">Verdicts on flags in round {d.previousNumber} and the authors' answers</h2>
        {d.verdicts.length === 0 ? <p className="text-caption text-basalt-soft">No reviewer gave a verdict on a flag.</p> : null}
        <ul className="mt-2 flex flex-col gap-3" data-testid="verdict-changes">
          {d.verdicts.map((f) => (
            <li key={f.flagId} className="border-l-2 border-rule pl-2">
              <p className="text-caption"><span className="font-mono">{f.rule}</span>{f.runLabel ? ` · run ${f.runLabel}` : ""}: {f.message}</p>
              <ul className="mt-1 flex flex-col gap-1">
                {f.verdicts.map((v) => (
                  <li key={v.number} className="text-caption">
                    <strong>{v.reviewer}</strong> {verdictLabel(v.verdict).toLowerCase()}{v.reason ? `: ${v.reason}` : "."}
                    {v.verdict !== "agree" ? <><br /><strong>Answer:</strong> {v.answer ?? "not answered"}</> : null}
                  </li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      </section>
      <section className="card mt-4" aria-labelledby="rr-h">
        <h2 id="rr-h" className="text-lead">Remarks of round {d.previousNumber} and the authors' answers</h2>
        <ul className="mt-2 flex flex-col gap-3">
          {d.remarks.map((m) => (
            <li key={m.id} className="border-l-2 border-rule pl-2">
              <p className="text-caption text-basalt-soft">{m.reviewer}, on {m.anchor}</p>
              <RichText html={m.html} />
              <p className="mt-1 text-caption"><strong>Answer:</strong> {m.response ?? "not answered"}</p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
