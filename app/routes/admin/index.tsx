import { count } from "drizzle-orm";
import { outbox, submissions, user, venues } from "~db/schema";
import { requireAdmin } from "~/access/session.server";
import type { Route } from "./+types/index";

export async function loader(args: Route.LoaderArgs) {
  const { db } = await requireAdmin(args);
  const [[u], [v], [s], queued] = await Promise.all([
    db.select({ n: count() }).from(user),
    db.select({ n: count() }).from(venues),
    db.select({ n: count() }).from(submissions),
    db.select({ state: outbox.state, n: count() }).from(outbox).groupBy(outbox.state),
  ]);
  return { users: u?.n ?? 0, venues: v?.n ?? 0, submissions: s?.n ?? 0, outbox: queued };
}

export default function AdminOverview({ loaderData: d }: Route.ComponentProps) {
  return (
    <dl className="grid gap-4 sm:grid-cols-4">
      {[
        ["Accounts", d.users],
        ["Venues", d.venues],
        ["Submissions", d.submissions],
        ["Mail queued", d.outbox.find((o) => o.state === "queued")?.n ?? 0],
      ].map(([label, n]) => (
        <div key={label} className="card">
          <dt className="text-caption text-basalt-soft">{label}</dt>
          <dd className="font-mono text-title">{n}</dd>
        </div>
      ))}
    </dl>
  );
}
