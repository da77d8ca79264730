/**
 * Command-line checker: same output as POST /api/v1/check.
 *   npm run --silent check -- [--claim c.json] [--policy p.json] [--series LABEL=f.csv]
 *                             [--spectrum LABEL=f.csv] [--columns LABEL=t,Re,-,Rm] run.json [run2.json …]
 * A `.dat`/`.txt` series or spectrum is read as whitespace-separated columns named by --columns;
 * `.h5` (HDF5) and `.nc` (NetCDF classic / 64-bit offset) files take --columns as dataset names.
 * Exit 0 when the input was valid (whatever it flags), 2 with a message on stderr when not.
 */
import { createReadStream } from "node:fs";
import { readFile } from "node:fs/promises";
import { createInterface } from "node:readline";
import { parseArgs } from "node:util";
import { parseDatasetMap, readHdf5Columns, readNetcdfColumns } from "../app/checker/array-files.ts";
import { ColumnTextReader, parseColumnMap } from "../app/checker/column-text.ts";
import { CsvFormatError, type CsvKind } from "../app/checker/csv.ts";
import { parseCsvStream } from "../app/checker/csv-stream.ts";
import type { Columns } from "../app/checker/schema.ts";

const USAGE = `usage: npm run --silent check -- [options] run.json [run2.json ...]

Checks run records (runproof.run/1), optionally against a claim (runproof.claim/1),
and prints { "runs": [ { "label", "derived", "flags" } ], "claimFlags": [ ... ] } as JSON.

options:
  --claim FILE            a claim record (JSON)
  --policy FILE           policy overrides (JSON), e.g. { "minMagneticTimes": 2 }
  --series LABEL=FILE     time-series CSV for the run LABEL (first column t); repeatable
  --spectrum LABEL=FILE   spectrum CSV for the run LABEL (first column l); repeatable
  --columns LABEL=NAMES   column names, in order, of LABEL's .dat/.txt files (whitespace-separated
                          columns, no header, # or ! comments, Fortran D exponents), e.g.
                          --columns strat-B=t,kineticEnergy,-,Rm ("-" skips a column); repeatable.
                          For .h5 (HDF5) and .nc (NetCDF classic / 64-bit offset) files the names
                          are datasets/variables; NAME:path/in/file reads another dataset as NAME
  -h, --help              show this help

exit status: 0 valid input (flags or not), 2 invalid input (message on stderr)`;

class UsageError extends Error {}

async function readJson(file: string): Promise<unknown> {
  let text: string;
  try {
    text = await readFile(file, "utf8");
  } catch (e) {
    throw new UsageError(`${file}: cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new UsageError(`${file}: not valid JSON (${(e as Error).message})`);
  }
}

function labelled(spec: string, option: string, what = "FILE"): [string, string] {
  const eq = spec.indexOf("=");
  if (eq <= 0 || eq === spec.length - 1) throw new UsageError(`--${option} expects LABEL=${what}, got "${spec}"`);
  return [spec.slice(0, eq), spec.slice(eq + 1)];
}

const COLUMN_TEXT = /\.(dat|txt)$/i;
const HDF5 = /\.(h5|hdf5|he5)$/i;
const NETCDF = /\.(nc|cdf)$/i;

/** A whitespace-separated column file, read line by line (any length, constant memory per line). */
async function readColumnText(file: string, spec: string, kind: CsvKind): Promise<Columns> {
  const reader = new ColumnTextReader(parseColumnMap(spec), kind);
  const lines = createInterface({ input: createReadStream(file), crlfDelay: Infinity });
  let n = 0;
  for await (const line of lines) reader.addLine(line, ++n);
  return reader.finish();
}

async function readCsv(spec: string, kind: CsvKind, option: string, maps: Map<string, string>): Promise<[string, Columns]> {
  const [label, file] = labelled(spec, option);
  try {
    const columnar = COLUMN_TEXT.test(file) || HDF5.test(file) || NETCDF.test(file);
    const map = maps.get(label);
    if (columnar && !map) {
      const what = COLUMN_TEXT.test(file) ? "a .dat/.txt file has no header; name its columns" : "name the datasets to read";
      throw new UsageError(`${file}: ${what} with --columns ${label}=${kind === "series" ? "t,kineticEnergy,..." : "l,kinetic,magnetic"}`);
    }
    if (map && COLUMN_TEXT.test(file)) return [label, await readColumnText(file, map, kind)];
    if (map && HDF5.test(file)) return [label, await readHdf5Columns(await readFile(file), parseDatasetMap(map), kind)];
    if (map && NETCDF.test(file)) return [label, await readNetcdfColumns(await readFile(file), parseDatasetMap(map), kind)];
    return [label, await parseCsvStream(createReadStream(file), kind)];
  } catch (e) {
    if (e instanceof UsageError) throw e;
    if (e instanceof CsvFormatError) throw new UsageError(`${file}: ${e.message}`);
    const err = e as NodeJS.ErrnoException;
    throw new UsageError(`${file}: cannot read the file (${err.code ?? err.message})`);
  }
}

async function collect(specs: string[], kind: CsvKind, option: string, maps: Map<string, string>): Promise<Record<string, Columns> | undefined> {
  if (specs.length === 0) return undefined;
  const out: Record<string, Columns> = {};
  for (const s of specs) {
    const [label, cols] = await readCsv(s, kind, option, maps);
    if (out[label]) throw new UsageError(`--${option}: run "${label}" is given twice`);
    out[label] = cols;
  }
  return out;
}

async function main(argv: string[]): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        claim: { type: "string" },
        policy: { type: "string" },
        series: { type: "string", multiple: true },
        spectrum: { type: "string", multiple: true },
        columns: { type: "string", multiple: true },
        help: { type: "boolean", short: "h" },
      },
    });
  } catch (e) {
    throw new UsageError(`${(e as Error).message}\n\n${USAGE}`);
  }
  const { values, positionals } = parsed;
  if (values.help) {
    process.stdout.write(USAGE + "\n");
    return 0;
  }
  if (positionals.length === 0) throw new UsageError(`no run record given\n\n${USAGE}`);
  const runs = [];
  for (const f of positionals) runs.push(await readJson(f));
  const input: Record<string, unknown> = { runs };
  if (values.claim) input.claim = await readJson(values.claim);
  if (values.policy) input.policy = await readJson(values.policy);
  const maps = new Map<string, string>();
  for (const spec of values.columns ?? []) {
    const [label, names] = labelled(spec, "columns", "NAMES");
    if (maps.has(label)) throw new UsageError(`--columns: run "${label}" is given twice`);
    maps.set(label, names);
  }
  const series = await collect(values.series ?? [], "series", "series", maps);
  const spectra = await collect(values.spectrum ?? [], "spectrum", "spectrum", maps);
  if (series) input.series = series;
  if (spectra) input.spectra = spectra;
  // the engine (with mathjs) loads only once the files were read, so usage errors stay fast
  const { check, CheckInputError } = await import("../app/checker/index.ts");
  try {
    process.stdout.write(JSON.stringify(check(input), null, 2) + "\n");
  } catch (e) {
    if (!(e instanceof CheckInputError)) throw e;
    const files = (p: string) => {
      const m = /^runs\[(\d+)\]/.exec(p);
      return m ? ` (${positionals[Number(m[1])]})` : p.startsWith("claim") ? ` (${values.claim})` : p.startsWith("policy") ? ` (${values.policy})` : "";
    };
    throw new UsageError(e.errors.map((x) => `${x.path}${files(x.path)}: ${x.message}`).join("\n"));
  }
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (e: unknown) => {
    if (e instanceof UsageError) {
      process.stderr.write(`check: ${e.message}\n`);
      process.exit(2);
    }
    process.stderr.write(`check: internal error: ${(e as Error).stack ?? String(e)}\n`);
    process.exit(1);
  },
);
