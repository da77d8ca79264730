/**
 * Measurement (not a test): reading a 200,000-row × 6-column series CSV.
 *   npm run --silent bench:csv
 * Each case runs in a child process of its own so its peak RSS is its own. Baseline: csv-parse's
 * stream API plus Number() per cell into number[] columns — the reference the reader is held to.
 */
import { execFileSync } from "node:child_process";
import { createReadStream, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { performance } from "node:perf_hooks";

const ROWS = Number(process.env.BENCH_ROWS ?? 200_000);

async function child(mode: string, file: string) {
  const t0 = performance.now();
  let rows = 0;
  if (mode === "csv-parse") {
    const { parse } = await import("csv-parse");
    const parser = createReadStream(file).pipe(parse({ skip_empty_lines: true, trim: true, bom: true }));
    let cols: number[][] = [];
    let header = true;
    for await (const rec of parser as AsyncIterable<string[]>) {
      if (header) {
        cols = rec.map(() => []);
        header = false;
        continue;
      }
      for (let i = 0; i < rec.length; i++) cols[i]!.push(Number(rec[i]));
    }
    rows = cols[0]!.length;
  } else {
    const { parseCsvStreamTyped } = await import("../app/checker/csv-stream.ts");
    const cols = await parseCsvStreamTyped(createReadStream(file), "series");
    rows = cols.t!.length;
    if (mode === "reader+analysis") {
      const { analyseColumns } = await import("../app/workspace/attachment-analysis.ts");
      analyseColumns("series", cols, 5);
    }
  }
  const ms = performance.now() - t0;
  const rssMb = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(JSON.stringify({ mode, rows, ms, rssMb }));
}

function lcg(seed: number) {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

async function main() {
  const dir = mkdtempSync(join(tmpdir(), "runproof-bench-"));
  const file = join(dir, "series.csv");
  const r = lcg(7);
  const lines = ["t,kineticEnergy,magneticEnergy,Re,Rm,Nu"];
  let x = 0;
  for (let i = 0; i < ROWS; i++) {
    x = 0.95 * x + (r() - 0.5);
    const t = (i * 0.001).toFixed(4);
    lines.push(`${t},${(30 + x).toPrecision(8)},${(12 + 0.5 * x).toPrecision(8)},${(78 + x).toPrecision(8)},${(390 + 5 * x).toPrecision(8)},${(2.1 + 0.01 * x).toPrecision(8)}`);
  }
  writeFileSync(file, lines.join("\n") + "\n");
  const sizeMb = Buffer.byteLength(lines.join("\n")) / 1024 / 1024;
  const results: Record<string, { ms: number; rssMb: number }> = {};
  for (const mode of ["csv-parse", "reader", "reader+analysis"]) {
    const best = { ms: Infinity, rssMb: Infinity };
    for (let rep = 0; rep < 3; rep++) {
      const out = JSON.parse(execFileSync(process.execPath, ["--import", "tsx", process.argv[1]!, "--child", mode, file], { encoding: "utf8" })) as { ms: number; rssMb: number };
      best.ms = Math.min(best.ms, out.ms);
      best.rssMb = Math.min(best.rssMb, out.rssMb);
    }
    results[mode] = best;
  }
  rmSync(dir, { recursive: true, force: true });
  const base = results["csv-parse"]!;
  console.log(`${ROWS} rows × 6 columns, ${sizeMb.toFixed(1)} MB (best of 3, each in its own process)`);
  console.log("| case | time | MB/s | peak RSS | time vs csv-parse | RSS vs csv-parse |");
  console.log("| --- | --- | --- | --- | --- | --- |");
  for (const [mode, v] of Object.entries(results)) {
    console.log(`| ${mode} | ${v.ms.toFixed(0)} ms | ${(sizeMb / (v.ms / 1000)).toFixed(1)} | ${v.rssMb.toFixed(0)} MB | ${(v.ms / base.ms).toFixed(2)}× | ${(v.rssMb / base.rssMb).toFixed(2)}× |`);
  }
}

if (process.argv[2] === "--child") await child(process.argv[3]!, process.argv[4]!);
else await main();
