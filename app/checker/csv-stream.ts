/**
 * Streaming CSV: feed chunks (e.g. from a file or an upload) line by line into typed columns.
 * Chunks are pulled with for-await, so no stream listener is added per chunk (none can pile up).
 */
import { ColumnBuilder, CsvLineReader, type CsvKind, type TypedColumns } from "./csv.ts";
import type { Columns } from "./schema.ts";

type Chunks = AsyncIterable<string | Uint8Array> | Iterable<string | Uint8Array>;

/** Reads every chunk into typed columns; memory is the columns (8 bytes a value) plus one chunk. */
export async function parseCsvStreamTyped(chunks: Chunks, kind: CsvKind): Promise<TypedColumns> {
  const b = new ColumnBuilder(kind);
  const reader = new CsvLineReader(b);
  const decoder = new TextDecoder("utf-8");
  for await (const c of chunks) reader.push(typeof c === "string" ? c : decoder.decode(c, { stream: true }));
  reader.push(decoder.decode());
  reader.end();
  return b.finishTyped();
}

export async function parseCsvStream(chunks: Chunks, kind: CsvKind): Promise<Columns> {
  const typed = await parseCsvStreamTyped(chunks, kind);
  const out: Columns = {};
  for (const [n, c] of Object.entries(typed)) out[n] = Array.from(c);
  return out;
}
