/**
 * Whitespace-separated column files, the plain `.dat` output most simulation codes write:
 * no header, `#` or `!` comment lines (and trailing comments), numbers in any Fortran form
 * — `1.5D-03`, `1.5d-3`, `1.5E+05` and, for three-digit exponents, `1.5-100` (ISO/IEC 1539,
 * the Ew.d / Dw.d edit descriptors). A column map names the columns in order (`-` skips one);
 * rows are checked like CSV rows (see csv.ts). Feed lines one at a time, so a stream of any
 * length is read without holding its text.
 */
import { ColumnBuilder, CsvFormatError, type CsvKind, type TypedColumns } from "./csv.ts";
import type { Columns } from "./schema.ts";

/** Column names in file order; null skips a column. */
export type ColumnMap = (string | null)[];

const NAME = /^[A-Za-z_][A-Za-z0-9_.]*$/;

/** `t,kineticEnergy,-,Rm` → ["t", "kineticEnergy", null, "Rm"]. Throws CsvFormatError with a hint. */
export function parseColumnMap(spec: string): ColumnMap {
  const parts = spec.split(",").map((s) => s.trim());
  if (parts.length < 2 || parts.length > 200) throw new CsvFormatError(`a column map names 2 to 200 columns in order, e.g. "t,kineticEnergy,-,Rm" (got "${spec.slice(0, 80)}")`);
  return parts.map((p, i) => {
    if (p === "-") return null;
    if (!NAME.test(p)) throw new CsvFormatError(`column ${i + 1} of the map is "${p}"; use a column name such as Re, or "-" to skip the column`);
    return p;
  });
}

const PLAIN = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const FORTRAN = /^([+-]?(?:\d+\.?\d*|\.\d+))(?:[dDeE]([+-]?\d+)|([+-]\d{1,3}))$/;

/** One number as Fortran writes it; NaN when it is none. */
export function fortranNumber(cell: string): number {
  if (PLAIN.test(cell)) return Number(cell);
  const m = FORTRAN.exec(cell);
  if (m) return Number(`${m[1]}e${m[2] ?? m[3]}`);
  return /^[+-]?(?:\d+\.?\d*|\.\d+)$/.test(cell) ? Number(cell) : NaN;
}

export class ColumnTextReader {
  private readonly builder: ColumnBuilder;
  private fields = -1;
  private readonly need: number;

  constructor(
    private readonly map: ColumnMap,
    kind: CsvKind,
  ) {
    this.builder = new ColumnBuilder(kind);
    const names = map.filter((n): n is string => n !== null);
    this.need = map.length;
    try {
      this.builder.add(names, 0);
    } catch (e) {
      if (!(e instanceof CsvFormatError)) throw e;
      throw new CsvFormatError(`the column map: ${e.message.replace(/^line 0: /, "")}`);
    }
  }

  /** One line of the file (1-based line number for messages). */
  addLine(raw: string, line: number): void {
    const cut = raw.search(/[#!]/);
    const text = (cut >= 0 ? raw.slice(0, cut) : raw).trim();
    if (text === "") return;
    const cells = text.split(/[\s,]+/);
    if (this.fields < 0) {
      if (cells.length < this.need) {
        throw new CsvFormatError(`the row has ${cells.length} columns but the column map names ${this.need}; shorten the map or check the file`, line);
      }
      this.fields = cells.length;
    } else if (cells.length !== this.fields) {
      throw new CsvFormatError(`expected ${this.fields} columns like the first row, found ${cells.length}`, line);
    }
    const values: number[] = [];
    const kept: string[] = [];
    for (let i = 0; i < this.map.length; i++) {
      const name = this.map[i];
      if (name === null || name === undefined) continue;
      const cell = cells[i] ?? "";
      const v = fortranNumber(cell);
      if (!Number.isFinite(v)) throw new CsvFormatError(`column ${i + 1} (${name}) is not a number ('${cell.slice(0, 40)}')`, line);
      values.push(v);
      kept.push(cell);
    }
    this.builder.addNumbers(values, kept, line);
  }

  finish(): Columns {
    return this.builder.finish();
  }

  finishTyped(): TypedColumns {
    return this.builder.finishTyped();
  }
}

/** Parse a whole text. Throws CsvFormatError naming the line. */
export function parseColumnText(text: string, map: ColumnMap, kind: CsvKind): Columns {
  const r = new ColumnTextReader(map, kind);
  let line = 0;
  for (const l of text.split(/\r?\n/)) r.addLine(l, ++line);
  return r.finish();
}
