import { eq, sql } from "drizzle-orm";
import { NavLink, Outlet } from "react-router";
import { flags } from "~db/schema";
import { LiveRound } from "~/components/workspace/live-round";
import { requireWorkspace } from "~/workspace/access.server";
import type { Route } from "./+types/round-layout";

export async function loader(args: Route.LoaderArgs) {
  const { db, round, isAuthor } = await requireWorkspace(args, args.params.submissionId, { round: args.params.round });
  const counts = await db
    .select({ severity: flags.severity, n: sql<number>`count(*)::int` })
    .from(flags)
    .where(eq(flags.roundId, round!.id))
    .groupBy(flags.severity);
  return {
    round: {
      number: round!.number,
      state: round!.state,
      checkedAt: round!.checkedAt?.toISOString() ?? null,
      // A change not yet checked by the worker: flags and numbers below describe the round before it.
      checking: round!.checkedSeq < round!.changeSeq,
      // The decision page is the authors' view of a released decision.
      showDecision: isAuthor && round!.releasedAt !== null,
    },
    counts: Object.fromEntries(counts.map((c) => [c.severity, c.n])) as Record<string, number> };
}

const tabClass = ({ isActive }: { isActive: boolean }) =>
  `px-3 py-2 border-b-2 ${isActive ? "border-lichen font-semibold text-basalt" : "border-transparent"}`;

export default function RoundLayout({ loaderData: d, params }: Route.ComponentProps) {
  const base = `/venues/${params.venueId}/submissions/${params.submissionId}/rounds/${params.round}`;
  return (
    <div className="mt-4">
      <div className="flex flex-wrap items-baseline gap-3">
        <h2 className="text-lead">Round {d.round.number}</h2>
        <span className="text-caption text-basalt-soft" data-testid="round-state">
          {d.round.state === "draft" ? "draft — private to the authors" : `sent (${d.round.state}) — frozen`}
        </span>
        <span className="text-caption">
          <span className="text-ember">{d.counts.mismatch ?? 0} mismatch</span> · <span className="text-amber">{d.counts.caution ?? 0} caution</span> ·{" "}
          <span className="text-fjord">{d.counts.note ?? 0} note</span>
        </span>
      </div>
      <nav aria-label="Round sections" className="mt-2 flex gap-1 border-b border-rule">
        <NavLink end to={base} className={tabClass}>
          Overview and flags
        </NavLink>
        <NavLink to={`${base}/runs`} className={tabClass}>
          Runs
        </NavLink>
        <NavLink to={`${base}/claims`} className={tabClass}>
          Claims
        </NavLink>
        <NavLink to={`${base}/files`} className={tabClass}>
          Files
        </NavLink>
        {d.round.number > 1 ? (
          <NavLink to={`${base}/changes`} className={tabClass}>
            Changes since round {d.round.number - 1}
          </NavLink>
        ) : null}
        {d.round.showDecision ? (
          <NavLink to={`${base}/decision`} className={tabClass}>
            Decision
          </NavLink>
        ) : null}
      </nav>
      {d.round.checking ? (
        <p role="status" className="mt-2 text-caption text-basalt-soft" data-testid="round-checking">
          Checking… the flags and numbers below describe the round before your last change; this page updates by itself when the check is done.
        </p>
      ) : null}
      <LiveRound submissionId={params.submissionId} round={d.round.number} loaded={d.round} />
      <div className="mt-4">
        <Outlet />
      </div>
    </div>
  );
}
