import { eq, sql } from "drizzle-orm";
import { href, NavLink, Outlet } from "react-router";
import { flags } from "~db/schema";
import { requireRound, roundAccessMiddleware } from "~/access/page-guards.server";
import { LiveRound } from "~/components/workspace/live-round";
import { roundStateLabel } from "~/review/states";
import type { Route } from "./+types/layout";

/** Resolves what the person is to this round once; every child asks the policy for itself. */
export const middleware: Route.MiddlewareFunction[] = [roundAccessMiddleware];

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "open-round");
  const { round } = access;
  const counts = access.can("read-flags")
    ? await db.select({ severity: flags.severity, n: sql<number>`count(*)::int` }).from(flags).where(eq(flags.roundId, round.id)).groupBy(flags.severity)
    : [];
  return {
    round: { number: round.number, state: round.state, checkedAt: round.checkedAt?.toISOString() ?? null },
    tabs: {
      flags: access.can("read-flags"),
      runs: access.can("read-runs"),
      claims: access.can("read-claims"),
      files: access.can("read-files"),
      changes: round.number > 1 && access.can("read-changes"),
      decision: round.releasedAt !== null && access.can("read-decision"),
      review: access.can("read-own-review") || access.can("respond-invitation"),
      desk: access.can("read-reports"),
    },
    counts: Object.fromEntries(counts.map((c) => [c.severity, c.n])) as Record<string, number>,
  };
}

const tabClass = ({ isActive }: { isActive: boolean }) => `px-3 py-2 border-b-2 ${isActive ? "border-lichen font-semibold text-basalt" : "border-transparent"}`;

export default function RoundLayout({ loaderData: d, params }: Route.ComponentProps) {
  const p = { venueId: params.venueId, submissionId: params.submissionId, round: params.round };
  const { tabs } = d;
  return (
    <div className="mt-4">
      <div className="flex flex-wrap items-baseline gap-3">
        <h2 className="text-lead">Round {d.round.number}</h2>
        <span className="text-caption text-basalt-soft" data-testid="round-state">
          {d.round.state === "draft" ? "Draft, private to the authors" : `${roundStateLabel(d.round.state)}; frozen as sent`}
        </span>
        {tabs.flags ? (
          <span className="text-caption">
            <span className="text-ember">{d.counts.mismatch ?? 0} mismatch</span> · <span className="text-amber">{d.counts.caution ?? 0} caution</span> ·{" "}
            <span className="text-fjord">{d.counts.note ?? 0} note</span>
          </span>
        ) : null}
      </div>
      <nav aria-label="Round sections" className="mt-2 flex flex-wrap gap-1 border-b border-rule">
        {tabs.flags ? (
          <NavLink end to={href("/venues/:venueId/submissions/:submissionId/rounds/:round", p)} className={tabClass}>
            Overview and flags
          </NavLink>
        ) : null}
        {tabs.runs ? (
          <NavLink to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs", p)} className={tabClass}>
            Runs
          </NavLink>
        ) : null}
        {tabs.claims ? (
          <NavLink to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims", p)} className={tabClass}>
            Claims
          </NavLink>
        ) : null}
        {tabs.files ? (
          <NavLink to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/files", p)} className={tabClass}>
            Files
          </NavLink>
        ) : null}
        {tabs.changes ? (
          <NavLink to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/changes", p)} className={tabClass}>
            Changes since round {d.round.number - 1}
          </NavLink>
        ) : null}
        {tabs.decision ? (
          <NavLink to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/decision", p)} className={tabClass}>
            Decision
          </NavLink>
        ) : null}
        {tabs.review ? (
          <NavLink to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", p)} className={tabClass}>
            Your review
          </NavLink>
        ) : null}
        {tabs.desk ? (
          <NavLink to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", p)} className={tabClass}>
            Handling and decision
          </NavLink>
        ) : null}
      </nav>
      {tabs.flags ? <LiveRound submissionId={params.submissionId} round={d.round.number} loaded={d.round} /> : null}
      <div className="mt-4">
        <Outlet />
      </div>
    </div>
  );
}
