import { env } from "~/config/env.server";
import { requireRound } from "~/access/page-guards.server";
import { FORMAT_NAMES, formatOfFileName } from "~/checker/series-formats";
import { attachCsv } from "~/workspace/attachments.server";
import { mapKey, saveSeriesMap, savedSeriesMaps } from "~/workspace/series-maps.server";
import { InvalidInput, PayloadTooLarge, StateConflict, StorageUnavailable } from "~/workspace/types";
import type { Route } from "./+types/attachments";

const fail = (status: number, message: string, issues: { path: string; message: string }[] = []) =>
  Response.json({ error: { message, issues } }, { status });

/**
 * POST the file as the raw body (`?kind=series|spectrum&filename=…[&map=…]`): streamed to storage,
 * parsed, checked. The format follows the file name: .csv, .dat/.txt (whitespace-separated
 * columns), .h5 (HDF5), .nc (NetCDF). The last three need a map, given here (and then kept for the
 * submission once the file was read) or kept from an earlier upload.
 */
export async function action(args: Route.ActionArgs) {
  const { db, user, access } = await requireRound(args, "write-runs");
  const { round } = access;
  if (args.request.method !== "POST") return fail(405, "Use POST with the CSV file as the request body.");
  const url = new URL(args.request.url);
  const kind = url.searchParams.get("kind");
  if (kind !== "series" && kind !== "spectrum") return fail(400, 'Say which kind of file this is: ?kind=series or ?kind=spectrum.', [{ path: "kind", message: "must be series or spectrum" }]);
  const filename = (url.searchParams.get("filename") ?? `${kind}.csv`).slice(0, 200);
  const format = formatOfFileName(filename);
  if (!format) {
    return fail(400, `"${filename}" is not a file type Runproof reads; nothing was stored. Upload CSV (.csv), whitespace-separated columns (.dat or .txt), HDF5 (.h5) or NetCDF (.nc).`, [
      { path: "filename", message: "end the name in .csv, .dat, .txt, .h5 or .nc" },
    ]);
  }
  const given = url.searchParams.get("map")?.trim().slice(0, 4000) || null;
  const map = format === "csv" ? null : (given ?? (await savedSeriesMaps(db, access.submission.id))[mapKey(kind, format)] ?? null);
  const limitBytes = env.UPLOAD_LIMIT_MB * 1024 * 1024;
  const declared = Number(args.request.headers.get("content-length") ?? NaN);
  if (declared > limitBytes) {
    return fail(413, `The file "${filename}" is larger than the upload limit of ${env.UPLOAD_LIMIT_MB} MB; nothing was stored. Thin the series (e.g. every n-th row) or split it, then upload again.`);
  }
  if (!args.request.body) return fail(400, "The request has no body: send the CSV file as the body.");
  try {
    const attachment = await attachCsv(db, { roundId: round.id, runId: args.params.runId, kind, body: args.request.body, filename, userId: user.id, limitBytes, format, map });
    if (given && format !== "csv") await saveSeriesMap(db, access.submission.id, mapKey(kind, format), given);
    return Response.json({ attachment: { ...attachment, format: FORMAT_NAMES[format] } }, { status: 201 });
  } catch (e) {
    if (e instanceof InvalidInput) return fail(400, e.message, e.issues);
    if (e instanceof PayloadTooLarge) return fail(413, e.message);
    if (e instanceof StateConflict) return fail(409, e.message);
    if (e instanceof StorageUnavailable) return fail(503, e.message);
    throw e;
  }
}

export async function loader(args: Route.LoaderArgs) {
  await requireRound(args, "read-runs");
  return fail(405, "Use POST with the file (CSV, .dat/.txt, .h5 or .nc) as the request body.");
}
