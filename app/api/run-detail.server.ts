import { and, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { attachments, storedFiles } from "~db/schema";
import { check } from "~/checker";
import { loadRoundInputs } from "~/workspace/recheck.server";
import { apiError } from "./errors.server";
import { ADVISORY, noFlags, runFlags } from "./views.server";

/**
 * One run of a round as the API returns it: the record of the version the round uses, the
 * values the checker recomputes from it (under the venue's policy), its stored flags and files.
 */
export async function runDetail(db: Database, roundId: string, runId: string) {
  const inputs = await loadRoundInputs(db, roundId);
  const row = inputs.runRows.find((r) => r.runId === runId);
  if (!row) throw apiError(404, "not_found", "No such run in this round.");
  let derived: Record<string, unknown> = {};
  try {
    const out = check({ runs: inputs.runs, series: inputs.series, spectra: inputs.spectra, policy: inputs.policy as never });
    derived = (out.runs.find((r) => r.label === row.label)?.derived ?? {}) as Record<string, unknown>;
  } catch {
    // Records were validated when stored; a stricter checker later leaves `derived` empty rather than failing the read.
  }
  const [flags, files] = await Promise.all([
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
