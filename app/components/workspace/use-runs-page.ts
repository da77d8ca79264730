import { useEffect, useRef, useState } from "react";
import { useFetcher } from "react-router";
import type { RunRow } from "~/workspace/view-types";

export const RUNS_PAGE_SIZE = 25;

export type SortKey = Exclude<keyof RunRow, "runId" | "origin" | "checking" | "updatedAt">;
type ApiItem = {
  id: string;
  label: string;
  version: number;
  origin: string;
  flagCounts: { mismatch: number; caution: number; note: number };
  columns: Pick<RunRow, "E" | "Ra" | "RaRotating" | "Pr" | "Pm" | "Rm" | "runLengthMagnetic">;
};
type ApiPage = { items: ApiItem[]; total: number; page: number; pageSize: number };

const toRow = (i: ApiItem): RunRow => ({ runId: i.id, label: i.label, version: i.version, origin: i.origin, ...i.columns, ...i.flagCounts });

/** Client-side order, the same rules as the API: unknown values last in both directions, ties by label. */
function localPage(rows: RunRow[], sort: { key: SortKey; dir: 1 | -1 }, page: number) {
  const sorted = [...rows].sort((a, b) => {
    const x = a[sort.key];
    const y = b[sort.key];
    if (x !== y) {
      if (x === null) return 1;
      if (y === null) return -1;
      return (x < y ? -1 : 1) * sort.dir;
    }
    return a.label.localeCompare(b.label, "en", { numeric: true });
  });
  return sorted.slice((page - 1) * RUNS_PAGE_SIZE, page * RUNS_PAGE_SIZE);
}

/**
 * The rows the runs table shows. With `source` (the round's `/api/v1/…/runs` route, read with
 * the session cookie), sorting and paging load through a fetcher, so the page neither reloads
 * nor navigates; the first page comes from the loader's rows (all of them, or with `firstPageOf`
 * only the first page of that many). When the loader revalidates (an
 * upload or a pushed run), the current page is fetched again so it does not go stale.
 */
export function useRunsPage(rows: RunRow[], source?: string, firstPageOf?: number) {
  const fetcher = useFetcher<ApiPage>();
  const [sort, setSortState] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: "label", dir: 1 });
  const [page, setPageState] = useState(1);
  const touched = useRef(false);

  const load = (nextSort: typeof sort, nextPage: number) => {
    setSortState(nextSort);
    setPageState(nextPage);
    if (!source) return;
    touched.current = true;
    const q = new URLSearchParams({ sort: nextSort.key, dir: nextSort.dir === 1 ? "asc" : "desc", page: String(nextPage), pageSize: String(RUNS_PAGE_SIZE) });
    fetcher.load(`${source}?${q}`);
  };

  useEffect(() => {
    if (touched.current) load(sort, page);
    // Only a new set of loader rows triggers this; sort and page changes load themselves.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [rows]);

  const remote = source && touched.current && fetcher.data && Array.isArray(fetcher.data.items) ? fetcher.data : null;
  // Given `firstPageOf`, the loader sent only the first page in SQL's order: shown as it is.
  const paged = source !== undefined && firstPageOf !== undefined;
  const total = remote ? remote.total : paged ? firstPageOf : rows.length;
  return {
    rows: remote ? remote.items.map(toRow) : paged ? rows : localPage(rows, sort, page),
    sort,
    setSort: (key: SortKey) => load({ key, dir: sort.key === key ? (-sort.dir as 1 | -1) : 1 }, 1),
    page,
    pages: Math.max(1, Math.ceil(total / RUNS_PAGE_SIZE)),
    setPage: (p: number) => load(sort, p),
    pending: fetcher.state !== "idle",
  };
}
