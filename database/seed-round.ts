/** The demo submission's round 1: runs, claims, series and spectra, then the checker's flags. */
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { eq } from "drizzle-orm";
import { parseCsvTyped } from "../app/checker/csv";
import { resolvePolicy } from "../app/checker/policy";
import { analyseColumns } from "../app/workspace/attachment-analysis";
import { runSchema } from "../app/checker/schema";
import type { Env } from "../app/config/env-schema";
import { createS3Storage, s3SettingsFromEnv } from "../app/storage/s3";
import { createClaim } from "../app/workspace/claims.server";
import { recheckRound } from "../app/workspace/recheck.server";
import { createRun } from "../app/workspace/runs.server";
import type { Database } from "./client";
import { demoClaims, demoRuns } from "./demo-data";
import { attachments, roundRuns, rounds, storedFiles } from "./schema";

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
const demoDir = join(dirname(fileURLToPath(import.meta.url)), "demo");

/** Idempotent: a round that already has runs is left as it is. */
export async function seedDemoRound(tx: Tx, env: Env, opts: { submissionId: string; authorId: string }) {
  let [round] = await tx.select({ id: rounds.id }).from(rounds).where(eq(rounds.submissionId, opts.submissionId));
  if (!round) [round] = await tx.insert(rounds).values({ submissionId: opts.submissionId, number: 1 }).returning({ id: rounds.id });
  const roundId = round!.id;
  const [existing] = await tx.select({ runId: roundRuns.runId }).from(roundRuns).where(eq(roundRuns.roundId, roundId)).limit(1);
  if (existing) return { roundId, created: false };

  const storage = createS3Storage(s3SettingsFromEnv(env));
  for (const input of demoRuns) {
    const record = runSchema.parse(input);
    const { version } = await createRun(tx, { submissionId: opts.submissionId, roundId, record, origin: "seed", userId: opts.authorId });
    for (const kind of ["series", "spectrum"] as const) {
      const filename = `${record.label}-${kind}.csv`;
      const text = readFileSync(join(demoDir, filename), "utf8");
      const data = parseCsvTyped(text, kind);
      const key = `demo/${opts.submissionId}/${filename}`;
      await storage.put(key, text, "text/csv");
      const [file] = await tx
        .insert(storedFiles)
        .values({ key, filename, contentType: "text/csv", size: Buffer.byteLength(text), sha256: createHash("sha256").update(text).digest("hex"), uploadedBy: opts.authorId })
        .onConflictDoUpdate({ target: storedFiles.key, set: { size: Buffer.byteLength(text) } })
        .returning({ id: storedFiles.id });
      const columns = Object.keys(data);
      await tx.insert(attachments).values({ runVersionId: version.id, kind, fileId: file!.id, columns, rowCount: data[columns[0]!]!.length, ...analyseColumns(kind, data, resolvePolicy().mserBatch) });
    }
  }
  for (const claim of demoClaims) await createClaim(tx, roundId, claim);
  // recheckRound opens its own transaction; on a transaction handle that is a savepoint, so the seed stays one unit.
  await recheckRound(tx as unknown as Database, roundId);
  return { roundId, created: true };
}
