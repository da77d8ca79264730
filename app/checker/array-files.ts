/**
 * Series and spectra from array files: HDF5 (through h5wasm, read from bytes in its
 * in-memory file system, so no file I/O happens here) and NetCDF classic / 64-bit offset
 * (through netcdfjs). A dataset map names which datasets/variables become which columns:
 * `t,Re,Rm` reads datasets of those names; `Rm:diagnostics/rm` reads `diagnostics/rm` as Rm.
 * The first column must be `t` (series) or `l` (spectrum); every dataset must be 1-D,
 * numeric, finite, and as long as the first.
 */
import { CsvFormatError, type CsvKind, type TypedColumns } from "./csv.ts";
import { LIMITS, type Columns } from "./schema.ts";

export interface DatasetMapEntry {
  column: string;
  dataset: string;
}

const COLUMN = /^[A-Za-z_][A-Za-z0-9_.]*$/;
const DATASET = /^[A-Za-z0-9_./-]{1,200}$/;

/** `t,Re,Rm:diagnostics/rm` → entries; throws CsvFormatError with a hint. */
export function parseDatasetMap(spec: string): DatasetMapEntry[] {
  const parts = spec.split(",").map((s) => s.trim());
  if (parts.length < 2 || parts.length > 200) throw new CsvFormatError(`a dataset map names 2 to 200 datasets, e.g. "t,kineticEnergy,Rm:diag/rm" (got "${spec.slice(0, 80)}")`);
  return parts.map((p, i) => {
    const [column = "", dataset = column] = p.split(":");
    if (!COLUMN.test(column)) throw new CsvFormatError(`entry ${i + 1} of the dataset map is "${p}"; start it with a column name such as Re`);
    if (!DATASET.test(dataset)) throw new CsvFormatError(`entry ${i + 1} of the dataset map names the dataset "${dataset}"; use its path inside the file, e.g. diag/rm`);
    return { column, dataset };
  });
}

const FIRST: Record<CsvKind, string> = { series: "t", spectrum: "l" };

type Source = [DatasetMapEntry, ArrayLike<number | bigint> | null, string];

/**
 * One dataset as 64-bit floats. A Float64Array is used as it is (the readers hand over a fresh
 * array of their own); other numbers are copied in one go, 64-bit integers through Number.
 */
function asFloat64(data: ArrayLike<number | bigint>): Float64Array {
  if (data instanceof Float64Array) return data;
  if (!(data instanceof BigInt64Array) && !(data instanceof BigUint64Array)) return new Float64Array(data as ArrayLike<number>);
  const out = new Float64Array(data.length);
  for (let i = 0; i < data.length; i++) out[i] = Number(data[i]);
  return out;
}

const SPECTRUM_COLUMNS = new Set(["l", "kinetic", "magnetic"]);

/**
 * Checks the arrays and builds typed columns with the checks a CSV's rows get: the first column
 * `t` (increasing) or `l` (increasing non-negative integers), a spectrum's energies ≥ 0, every
 * value finite, all columns equally long, within the row and column limits. Column by column
 * over typed arrays: no per-row objects.
 */
export function typedColumnsFromArrays(arrays: Source[], kind: CsvKind): TypedColumns {
  const first = arrays[0]?.[0].column;
  if (first !== FIRST[kind]) throw new CsvFormatError(`the first column of a ${kind} must be "${FIRST[kind]}" (the map starts with "${first ?? ""}")`);
  if (arrays.length > LIMITS.seriesColumns) throw new CsvFormatError(`the map names ${arrays.length} columns; at most ${LIMITS.seriesColumns} are allowed — read fewer datasets`);
  const out: TypedColumns = {};
  let n = -1;
  for (const [entry, data, why] of arrays) {
    if (!data) throw new CsvFormatError(`dataset "${entry.dataset}" (for column ${entry.column}) ${why}`);
    if (out[entry.column]) throw new CsvFormatError(`column ${entry.column} appears twice in the map`);
    if (kind === "spectrum" && !SPECTRUM_COLUMNS.has(entry.column)) throw new CsvFormatError(`spectrum column "${entry.column}" is not allowed; use "kinetic" and/or "magnetic"`);
    // Checked before any copy, so the file's size never sets an allocation past the row limit.
    if (data.length > LIMITS.seriesRows) throw new CsvFormatError(`dataset "${entry.dataset}" has ${data.length.toLocaleString("en")} values; at most ${LIMITS.seriesRows.toLocaleString("en")} rows are allowed — thin it (e.g. every n-th value)`);
    if (n >= 0 && data.length !== n) throw new CsvFormatError(`dataset "${entry.dataset}" has ${data.length} values but "${arrays[0]![0].dataset}" has ${n}; all datasets of the map must be equally long`);
    const col = asFloat64(data);
    // One tight pass: v·0 is 0 for every finite v and NaN for ±Infinity and NaN (IEEE 754), so the
    // sum is 0 exactly when all values are finite; only then is the index of a bad value looked for.
    let acc = 0;
    for (let i = 0; i < col.length; i++) acc += col[i]! * 0;
    if (acc !== 0) {
      const i = col.findIndex((v) => !Number.isFinite(v));
      throw new CsvFormatError(`dataset "${entry.dataset}" has a non-finite value at index ${i} (${String(data[i])})`);
    }
    if (kind === "spectrum" && entry.column !== "l") {
      const i = col.findIndex((v) => v < 0);
      if (i >= 0) throw new CsvFormatError(`dataset "${entry.dataset}" has a negative energy at index ${i} (${col[i]})`);
    }
    n = col.length;
    out[entry.column] = col;
  }
  if (arrays.length < 2) throw new CsvFormatError(`a ${kind} needs at least one column besides "${FIRST[kind]}"`);
  if (n < 2) throw new CsvFormatError(`the ${kind} has ${n} row(s); at least 2 are needed`);
  const x = out[FIRST[kind]]!;
  for (let i = 1; i < x.length; i++) {
    if (!(x[i]! > x[i - 1]!)) throw new CsvFormatError(`dataset "${arrays[0]![0].dataset}" must increase (index ${i}: ${x[i]} after ${x[i - 1]})`);
  }
  if (kind === "spectrum") {
    for (let i = 0; i < x.length; i++) {
      if (!(Number.isInteger(x[i]) && x[i]! >= 0)) throw new CsvFormatError(`dataset "${arrays[0]![0].dataset}" must hold non-negative integer degrees (index ${i}: ${x[i]})`);
    }
  }
  return out;
}

/** The same as plain arrays (the check input's form). */
export function columnsFromArrays(arrays: Source[], kind: CsvKind): Columns {
  const typed = typedColumnsFromArrays(arrays, kind);
  const out: Columns = {};
  for (const [name, col] of Object.entries(typed)) out[name] = Array.from(col);
  return out;
}

type H5 = typeof import("h5wasm").default;
let h5: Promise<H5> | undefined;
let serial = 0;

async function h5wasm(): Promise<H5> {
  h5 ??= import("h5wasm").then(async (m) => {
    await m.default.ready;
    return m.default;
  });
  return h5;
}

const HDF5_SIGNATURE = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];

/** The superblock's signature sits at 0, 512, 1024, 2048, … (HDF5 File Format Specification, "Superblock"). */
export function looksLikeHdf5(bytes: Uint8Array): boolean {
  for (let at = 0; at + 8 <= bytes.length; at = at === 0 ? 512 : at * 2) {
    if (HDF5_SIGNATURE.every((b, i) => bytes[at + i] === b)) return true;
  }
  return false;
}

/** HDF5 bytes → columns (plain arrays, as the check input takes them). */
export async function readHdf5Columns(bytes: Uint8Array, map: DatasetMapEntry[], kind: CsvKind): Promise<Columns> {
  return plain(await readHdf5Typed(bytes, map, kind));
}

/** NetCDF classic or 64-bit offset bytes → columns (plain arrays). */
export async function readNetcdfColumns(bytes: Uint8Array, map: DatasetMapEntry[], kind: CsvKind): Promise<Columns> {
  return plain(await readNetcdfTyped(bytes, map, kind));
}

function plain(typed: TypedColumns): Columns {
  const out: Columns = {};
  for (const [name, col] of Object.entries(typed)) out[name] = Array.from(col);
  return out;
}

/** HDF5 bytes → typed columns. The bytes go to h5wasm's in-memory file system and are removed after. */
export async function readHdf5Typed(bytes: Uint8Array, map: DatasetMapEntry[], kind: CsvKind): Promise<TypedColumns> {
  if (!looksLikeHdf5(bytes)) throw new CsvFormatError("the file is not HDF5 (no HDF5 signature); export it again from the code, or use CSV");
  const lib = await h5wasm();
  const { FS } = await lib.ready;
  const name = `/runproof-${Date.now()}-${++serial}.h5`;
  FS.writeFile(name, bytes);
  let file: InstanceType<H5["File"]> | undefined;
  try {
    try {
      file = new lib.File(name, "r");
    } catch {
      throw new CsvFormatError("the file is not HDF5 (its signature or structure could not be read); export it again from the code, or use CSV");
    }
    const paths = new Set(file.paths());
    const arrays = map.map((entry): [DatasetMapEntry, ArrayLike<number | bigint> | null, string] => {
      const path = entry.dataset.replace(/^\/+/, "");
      if (!paths.has(path)) return [entry, null, `is not in the file; it holds ${[...paths].slice(0, 12).join(", ") || "nothing"}`];
      const ds = file!.get(path);
      if (!(ds instanceof lib.Dataset)) return [entry, null, `is not in the file; it holds ${file!.paths().slice(0, 12).join(", ") || "nothing"}`];
      const shape = ds.shape ?? [];
      const len = shape.reduce((a, b) => a * b, 1);
      if (shape.filter((d) => d > 1).length > 1 || len !== Math.max(...shape, 0)) return [entry, null, `has shape [${shape.join(", ")}]; a column must be 1-D`];
      const v = ds.value;
      if (!v || typeof v !== "object" || !("length" in v) || typeof (v as ArrayLike<unknown>)[0] === "string") return [entry, null, `is not numeric (${JSON.stringify(ds.dtype)})`];
      return [entry, v as ArrayLike<number | bigint>, ""];
    });
    return typedColumnsFromArrays(arrays, kind);
  } finally {
    file?.close();
    FS.unlink(name);
  }
}

/**
 * A non-record `double` or `float` variable read straight into a Float64Array: netcdfjs has parsed
 * the header (type, begin offset, length from its dimension); the data are that many big-endian
 * IEEE 754 values from `begin` ("The NetCDF Classic Format Specification", Unidata: non-record
 * data, `var_data`). Null for anything else (record variables are interleaved), which netcdfjs
 * reads value by value instead.
 */
function contiguousFloats(bytes: Uint8Array, v: { name: string; type: string; offset: number; record: boolean }, length: number | undefined): Float64Array | null {
  // Refused before netcdfjs (or this) allocates anything for it.
  if (length !== undefined && length > LIMITS.seriesRows) {
    throw new CsvFormatError(`variable "${v.name}" has ${length.toLocaleString("en")} values; at most ${LIMITS.seriesRows.toLocaleString("en")} rows are allowed — thin it (e.g. every n-th value)`);
  }
  const width = v.type === "double" ? 8 : v.type === "float" ? 4 : 0;
  if (v.record || !width || length === undefined) return null;
  if (v.offset < 0 || v.offset + length * width > bytes.byteLength) {
    throw new CsvFormatError(`the file ends before the data of a variable (needs ${v.offset + length * width} bytes, has ${bytes.byteLength}); it was cut off — write it again`);
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset + v.offset, length * width);
  const out = new Float64Array(length);
  if (width === 8) for (let i = 0; i < length; i++) out[i] = view.getFloat64(8 * i, false);
  else for (let i = 0; i < length; i++) out[i] = view.getFloat32(4 * i, false);
  return out;
}

/** NetCDF classic or 64-bit offset bytes → typed columns (netcdfjs reads both). */
export async function readNetcdfTyped(bytes: Uint8Array, map: DatasetMapEntry[], kind: CsvKind): Promise<TypedColumns> {
  const { NetCDFReader } = await import("netcdfjs");
  let reader: InstanceType<typeof NetCDFReader>;
  try {
    reader = new NetCDFReader(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  } catch (e) {
    throw new CsvFormatError(`the file is not NetCDF classic or 64-bit offset (${(e as Error).message}); NetCDF-4 files are HDF5: give them the .h5 extension`);
  }
  const names = reader.variables.map((v) => v.name);
  const arrays = map.map((entry): [DatasetMapEntry, ArrayLike<number | bigint> | null, string] => {
    const v = reader.variables.find((x) => x.name === entry.dataset);
    if (!v) return [entry, null, `is not a variable of the file; it holds ${names.slice(0, 12).join(", ") || "nothing"}`];
    if (v.dimensions.length !== 1) return [entry, null, `has ${v.dimensions.length} dimensions; a column must have one`];
    if (v.type === "char") return [entry, null, "holds characters, not numbers"];
    return [entry, contiguousFloats(bytes, v, reader.dimensions[v.dimensions[0]!]?.size) ?? (reader.getDataVariable(v) as number[]), ""];
  });
  return typedColumnsFromArrays(arrays, kind);
}
