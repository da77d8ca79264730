/**
 * CSV attachments (RFC 4180): a time series (first column `t`, in the run's time unit)
 * or a spectrum (first column `l`, then `kinetic` and/or `magnetic`). Parsed with
 * csv-parse; errors carry the line number. Streaming input: see csv-stream.ts.
 */
import { CsvError, parse } from "csv-parse/sync";
import { LIMITS, type Columns } from "./schema.ts";

export type CsvKind = "series" | "spectrum";

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

const FIRST: Record<CsvKind, string> = { series: "t", spectrum: "l" };

/** Collects rows into columns, checking the header and every cell. */
export class ColumnBuilder {
  private names: string[] = [];
  private cols: number[][] = [];
  constructor(private readonly kind: CsvKind) {}

  add(record: string[], line: number): void {
    if (this.names.length === 0) return this.header(record, line);
    if ((this.cols[0]?.length ?? 0) >= LIMITS.seriesRows) {
      throw new CsvFormatError(`the ${this.kind} has more than ${LIMITS.seriesRows.toLocaleString("en")} data rows; thin it (e.g. every n-th row) and upload again`, line);
    }
    if (record.length !== this.names.length) {
      throw new CsvFormatError(`expected ${this.names.length} values (${this.names.join(", ")}), found ${record.length}`, line);
    }
    for (let i = 0; i < record.length; i++) {
      const cell = record[i] as string;
      if (cell === "") throw new CsvFormatError(`column ${this.names[i] ?? ""} is empty`, line);
      const v = Number(cell);
      if (!Number.isFinite(v)) throw new CsvFormatError(`column ${this.names[i] ?? ""} is not a number ('${cell}')`, line);
      this.push(i, v, cell, line);
    }
  }

  /** A row already read as numbers (e.g. Fortran columns), checked like a CSV row. */
  addNumbers(values: number[], cells: string[], line: number): void {
    for (let i = 0; i < values.length; i++) this.push(i, values[i] as number, cells[i] ?? "", line);
  }

  private push(i: number, v: number, cell: string, line: number): void {
    const name = this.names[i] ?? "";
    const col = this.cols[i] as number[];
    if (i === 0 && col.length > 0 && !(v > (col[col.length - 1] ?? 0))) {
      throw new CsvFormatError(`column ${name} must increase (${cell} after ${col[col.length - 1]})`, line);
    }
    if (this.kind === "spectrum" && i === 0 && !(Number.isInteger(v) && v >= 0)) {
      throw new CsvFormatError(`column l must hold non-negative integer degrees ('${cell}')`, line);
    }
    if (this.kind === "spectrum" && i > 0 && v < 0) throw new CsvFormatError(`column ${name} has a negative energy ('${cell}')`, line);
    col.push(v);
  }

  private header(record: string[], line: number): void {
    const first = FIRST[this.kind];
    if (record[0] !== first) {
      throw new CsvFormatError(`the first column of a ${this.kind} must be "${first}" (found "${record[0] ?? ""}")`, line);
    }
    if (record.length < 2) throw new CsvFormatError(`a ${this.kind} needs at least one column besides "${first}"`, line);
    if (record.length > LIMITS.seriesColumns) {
      throw new CsvFormatError(`the header has ${record.length} columns; at most ${LIMITS.seriesColumns} are allowed`, line);
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
    this.cols = record.map(() => []);
  }

  finish(): Columns {
    if (this.names.length === 0) throw new CsvFormatError("the file is empty; expected a header row");
    const rows = this.cols[0]?.length ?? 0;
    if (rows < 2) throw new CsvFormatError(`the ${this.kind} has ${rows} data row(s); at least 2 are needed`);
    const out: Columns = {};
    this.names.forEach((n, i) => (out[n] = this.cols[i] ?? []));
    return out;
  }
}

export function wrapCsvError(e: unknown): never {
  if (e instanceof CsvError) {
    const line = (e as unknown as { lines?: number }).lines;
    throw new CsvFormatError(e.message.replace(/^[A-Z_]+: /, ""), line);
  }
  throw e;
}

interface InfoRecord {
  record: string[];
  info: { lines: number };
}

/** Parse CSV text into columns. Throws CsvFormatError. */
export function parseCsv(text: string, kind: CsvKind): Columns {
  let records: InfoRecord[];
  try {
    records = parse(text, CSV_OPTIONS) as unknown as InfoRecord[];
  } catch (e) {
    wrapCsvError(e);
  }
  const b = new ColumnBuilder(kind);
  for (const r of records) b.add(r.record, r.info.lines);
  return b.finish();
}

export const parseSeriesCsv = (text: string): Columns => parseCsv(text, "series");
export const parseSpectrumCsv = (text: string): Columns => parseCsv(text, "spectrum");
