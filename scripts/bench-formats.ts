/**
 * Series formats benchmark (not a test): a 200,000-row × 6-column series as CSV, whitespace
 * columns, HDF5 and NetCDF classic. For each: our reader's time (parse: `readSeriesFile`, the one
 * entry point uploads and the check job use, from a file stream) and the statistics
 * (derived.series) time, against reading the same file with the format's library alone, and
 * the peak RSS of each, every measurement in a fresh process.
 *   npx tsx scripts/bench-formats.ts            (run by npm run bench)
 */
import { spawnSync } from "node:child_process";
import { createReadStream, mkdtempSync, writeFileSync } from "node:fs";
import { readFile } from "node:fs/promises";
import { loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { createInterface } from "node:readline";
import { performance } from "node:perf_hooks";
import { parse } from "csv-parse";

const ROWS = 200_000;
const REPEATS = Number(process.env.BENCH_REPEATS ?? 3);
const NAMES = ["t", "kineticEnergy", "magneticEnergy", "Re", "Rm", "Nu"];
const MAP = NAMES.join(",");
type Format = "csv" | "dat" | "h5" | "nc";

function data(): Record<string, Float64Array> {
  let s = 7;
  const r = () => ((s = (s * 48271) % 2147483647) / 2147483647);
  const cols = Object.fromEntries(NAMES.map((n) => [n, new Float64Array(ROWS)]));
  let x = 0;
  for (let i = 0; i < ROWS; i++) {
    x = 0.9 * x + (r() - 0.5);
    cols.t![i] = i * 1e-4;
    cols.kineticEnergy![i] = 30 + x;
    cols.magneticEnergy![i] = 600 + 10 * x;
    cols.Re![i] = 7.8 + 0.1 * x;
    cols.Rm![i] = 39 + 0.5 * x;
    cols.Nu![i] = 2.5 + 0.01 * x;
  }
  return cols;
}

async function write(dir: string): Promise<Record<Format, string>> {
  const cols = data();
  const rows = (sep: string, fmt: (v: number) => string) => {
    const out: string[] = [];
    for (let i = 0; i < ROWS; i++) out.push(NAMES.map((n) => fmt(cols[n]![i]!)).join(sep));
    return out.join("\n") + "\n";
  };
  const files = { csv: join(dir, "s.csv"), dat: join(dir, "s.dat"), h5: join(dir, "s.h5"), nc: join(dir, "s.nc") };
  writeFileSync(files.csv, NAMES.join(",") + "\n" + rows(",", (v) => String(v)));
  writeFileSync(files.dat, "# t ekin emag re rm nu\n" + rows("  ", (v) => v.toExponential(10).replace("e", "D")));
  const h5wasm = (await import("h5wasm")).default;
  const { FS } = await h5wasm.ready;
  const f = new h5wasm.File("/bench.h5", "w");
  for (const n of NAMES) f.create_dataset({ name: n, data: cols[n]! });
  f.close();
  writeFileSync(files.h5, FS.readFile("/bench.h5") as Uint8Array);
  const { netcdf } = await import("../unit/checker/netcdf-writer.ts");
  writeFileSync(files.nc, netcdf(Object.fromEntries(NAMES.map((n) => [n, Array.from(cols[n]!)]))));
  return files;
}

/** One measurement in this (fresh) process: prints { parseMs, statsMs, rssMb }. */
async function measure(format: Format, mode: "ours" | "library", file: string): Promise<void> {
  // modules load (and h5wasm compiles) before the clock starts, for both sides
  const { readSeriesFile } = await import("../app/checker/series-formats.ts");
  const { analyseSeries } = await import("../app/checker/series.ts");
  const h5wasm = (await import("h5wasm")).default;
  const { FS } = await h5wasm.ready;
  const { NetCDFReader } = await import("netcdfjs");
  const t0 = performance.now();
  let cols: Record<string, ArrayLike<number>> = {};
  if (mode === "ours") {
    const kinds = { csv: "csv", dat: "columns", h5: "hdf5", nc: "netcdf" } as const;
    cols = await readSeriesFile(createReadStream(file), { kind: "series", format: kinds[format], map: format === "csv" ? null : MAP, limitBytes: 1024 ** 3 });
  } else {
    if (format === "csv") {
      const out = NAMES.map(() => [] as number[]);
      for await (const rec of createReadStream(file).pipe(parse({ from_line: 2 })) as AsyncIterable<string[]>) rec.forEach((c, i) => out[i]!.push(Number(c)));
      cols = Object.fromEntries(NAMES.map((n, i) => [n, out[i]!]));
    }
    if (format === "dat") {
      // no library for plain column files: Node's readline and split
      const out = NAMES.map(() => [] as number[]);
      for await (const line of createInterface({ input: createReadStream(file), crlfDelay: Infinity })) {
        if (line.startsWith("#")) continue;
        line.trim().split(/\s+/).forEach((c, i) => out[i]!.push(Number(c.replace(/[dD]/, "e"))));
      }
      cols = Object.fromEntries(NAMES.map((n, i) => [n, out[i]!]));
    }
    if (format === "h5") {
      FS.writeFile("/b.h5", await readFile(file));
      const f = new h5wasm.File("/b.h5", "r");
      cols = Object.fromEntries(NAMES.map((n) => [n, (f.get(n) as InstanceType<typeof h5wasm.Dataset>).value as Float64Array]));
      f.close();
    }
    if (format === "nc") {
      const buf = await readFile(file);
      const r = new NetCDFReader(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength));
      cols = Object.fromEntries(NAMES.map((n) => [n, r.getDataVariable(n) as number[]]));
    }
  }
  const parseMs = performance.now() - t0;
  let statsMs = 0;
  if (mode === "ours") {
    const t1 = performance.now();
    analyseSeries(cols as Record<string, number[]>, 5);
    statsMs = performance.now() - t1;
  }
  if ((cols.t?.length ?? 0) !== ROWS) throw new Error(`${format}/${mode}: read ${cols.t?.length} rows`);
  process.stdout.write(JSON.stringify({ parseMs, statsMs, rssMb: process.resourceUsage().maxRSS / 1024 }) + "\n");
}

async function main() {
  const [, , cmd, format, mode, file] = process.argv;
  if (cmd === "--measure") return measure(format as Format, mode as "ours" | "library", file!);
  const files = await write(mkdtempSync(join(tmpdir(), "rp-bench-")));
  process.stdout.write(`\n${ROWS} rows × ${NAMES.length} columns; each number the median of ${REPEATS} fresh processes; load average ${loadavg().map((l) => l.toFixed(1)).join(" ")}\n`);
  process.stdout.write(`${"format".padEnd(10)}${"ours parse".padStart(12)}${"library".padStart(10)}${"ratio".padStart(8)}${"statistics".padStart(12)}${"RSS ours".padStart(10)}${"RSS lib".padStart(9)}\n`);
  for (const format of ["csv", "dat", "h5", "nc"] as const) {
    const once = (mode: string) => JSON.parse(spawnSync(process.execPath, [...process.execArgv, process.argv[1]!, "--measure", format, mode, files[format]], { encoding: "utf8" }).stdout.trim()) as { parseMs: number; statsMs: number; rssMb: number };
    // On a shared, loaded machine one process can stall: the median of REPEATS fresh processes, ours and the library's alternating.
    const samples = { ours: [] as ReturnType<typeof once>[], library: [] as ReturnType<typeof once>[] };
    for (let k = 0; k < REPEATS; k++) for (const mode of ["ours", "library"] as const) samples[mode].push(once(mode));
    const median = (xs: ReturnType<typeof once>[]) => {
      const at = (key: "parseMs" | "statsMs" | "rssMb") => [...xs.map((x) => x[key])].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
      return { parseMs: at("parseMs"), statsMs: at("statsMs"), rssMb: at("rssMb") };
    };
    const ours = median(samples.ours);
    const lib = median(samples.library);
    process.stdout.write(
      `${format.padEnd(10)}${`${ours.parseMs.toFixed(0)} ms`.padStart(12)}${`${lib.parseMs.toFixed(0)} ms`.padStart(10)}${(ours.parseMs / lib.parseMs).toFixed(2).padStart(8)}${`${ours.statsMs.toFixed(0)} ms`.padStart(12)}${`${ours.rssMb.toFixed(0)} MB`.padStart(10)}${`${lib.rssMb.toFixed(0)} MB`.padStart(9)}\n`,
    );
  }
}

void main();
