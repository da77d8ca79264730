/**
 * One entry point for every file format a series or spectrum may come in: CSV with a header,
 * whitespace-separated columns without one (named by a column map), HDF5 and NetCDF (named by a
 * dataset map). Reads chunks of any size; text formats are parsed line by line as they stream,
 * array formats (whose layout needs random access) are gathered first — the caller bounds the bytes.
 */
import { parseDatasetMap, readHdf5Typed, readNetcdfTyped } from "./array-files.ts";
import { ColumnTextReader, parseColumnMap } from "./column-text.ts";
import { CsvFormatError, type CsvKind, type TypedColumns } from "./csv.ts";
import { parseCsvStreamTyped } from "./csv-stream.ts";

export const SERIES_FORMATS = ["csv", "columns", "hdf5", "netcdf"] as const;
export type SeriesFormat = (typeof SERIES_FORMATS)[number];

/** What each format is called where people read it. */
export const FORMAT_NAMES: Record<SeriesFormat, string> = {
  csv: "CSV",
  columns: "whitespace-separated columns",
  hdf5: "HDF5",
  netcdf: "NetCDF",
};

/** The content type a stored file of each format is kept under. */
export const FORMAT_CONTENT_TYPES: Record<SeriesFormat, string> = {
  csv: "text/csv",
  columns: "text/plain",
  hdf5: "application/x-hdf5",
  netcdf: "application/x-netcdf",
};

/** The format a file name's extension stands for (as the CLI reads it), or null. */
export function formatOfFileName(name: string): SeriesFormat | null {
  const ext = /\.([A-Za-z0-9]+)$/.exec(name)?.[1]?.toLowerCase();
  if (ext === "csv") return "csv";
  if (ext === "dat" || ext === "txt") return "columns";
  if (ext === "h5" || ext === "hdf5" || ext === "he5") return "hdf5";
  if (ext === "nc" || ext === "cdf") return "netcdf";
  return null;
}

/** Whether the format needs a map (column map or dataset map) to name its columns. */
export const needsMap = (format: SeriesFormat) => format !== "csv";

/** Checks a map for the format; throws CsvFormatError saying how to write it. */
export function checkMap(format: SeriesFormat, map: string | null | undefined): string | null {
  if (!needsMap(format)) return null;
  const text = (map ?? "").trim();
  if (!text) {
    throw new CsvFormatError(
      format === "columns"
        ? "a file of whitespace-separated columns has no header: give its column map, the names in file order (e.g. t,kineticEnergy,-,Rm; \"-\" skips a column)"
        : `an ${FORMAT_NAMES[format]} file needs a dataset map: which datasets become which columns (e.g. t,kineticEnergy,Rm:diag/rm)`,
    );
  }
  if (format === "columns") parseColumnMap(text);
  else parseDatasetMap(text);
  return text;
}

async function* decoded(chunks: AsyncIterable<string | Uint8Array>) {
  const decoder = new TextDecoder("utf-8");
  for await (const c of chunks) yield typeof c === "string" ? c : decoder.decode(c, { stream: true });
  yield decoder.decode();
}

/** Whitespace-separated columns from a stream, one line at a time (memory: the columns plus one chunk). */
export async function parseColumnTextStream(chunks: AsyncIterable<string | Uint8Array>, map: string, kind: CsvKind): Promise<TypedColumns> {
  const reader = new ColumnTextReader(parseColumnMap(map), kind);
  let rest = "";
  let line = 0;
  for await (const text of decoded(chunks)) {
    rest += text;
    let at = rest.indexOf("\n");
    let start = 0;
    while (at >= 0) {
      reader.addLine(rest.slice(start, at).replace(/\r$/, ""), ++line);
      start = at + 1;
      at = rest.indexOf("\n", start);
    }
    rest = rest.slice(start);
    if (rest.length > 64 * 1024) throw new CsvFormatError("a line is longer than 64 KB; is this a column file?", line + 1);
  }
  if (rest) reader.addLine(rest, ++line);
  return reader.finishTyped();
}

/** Gathers the chunks into one buffer, refusing more than `limitBytes`. */
async function gather(chunks: AsyncIterable<string | Uint8Array>, limitBytes: number): Promise<Uint8Array> {
  const parts: Uint8Array[] = [];
  let size = 0;
  const enc = new TextEncoder();
  for await (const c of chunks) {
    const b = typeof c === "string" ? enc.encode(c) : c;
    size += b.byteLength;
    if (size > limitBytes) throw new CsvFormatError(`the file is larger than ${Math.round(limitBytes / 1024 / 1024)} MB`);
    parts.push(b);
  }
  const out = new Uint8Array(size);
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.byteLength;
  }
  return out;
}

/**
 * Reads a series or spectrum in any of the formats into typed columns. Throws CsvFormatError
 * (with the line where there is one) on anything that is not a valid file of the kind.
 */
export async function readSeriesFile(
  chunks: AsyncIterable<string | Uint8Array>,
  opts: { kind: CsvKind; format: SeriesFormat; map?: string | null; limitBytes: number },
): Promise<TypedColumns> {
  const map = checkMap(opts.format, opts.map);
  switch (opts.format) {
    case "csv":
      return parseCsvStreamTyped(chunks, opts.kind);
    case "columns":
      return parseColumnTextStream(chunks, map!, opts.kind);
    case "hdf5":
      return readHdf5Typed(await gather(chunks, opts.limitBytes), parseDatasetMap(map!), opts.kind);
    case "netcdf":
      return readNetcdfTyped(await gather(chunks, opts.limitBytes), parseDatasetMap(map!), opts.kind);
  }
}
