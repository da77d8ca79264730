/** Streaming CSV: feed chunks (e.g. from a file or an upload) through csv-parse's stream API. */
import { parse } from "csv-parse";
import { ColumnBuilder, CSV_OPTIONS, wrapCsvError, type CsvKind } from "./csv.ts";
import type { Columns } from "./schema.ts";

type Chunks = AsyncIterable<string | Uint8Array> | Iterable<string | Uint8Array>;

export async function parseCsvStream(chunks: Chunks, kind: CsvKind): Promise<Columns> {
  const parser = parse(CSV_OPTIONS);
  const b = new ColumnBuilder(kind);
  let feedError: unknown;
  const feed = (async () => {
    try {
      for await (const c of chunks) {
        if (parser.destroyed) return;
        if (!parser.write(c)) {
          await new Promise<void>((res) => {
            parser.once("drain", res);
            parser.once("close", res);
          });
        }
      }
    } catch (e) {
      feedError = e;
    } finally {
      if (!parser.destroyed) parser.end();
    }
  })();
  try {
    for await (const r of parser as AsyncIterable<{ record: string[]; info: { lines: number } }>) b.add(r.record, r.info.lines);
  } catch (e) {
    parser.destroy();
    wrapCsvError(e);
  }
  await feed;
  if (feedError !== undefined) throw feedError;
  return b.finish();
}
