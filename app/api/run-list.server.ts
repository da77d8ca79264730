import type { Database } from "~db/client";
import { roundRunCount, roundRunRows } from "~/workspace/round-data.server";
import { RUN_COLUMNS, type runsQuerySchema } from "./schemas";
import type * as z from "zod";

type Query = z.infer<typeof runsQuerySchema>;

/**
 * One page of a round's runs in the requested order, sorted and paged in SQL from the stored
 * checks. Unknown values (null) sort last in both directions, as in the table; ties fall back
 * to the label so pages are stable between calls.
 */
export async function runPage(db: Database, roundId: string, query: Query) {
  const [rows, total] = await Promise.all([
    roundRunRows(db, roundId, { sort: query.sort, dir: query.dir, limit: query.pageSize, offset: (query.page - 1) * query.pageSize }),
    roundRunCount(db, roundId),
  ]);
  const items = rows.map((r) => ({
    id: r.runId,
    label: r.label,
    version: r.version,
    origin: r.origin,
    updatedAt: r.updatedAt ?? new Date(0).toISOString(),
    flagCounts: { mismatch: r.mismatch, caution: r.caution, note: r.note },
    columns: Object.fromEntries(RUN_COLUMNS.map((k) => [k, r[k]])) as Record<(typeof RUN_COLUMNS)[number], number | null>,
  }));
  return { ...query, total, items };
}
