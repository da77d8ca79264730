import { eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { seriesFileMaps } from "~db/schema";
import type { CsvKind } from "~/checker/csv";
import type { SeriesFormat } from "~/checker/series-formats";

/** `series.columns`, `spectrum.hdf5`, …: one map per kind of file and format that needs one. */
export const mapKey = (kind: CsvKind, format: SeriesFormat) => `${kind}.${format}`;

/** The column and dataset maps the authors keep for a submission (empty when none is saved). */
export async function savedSeriesMaps(db: Database, submissionId: string): Promise<Record<string, string>> {
  const [row] = await db.select({ maps: seriesFileMaps.maps }).from(seriesFileMaps).where(eq(seriesFileMaps.submissionId, submissionId));
  return row?.maps ?? {};
}

/** Keeps a map that just read a file without error (so a failed upload stores nothing, not even its map). */
export async function saveSeriesMap(db: Database, submissionId: string, key: string, map: string) {
  const maps = { ...(await savedSeriesMaps(db, submissionId)), [key]: map };
  await db
    .insert(seriesFileMaps)
    .values({ submissionId, maps })
    .onConflictDoUpdate({ target: seriesFileMaps.submissionId, set: { maps, updatedAt: new Date() } });
}
