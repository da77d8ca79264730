import { createHash, randomUUID } from "node:crypto";
import { PassThrough } from "node:stream";
import { setImmediate as nextTurn } from "node:timers/promises";
import { and, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { attachments, roundRuns, storedFiles } from "~db/schema";
import { CsvFormatError, type TypedColumns } from "~/checker/csv";
import { checkMap, FORMAT_CONTENT_TYPES, FORMAT_NAMES, readSeriesFile, type SeriesFormat } from "~/checker/series-formats";
import { storage } from "~/storage/storage.server";
import { markRoundChanged, requestRecheck } from "./recheck.server";
import { draftRoundById } from "./rounds.server";
import { InvalidInput, PayloadTooLarge, StorageUnavailable } from "./types";

/** Parse at most this long before the event loop gets a turn (an upload must not stall other requests). */
const YIELD_AFTER_MS = 8;

export type AttachOptions = {
  roundId: string;
  runId: string;
  kind: "series" | "spectrum";
  body: ReadableStream<Uint8Array>;
  filename: string;
  userId: string;
  limitBytes: number;
  /** csv (the default), columns (.dat/.txt), hdf5 or netcdf; all but csv need `map`. */
  format?: SeriesFormat;
  /** The column map (columns) or dataset map (hdf5, netcdf) that names the file's columns. */
  map?: string | null;
};

const EXTENSIONS: Record<SeriesFormat, string> = { csv: "csv", columns: "txt", hdf5: "h5", netcdf: "nc" };

/** How to fix a file of each format that could not be read. */
function fixHint(format: SeriesFormat, kind: string) {
  if (format === "csv") return "Fix the line named below and upload again.";
  if (format === "columns") return `Fix the line named below, or the column map (names in file order, first ${kind === "series" ? "t" : "l"}, "-" skips a column), and upload again.`;
  return `Check the dataset map (first ${kind === "series" ? "t" : "l"}; "column:path/in/file" reads a dataset under another name) against the file, and upload again.`;
}

const mb = (n: number) => `${(n / 1024 / 1024).toFixed(n < 1024 * 1024 ? 2 : 0)} MB`;

/**
 * Attaches a time series or spectrum to the version of a run that a draft round uses: CSV, or a
 * whitespace-separated column file, HDF5 or NetCDF file with the map naming its columns.
 * The body is read once: each chunk goes both to object storage and to the parser (text formats
 * line by line, so a large file is never held whole in memory; array formats, whose layout needs
 * random access, within the same size limit). The size limit is enforced while reading. On any
 * failure the uploaded object is removed and no row is written.
 */
export async function attachCsv(db: Database, opts: AttachOptions): Promise<{ attachmentId: string; rowCount: number; columns: string[] }> {
  const format = opts.format ?? "csv";
  let map: string | null;
  try {
    map = checkMap(format, opts.map);
  } catch (e) {
    if (!(e instanceof CsvFormatError)) throw e;
    throw new InvalidInput(`The ${opts.kind} file "${opts.filename}" (${FORMAT_NAMES[format]}) cannot be read without a valid map; nothing was stored.`, [
      { path: format === "columns" ? "column map" : "dataset map", message: e.message },
    ]);
  }
  await draftRoundById(db, opts.roundId);
  const [pointer] = await db
    .select({ runVersionId: roundRuns.runVersionId })
    .from(roundRuns)
    .where(and(eq(roundRuns.roundId, opts.roundId), eq(roundRuns.runId, opts.runId)));
  if (!pointer) throw new InvalidInput("No such run in this round.", [{ path: "runId", message: "The run is not part of this round." }]);

  const key = `attachments/${opts.roundId}/${opts.runId}/${randomUUID()}.${EXTENSIONS[format]}`;
  const hash = createHash("sha256");
  const toStorage = new PassThrough();
  let size = 0;
  let tooLarge = false;
  let uploaded = false;
  // Set when object storage fails (down, refusing): reading stops and the caller is told to retry.
  let storageError: unknown = null;
  // Set when this function abandons the upload itself (bad CSV, too large): not a storage failure.
  let abandoned = false;
  toStorage.on("error", () => {});

  // One pass over the body: count, hash, forward to storage (respecting its back-pressure), parse.
  async function* chunks() {
    const reader = opts.body.getReader();
    let turnStarted = performance.now();
    try {
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        size += value.byteLength;
        if (size > opts.limitBytes) {
          tooLarge = true;
          throw new PayloadTooLarge(
            `The file "${opts.filename}" is larger than the upload limit of ${mb(opts.limitBytes)}; nothing was stored. Thin the series (e.g. every n-th row) or split it, then upload again.`,
          );
        }
        if (storageError) throw storageError;
        hash.update(value);
        // "close" too: after a failure the stream is destroyed and will never drain.
        if (!toStorage.write(value)) {
          await new Promise<void>((res) => {
            const done = () => (toStorage.off("drain", done), toStorage.off("close", done), res());
            toStorage.once("drain", done);
            toStorage.once("close", done);
          });
        }
        yield value;
        // Chunks already buffered come back as settled promises, so the loop would parse a backlog of
        // megabytes without giving the event loop a turn; probes, timers and other requests would wait.
        if (performance.now() - turnStarted > YIELD_AFTER_MS) {
          await nextTurn();
          turnStarted = performance.now();
        }
      }
    } finally {
      reader.releaseLock();
    }
  }

  const upload = storage.put(key, toStorage, FORMAT_CONTENT_TYPES[format]).then(() => (uploaded = true));
  upload.catch((e) => {
    if (abandoned) return;
    storageError = e;
    toStorage.destroy();
  });
  let columns: TypedColumns;
  try {
    // The parse only validates (text line by line, chunk by chunk, so other requests keep being
    // served); the statistics and the plot copy are made once by the check job.
    columns = await readSeriesFile(chunks(), { kind: opts.kind, format, map, limitBytes: opts.limitBytes });
    if (tooLarge) throw new PayloadTooLarge(`The file "${opts.filename}" is larger than the upload limit of ${mb(opts.limitBytes)}; nothing was stored.`);
    toStorage.end();
    await upload;
  } catch (e) {
    abandoned = !storageError;
    toStorage.destroy();
    await upload.catch(() => {});
    await storage.remove(key).catch(() => {});
    if (tooLarge) {
      throw e instanceof PayloadTooLarge ? e : new PayloadTooLarge(`The file "${opts.filename}" is larger than the upload limit of ${mb(opts.limitBytes)}; nothing was stored.`);
    }
    // A file that could not be read first: destroying the stream after it aborts the upload too,
    // which is no storage fault.
    if (e instanceof CsvFormatError) {
      throw new InvalidInput(`The ${opts.kind} ${FORMAT_NAMES[format]} file "${opts.filename}" could not be read; nothing was stored. ${fixHint(format, opts.kind)}`, [
        { path: e.line !== undefined ? `line ${e.line}` : "file", message: e.message.replace(/^line \d+: /, "") },
      ]);
    }
    if (storageError) {
      throw new StorageUnavailable(`The file "${opts.filename}" could not be stored: file storage is not answering. Nothing was saved; upload it again in a minute.`);
    }
    throw e;
  }

  const names = Object.keys(columns);
  const rowCount = columns[names[0]!]?.length ?? 0;
  let attachmentId: string;
  try {
    attachmentId = await db.transaction(async (tx) => {
      // Raising the round's change counter first takes the round's row lock, so two uploads to one
      // run wait for each other here: the second then sees the first as current and retires it
      // (done last, both stayed "current").
      await markRoundChanged(tx, opts.roundId);
      const [file] = await tx
        .insert(storedFiles)
        .values({ key, filename: opts.filename, contentType: FORMAT_CONTENT_TYPES[format], size, sha256: hash.digest("hex"), uploadedBy: opts.userId })
        .returning({ id: storedFiles.id });
      await tx
        .update(attachments)
        .set({ active: false })
        .where(and(eq(attachments.runVersionId, pointer.runVersionId), eq(attachments.kind, opts.kind), eq(attachments.active, true)));
      const [row] = await tx
        .insert(attachments)
        .values({ runVersionId: pointer.runVersionId, kind: opts.kind, fileId: file!.id, columns: names, rowCount, format, sourceMap: map })
        .returning({ id: attachments.id });
      return row!.id;
    });
  } catch (e) {
    if (uploaded) await storage.remove(key).catch(() => {});
    throw e;
  }
  // The check job analyses the file and re-checks this run and the claims naming it.
  await requestRecheck(db, opts.roundId, { alreadyMarked: true });
  return { attachmentId, rowCount, columns: names };
}
