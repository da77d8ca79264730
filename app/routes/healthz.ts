import { sql } from "drizzle-orm";
import { dbContext } from "~/db.server";
import type { Route } from "./+types/healthz";

/** Readiness: answers 200 only when the database answers. */
export async function loader({ context }: Route.LoaderArgs) {
  try {
    await context.get(dbContext).execute(sql`select 1`);
    return Response.json({ ok: true });
  } catch {
    return Response.json({ ok: false, reason: "database unreachable" }, { status: 503 });
  }
}
