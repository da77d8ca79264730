import { requireRound } from "~/access/page-guards.server";
import { toCsv } from "~/workspace/csv-export";
import { roundRunRows } from "~/workspace/round-data.server";
import type { Route } from "./+types/runs-csv";

/** The runs table of a round as CSV (RFC 4180), the same columns as on screen. */
export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-runs");
  const { round } = access;
  const rows = await roundRunRows(db, round.id);
  const header = ["run", "version", "origin", "E", "Ra_classical", "Ra_rotating", "Pr", "Pm", "Rm", "run_length_magnetic", "mismatches", "cautions", "notes"];
  const body = toCsv(
    header,
    rows.map((r) => [r.label, r.version, r.origin, r.E, r.Ra, r.RaRotating, r.Pr, r.Pm, r.Rm, r.runLengthMagnetic, r.mismatch, r.caution, r.note]),
  );
  return new Response(body, {
    headers: {
      "content-type": "text/csv; charset=utf-8; header=present",
      "content-disposition": `attachment; filename="round-${round.number}-runs.csv"`,
    },
  });
}
