import { env } from "~/config/env.server";
import { requireRound } from "~/access/page-guards.server";
import { attachCsv } from "~/workspace/attachments.server";
import { InvalidInput, PayloadTooLarge, StateConflict, StorageUnavailable } from "~/workspace/types";
import type { Route } from "./+types/attachments";

const fail = (status: number, message: string, issues: { path: string; message: string }[] = []) =>
  Response.json({ error: { message, issues } }, { status });

/** POST a raw CSV body (`?kind=series|spectrum&filename=…`): streamed to storage, parsed, checked. */
export async function action(args: Route.ActionArgs) {
  const { db, user, access } = await requireRound(args, "write-runs");
  const { round } = access;
  if (args.request.method !== "POST") return fail(405, "Use POST with the CSV file as the request body.");
  const url = new URL(args.request.url);
  const kind = url.searchParams.get("kind");
  if (kind !== "series" && kind !== "spectrum") return fail(400, 'Say which kind of file this is: ?kind=series or ?kind=spectrum.', [{ path: "kind", message: "must be series or spectrum" }]);
  const filename = (url.searchParams.get("filename") ?? `${kind}.csv`).slice(0, 200);
  const limitBytes = env.UPLOAD_LIMIT_MB * 1024 * 1024;
  const declared = Number(args.request.headers.get("content-length") ?? NaN);
  if (declared > limitBytes) {
    return fail(413, `The file "${filename}" is larger than the upload limit of ${env.UPLOAD_LIMIT_MB} MB; nothing was stored. Thin the series (e.g. every n-th row) or split it, then upload again.`);
  }
  if (!args.request.body) return fail(400, "The request has no body: send the CSV file as the body.");
  try {
    const attachment = await attachCsv(db, { roundId: round.id, runId: args.params.runId, kind, body: args.request.body, filename, userId: user.id, limitBytes });
    return Response.json({ attachment }, { status: 201 });
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
  return fail(405, "Use POST with the CSV file as the request body.");
}
