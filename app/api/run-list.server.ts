import type { Database } from "~db/client";
import { roundRunRows } from "~/workspace/round-data.server";
import { roundRunList } from "~/workspace/runs.server";
import { RUN_COLUMNS, type runsQuerySchema } from "./schemas";
import type * as z from "zod";

type Query = z.infer<typeof runsQuerySchema>;
type Item = Awaited<ReturnType<typeof runItems>>[number];

/** The runs of a round with the runs table's columns (the same numbers the pages show). */
async function runItems(db: Database, roundId: string) {
  const [rows, versions] = await Promise.all([roundRunRows(db, roundId), roundRunList(db, roundId)]);
  const updated = new Map(versions.map((v) => [v.runId, v.updatedAt.toISOString()]));
  return rows.map((r) => ({
    id: r.runId,
    label: r.label,
    version: r.version,
    origin: r.origin,
    updatedAt: updated.get(r.runId) ?? new Date(0).toISOString(),
    flagCounts: { mismatch: r.mismatch, caution: r.caution, note: r.note },
    columns: Object.fromEntries(RUN_COLUMNS.map((k) => [k, r[k]])) as Record<(typeof RUN_COLUMNS)[number], number | null>,
  }));
}

function sortValue(item: Item, key: Query["sort"]): string | number | null {
  switch (key) {
    case "label":
    case "updatedAt":
      return item[key];
    case "version":
      return item.version;
    case "flags":
      return item.flagCounts.mismatch * 1e6 + item.flagCounts.caution * 1e3 + item.flagCounts.note;
    case "mismatch":
    case "caution":
    case "note":
      return item.flagCounts[key];
    default:
      return item.columns[key];
  }
}

/**
 * One page of a round's runs in the requested order. Unknown values (null) sort last in both
 * directions, as in the table; ties fall back to the label so pages are stable between calls.
 */
export async function runPage(db: Database, roundId: string, query: Query) {
  const items = await runItems(db, roundId);
  const sign = query.dir === "asc" ? 1 : -1;
  items.sort((a, b) => {
    const x = sortValue(a, query.sort);
    const y = sortValue(b, query.sort);
    if (x !== y) {
      if (x === null) return 1;
      if (y === null) return -1;
      const c = typeof x === "string" ? x.localeCompare(String(y), "en", { numeric: true }) : x - (y as number);
      if (c !== 0) return sign * c;
    }
    return a.label.localeCompare(b.label, "en", { numeric: true });
  });
  const start = (query.page - 1) * query.pageSize;
  return { ...query, total: items.length, items: items.slice(start, start + query.pageSize) };
}
