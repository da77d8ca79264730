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
          // Wait for drain or close, then remove both listeners: one left behind per
          // drain would pile up on a long file (MaxListenersExceededWarning).
          await new Promise<void>((res) => {
            const done = () => {
              parser.off("drain", done);
              parser.off("close", done);
              res();
            };
            parser.on("drain", done);
            parser.on("close", done);
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
