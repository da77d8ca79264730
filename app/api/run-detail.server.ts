import { and, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { attachments, storedFiles } from "~db/schema";
import { storedDerived } from "~/workspace/round-data.server";
import { roundRunList } from "~/workspace/runs.server";
import { apiError } from "./errors.server";
import { ADVISORY, noFlags, runFlags } from "./api-views.server";

/**
 * One run of a round as the API returns it: the record of the version the round uses, the
 * values the checker derived from it (under the venue's policy, stored by the check job), its stored flags and files.
 */
export async function runDetail(db: Database, roundId: string, runId: string) {
  const row = (await roundRunList(db, roundId)).find((r) => r.runId === runId);
  if (!row) throw apiError(404, "not_found", "No such run in this round.");
  // The values the check job stored for this version ({} until its check has landed).
  const [derived, flags, files] = await Promise.all([
    storedDerived(db, row.versionId),
    runFlags(db, roundId, row.label),
    db
      .select({ id: attachments.id, kind: attachments.kind, filename: storedFiles.filename, columns: attachments.columns, rowCount: attachments.rowCount, createdAt: attachments.createdAt })
      .from(attachments)
      .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
      .where(and(eq(attachments.runVersionId, row.versionId), eq(attachments.active, true))),
  ]);
  const flagCounts = noFlags();
  for (const f of flags) flagCounts[f.severity] += 1;
  return {
    id: row.runId,
    label: row.label,
    version: row.version,
    origin: row.origin,
    updatedAt: row.updatedAt.toISOString(),
    flagCounts,
    record: row.record,
    derived,
    flags,
    attachments: files.map((f) => ({ ...f, createdAt: f.createdAt.toISOString() })),
    advisory: ADVISORY,
  };
}
