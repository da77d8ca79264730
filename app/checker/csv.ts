/**
 * CSV attachments (RFC 4180): a time series (first column `t`, in the run's time unit)
 * or a spectrum (first column `l`, then `kinetic` and/or `magnetic`). Read line by line
 * straight into growing Float64Array columns (one pass, no per-row objects); errors carry
 * the line number. Streaming input: see csv-stream.ts.
 */
import { CsvError } from "csv-parse/sync";
import { LIMITS, type Columns } from "./schema.ts";

export type CsvKind = "series" | "spectrum";
/** Columns as typed arrays, as the parser fills them. */
export type TypedColumns = Record<string, Float64Array>;

export class CsvFormatError extends Error {
  readonly line: number | undefined;
  constructor(message: string, line?: number) {
    super(line !== undefined ? `line ${line}: ${message}` : message);
    this.name = "CsvFormatError";
    this.line = line;
  }
}

// max_record_size bounds one line (a header of a million columns is refused at 64 KiB, not parsed).
export const CSV_OPTIONS = { info: true, skip_empty_lines: true, trim: true, bom: true, max_record_size: 64 * 1024 } as const;

/** Bounds of one attachment (a plausible range, and no input sets an unbounded allocation). */
/** The formats' ceilings (app/checker/schema.ts LIMITS), applied while reading. */
export const CSV_LIMITS = { columns: LIMITS.seriesColumns, rows: LIMITS.seriesRows } as const;

const FIRST: Record<CsvKind, string> = { series: "t", spectrum: "l" };

/** Collects rows into typed columns, checking the header and every cell. */
export class ColumnBuilder {
  private names: string[] = [];
  private cols: Float64Array[] = [];
  private rows = 0;
  constructor(private readonly kind: CsvKind) {}

  add(record: string[], line: number): void {
    if (this.names.length === 0) return this.header(record, line);
    const r = this.startRow(record.length, line);
    for (let i = 0; i < record.length; i++) {
      const cell = record[i]!;
      if (cell === "") throw new CsvFormatError(`column ${this.names[i]} is empty`, line);
      const v = Number(cell);
      if (!Number.isFinite(v)) throw new CsvFormatError(`column ${this.names[i]} is not a number ('${cell}')`, line);
      this.put(r, i, v, cell, line);
    }
    this.rows = r + 1;
  }

  /** A row already read as numbers (e.g. Fortran columns), checked like a CSV row. */
  addNumbers(values: number[], cells: string[], line: number): void {
    const r = this.startRow(values.length, line);
    for (let i = 0; i < values.length; i++) this.put(r, i, values[i]!, cells[i] ?? String(values[i]), line);
    this.rows = r + 1;
  }

  /** Checks a row's width and the row limit, makes room, and returns the row's index. */
  private startRow(width: number, line: number): number {
    if (width !== this.names.length) {
      throw new CsvFormatError(`expected ${this.names.length} values (${this.names.join(", ")}), found ${width}`, line);
    }
    if (this.rows >= CSV_LIMITS.rows) {
      throw new CsvFormatError(`the ${this.kind} has more than ${CSV_LIMITS.rows.toLocaleString("en")} data rows; thin it (e.g. every n-th row) and upload again`, line);
    }
    if (this.rows === this.cols[0]!.length) this.grow();
    return this.rows;
  }

  private put(r: number, i: number, v: number, cell: string, line: number): void {
    const name = this.names[i]!;
    const col = this.cols[i]!;
    const spectrum = this.kind === "spectrum";
    if (i === 0) {
      if (r > 0 && !(v > col[r - 1]!)) throw new CsvFormatError(`column ${name} must increase (${cell} after ${col[r - 1]})`, line);
      if (spectrum && !(Number.isInteger(v) && v >= 0)) throw new CsvFormatError(`column l must hold non-negative integer degrees ('${cell}')`, line);
    } else if (spectrum && v < 0) throw new CsvFormatError(`column ${name} has a negative energy ('${cell}')`, line);
    col[r] = v;
  }

  private grow() {
    this.cols = this.cols.map((c) => {
      const next = new Float64Array(Math.max(1024, c.length * 2));
      next.set(c);
      return next;
    });
  }

  private header(record: string[], line: number): void {
    const first = FIRST[this.kind];
    if (record[0] !== first) {
      throw new CsvFormatError(`the first column of a ${this.kind} must be "${first}" (found "${(record[0] ?? "").slice(0, 40)}")`, line);
    }
    if (record.length < 2) throw new CsvFormatError(`a ${this.kind} needs at least one column besides "${first}"`, line);
    if (record.length > CSV_LIMITS.columns) {
      throw new CsvFormatError(`the header has ${record.length} columns; at most ${CSV_LIMITS.columns} are allowed — split the file`, line);
    }
    const seen = new Set<string>();
    for (const n of record) {
      if (n === "") throw new CsvFormatError("the header has an empty column name", line);
      if (seen.has(n)) throw new CsvFormatError(`column ${n} appears twice in the header`, line);
      if (this.kind === "spectrum" && n !== "l" && n !== "kinetic" && n !== "magnetic") {
        throw new CsvFormatError(`spectrum column "${n}" is not allowed; use "kinetic" and/or "magnetic"`, line);
      }
      seen.add(n);
    }
    this.names = record;
    this.cols = record.map(() => new Float64Array(0));
  }

  /** The columns as typed arrays (views trimmed to the row count). */
  finishTyped(): TypedColumns {
    if (this.names.length === 0) throw new CsvFormatError("the file is empty; expected a header row");
    if (this.rows < 2) throw new CsvFormatError(`the ${this.kind} has ${this.rows} data row(s); at least 2 are needed`);
    const out: TypedColumns = {};
    this.names.forEach((n, i) => (out[n] = this.cols[i]!.slice(0, this.rows)));
    return out;
  }

  finish(): Columns {
    const typed = this.finishTyped();
    const out: Columns = {};
    for (const [n, c] of Object.entries(typed)) out[n] = Array.from(c);
    return out;
  }
}

/** Splits one line into trimmed fields; RFC 4180 quotes ("" inside quotes is one quote). */
function splitQuoted(line: string, lineNo: number): string[] {
  const out: string[] = [];
  let i = 0;
  const n = line.length;
  for (;;) {
    while (i < n && (line[i] === " " || line[i] === "\t")) i++;
    if (line[i] === '"') {
      let value = "";
      i++;
      for (;;) {
        const q = line.indexOf('"', i);
        if (q < 0) throw new CsvFormatError("a quoted field is not closed on its line (quoted line breaks are not allowed in numeric CSV)", lineNo);
        value += line.slice(i, q);
        if (line[q + 1] === '"') {
          value += '"';
          i = q + 2;
        } else {
          i = q + 1;
          break;
        }
      }
      while (i < n && (line[i] === " " || line[i] === "\t")) i++;
      if (i < n && line[i] !== ",") throw new CsvFormatError(`unexpected text after a closing quote at column ${i + 1}`, lineNo);
      out.push(value);
    } else {
      const c = line.indexOf(",", i);
      out.push((c < 0 ? line.slice(i) : line.slice(i, c)).trim());
      i = c < 0 ? n : c;
    }
    if (i >= n) break;
    i++; // the comma
    if (i >= n) {
      out.push("");
      break;
    }
  }
  return out;
}

/**
 * Feeds text in pieces of any size to a ColumnBuilder, one complete line at a time.
 * Empty lines are skipped; a leading byte-order mark is dropped; CRLF and LF both end lines.
 */
export class CsvLineReader {
  private rest = "";
  private line = 0;
  private started = false;
  constructor(private readonly builder: ColumnBuilder) {}

  push(text: string): void {
    if (!this.started && text.length) {
      this.started = true;
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
    }
    let data = this.rest ? this.rest + text : text;
    let start = 0;
    for (;;) {
      const nl = data.indexOf("\n", start);
      if (nl < 0) break;
      this.handle(data.slice(start, nl));
      start = nl + 1;
    }
    this.rest = data.slice(start);
    data = "";
  }

  end(): void {
    if (this.rest) this.handle(this.rest);
    this.rest = "";
  }

  private handle(raw: string) {
    this.line++;
    const line = raw.charCodeAt(raw.length - 1) === 13 ? raw.slice(0, -1) : raw;
    if (line.trim() === "") return;
    const fields = line.indexOf('"') >= 0 ? splitQuoted(line, this.line) : line.split(",").map((f) => f.trim());
    this.builder.add(fields, this.line);
  }
}

export function wrapCsvError(e: unknown): never {
  if (e instanceof CsvError) {
    const line = (e as unknown as { lines?: number }).lines;
    throw new CsvFormatError(e.message.replace(/^[A-Z_]+: /, ""), line);
  }
  throw e;
}

/** Parse CSV text into typed columns. Throws CsvFormatError. */
export function parseCsvTyped(text: string, kind: CsvKind): TypedColumns {
  const b = new ColumnBuilder(kind);
  const reader = new CsvLineReader(b);
  reader.push(text);
  reader.end();
  return b.finishTyped();
}

/** Parse CSV text into columns. Throws CsvFormatError. */
export function parseCsv(text: string, kind: CsvKind): Columns {
  const b = new ColumnBuilder(kind);
  const reader = new CsvLineReader(b);
  reader.push(text);
  reader.end();
  return b.finish();
}

export const parseSeriesCsv = (text: string): Columns => parseCsv(text, "series");
export const parseSpectrumCsv = (text: string): Columns => parseCsv(text, "spectrum");
