import { Fragment, type ReactNode } from "react";
import { Link } from "react-router";
import { sig4 } from "~/lib/sig-figs";
import type { RunRow } from "~/workspace/view-types";
import { useRunsPage } from "./use-runs-page";

const COLUMNS: { key: Exclude<keyof RunRow, "checking" | "updatedAt">; label: string; numeric?: boolean }[] = [
  { key: "label", label: "Run" },
  { key: "version", label: "Version", numeric: true },
  { key: "E", label: "E", numeric: true },
  { key: "RaRotating", label: "Ra (rotating)", numeric: true },
  { key: "Pr", label: "Pr", numeric: true },
  { key: "Pm", label: "Pm", numeric: true },
  { key: "Rm", label: "Rm", numeric: true },
  { key: "runLengthMagnetic", label: "Run length (magnetic times)", numeric: true },
  { key: "mismatch", label: "Mismatches", numeric: true },
  { key: "caution", label: "Cautions", numeric: true },
  { key: "note", label: "Notes", numeric: true },
];

/** The element id of a run's row, for links such as a remark's anchor. */
export const runAnchorId = (label: string) => `run-${label.replace(/[^A-Za-z0-9_-]/g, "_")}`;

/** A table cell or axis tick: four significant figures (2.5 × 10⁷ for large and small magnitudes); "—" when unknown. */
export function formatNumber(v: unknown): string {
  if (typeof v !== "number") return v === null || v === undefined ? "—" : String(v);
  return sig4(v);
}

/** One row per run with key controls, derived numbers and flag counts; sorted by any column. */
export function RunsTable({
  rows,
  total,
  runHref,
  csvHref,
  source,
  rowAction,
  rowDetail,
}: {
  rows: RunRow[];
  total?: number;
  runHref: (row: RunRow) => string;
  csvHref?: string;
  source?: string;
  /** An extra last cell per run (e.g. the reviewer's "Remark" button). */
  rowAction?: (row: RunRow) => ReactNode;
  /** A full-width row under a run (e.g. a remark composer opened beside it), or null. */
  rowDetail?: (row: RunRow) => ReactNode | null;
}) {
  // With `source`, sorting and paging go through a fetcher against the round's API route; `rows`
  // is then the first page (by label) of `total` runs.
  const { rows: sorted, sort, setSort, page, pages, setPage, pending } = useRunsPage(rows, source, total);
  return (
    <div>
      <div className="overflow-x-auto">
        <table className="w-full text-left text-caption" data-testid="runs-table" aria-busy={pending}>
          <caption className="sr-only">Runs of this round</caption>
          <thead>
            <tr className="border-b border-rule">
              {COLUMNS.map((c) => (
                <th key={c.key} scope="col" aria-sort={sort.key === c.key ? (sort.dir === 1 ? "ascending" : "descending") : "none"} className="py-1 pr-3">
                  <button type="button" className="font-semibold" onClick={() => c.key !== "runId" && c.key !== "origin" && setSort(c.key)}>
                    {c.label}
                    {sort.key === c.key ? (sort.dir === 1 ? " ▲" : " ▼") : ""}
                  </button>
                </th>
              ))}
              {rowAction ? (
                <th scope="col" className="py-1">
                  <span className="sr-only">Actions</span>
                </th>
              ) : null}
            </tr>
          </thead>
          <tbody>
            {sorted.map((r) => {
              const detail = rowDetail?.(r) ?? null;
              return (
                <Fragment key={r.runId}>
                  <tr id={runAnchorId(r.label)} className="border-b border-rule">
                    {COLUMNS.map((c) =>
                      c.key === "label" ? (
                        <th key={c.key} scope="row" className="whitespace-nowrap py-1 pr-3">
                          <Link to={runHref(r)}>{r.label}</Link>
                          {r.checking ? <span className="ml-1 font-normal text-basalt-soft">(checking…)</span> : null}
                        </th>
                      ) : (
                        <td key={c.key} className={`py-1 pr-3 ${c.key === "mismatch" && r.mismatch ? "font-semibold text-ember" : ""}`}>
                          {formatNumber(r[c.key])}
                        </td>
                      ),
                    )}
                    {rowAction ? <td className="py-1">{rowAction(r)}</td> : null}
                  </tr>
                  {detail ? (
                    <tr className="border-b border-rule">
                      <td colSpan={COLUMNS.length + (rowAction ? 1 : 0)} className="py-2">
                        {detail}
                      </td>
                    </tr>
                  ) : null}
                </Fragment>
              );
            })}
          </tbody>
        </table>
      </div>
      {pages > 1 ? (
        <nav aria-label="Pages of runs" className="mt-2 flex items-center gap-2 text-caption" data-testid="runs-pager">
          <button type="button" className="btn-quiet" disabled={page <= 1 || pending} onClick={() => setPage(page - 1)}>
            Previous
          </button>
          <span>
            Page {page} of {pages}
          </span>
          <button type="button" className="btn-quiet" disabled={page >= pages || pending} onClick={() => setPage(page + 1)}>
            Next
          </button>
        </nav>
      ) : null}
      {csvHref ? (
        <p className="mt-2 text-caption">
          <a href={csvHref} download>
            Download the table as CSV
          </a>
        </p>
      ) : null}
    </div>
  );
}
