import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it, vi } from "vitest";
import { parseSeriesCsv } from "../../app/checker/csv.ts";
import { netcdf } from "./netcdf-writer.ts";

// Each case starts a tsx process; on a loaded two-core machine that alone can take 20 s.
vi.setConfig({ testTimeout: 90_000 });

const tsx = "node_modules/.bin/tsx";
const run = (...args: string[]) => spawnSync(tsx, ["scripts/check.ts", ...args], { encoding: "utf8", timeout: 60_000 });

describe("command-line checker", () => {
  it("checks the example study: exit 0, one JSON object with the demo's deliberate problems", () => {
    const r = run(
      "--claim", "examples/claims/layer-zonal-flow.json",
      "--series", "ref-A=examples/series/ref-A.csv", "--series", "strat-B=examples/series/strat-B.csv",
      "--spectrum", "ref-A=examples/series/ref-A-spectrum.csv", "--spectrum", "strat-B=examples/series/strat-B-spectrum.csv",
      "examples/runs/ref-A.json", "examples/runs/strat-B.json",
    );
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.runs.map((x: { label: string }) => x.label)).toEqual(["ref-A", "strat-B"]);
    const rules = [...out.runs.flatMap((x: { flags: Array<{ rule: string }> }) => x.flags), ...out.claimFlags].map((f: { rule: string }) => f.rule);
    for (const id of ["A.pm-from-diffusivities", "D.min-magnetic-times", "F.spectrum-decay", "G.undeclared-difference"]) expect(rules).toContain(id);
    expect(out.runs[1].derived.layerThicknessKm).toBeCloseTo(200, 0);
  });
  it("prints usage for --help", () => {
    const r = run("--help");
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/usage: npm run --silent check/);
  });
  it("exits 2 for a missing file", () => {
    const r = run("no/such/run.json");
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("no/such/run.json: cannot read the file (ENOENT)");
  });
  it("exits 2 for bad JSON, naming the file", () => {
    const dir = mkdtempSync(join(tmpdir(), "rp-"));
    const f = join(dir, "bad.json");
    writeFileSync(f, "{ not json");
    const r = run(f);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(`${f}: not valid JSON`);
  });
  it("exits 2 for a schema error, with the JSON path", () => {
    const dir = mkdtempSync(join(tmpdir(), "rp-"));
    const f = join(dir, "run.json");
    writeFileSync(f, JSON.stringify({ format: "runproof.run/1", label: "x", geometry: { radiusRatio: 0.35 }, conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" }, controls: { E: 1e-3, Ra: 1e5, Pr: 1, Ekman: 2 } }));
    const r = run(f);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("runs[0].controls.Ekman");
  });
  it("exits 2 for a CSV error with its line number", () => {
    const dir = mkdtempSync(join(tmpdir(), "rp-"));
    const f = join(dir, "s.csv");
    writeFileSync(f, "t,Re\n0,1\n1,oops\n");
    const r = run("--series", `ref-A=${f}`, "examples/runs/ref-A.json");
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("line 3: column Re is not a number ('oops')");
  });

  it("reads a whitespace .dat series through --columns and prints the same output as its CSV", () => {
    const dir = mkdtempSync(join(tmpdir(), "rp-"));
    const lines = readFileSync("examples/series/strat-B.csv", "utf8").trim().split(/\r?\n/);
    const header = lines[0]!.split(",");
    // The same numbers in Fortran D form with an extra column to skip, under a comment line.
    const dat = ["# written by an invented code", ...lines.slice(1).map((l) => l.split(",").map((v) => Number(v).toExponential(8).replace("e", "D")).join("   ") + "   9.9D+09")].join("\n");
    const f = join(dir, "strat-B.dat");
    writeFileSync(f, dat);
    const base = ["examples/runs/strat-B.json"];
    const fromCsv = run("--series", "strat-B=examples/series/strat-B.csv", ...base);
    const fromDat = run("--series", `strat-B=${f}`, "--columns", `strat-B=${header.join(",")},-`, ...base);
    expect(fromDat.status, fromDat.stderr).toBe(0);
    const a = JSON.parse(fromCsv.stdout);
    const b = JSON.parse(fromDat.stdout);
    expect(b.runs[0].derived.series).toEqual(a.runs[0].derived.series);
    expect(Object.keys(b.runs[0].derived.series)).toEqual(header.slice(1));
    expect(b).toEqual(a);
  }, 90_000);
  it("exits 2 for a .dat file without --columns, and for a bad map", () => {
    const dir = mkdtempSync(join(tmpdir(), "rp-"));
    const f = join(dir, "s.dat");
    writeFileSync(f, "0 1\n1 2\n");
    const r = run("--series", `strat-B=${f}`, "examples/runs/strat-B.json");
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("name its columns with --columns strat-B=");
    const r2 = run("--series", `strat-B=${f}`, "--columns", "strat-B=t,R m", "examples/runs/strat-B.json");
    expect(r2.status).toBe(2);
    expect(r2.stderr).toContain('column 2 of the map is "R m"');
  }, 60_000);

  it("reads HDF5 (.h5) and NetCDF (.nc) series through --columns as dataset names, same output as CSV", async () => {
    const h5wasm = (await import("h5wasm")).default;
    const { FS } = await h5wasm.ready;
    const dir = mkdtempSync(join(tmpdir(), "rp-"));
    const cols = parseSeriesCsv(readFileSync("examples/series/strat-B.csv", "utf8"));
    const mem = `/cli-${Date.now()}.h5`;
    const f = new h5wasm.File(mem, "w");
    f.create_group("diag");
    for (const [k, v] of Object.entries(cols)) (k === "Rm" ? (f.get("diag") as InstanceType<typeof h5wasm.Group>) : f).create_dataset({ name: k === "Rm" ? "rm" : k, data: new Float64Array(v) });
    f.close();
    writeFileSync(join(dir, "s.h5"), FS.readFile(mem) as Uint8Array);
    writeFileSync(join(dir, "s.nc"), netcdf(cols));
    const names = Object.keys(cols);
    const fromCsv = JSON.parse(run("--series", "strat-B=examples/series/strat-B.csv", "examples/runs/strat-B.json").stdout);
    const fromH5 = run("--series", `strat-B=${join(dir, "s.h5")}`, "--columns", `strat-B=${names.map((n) => (n === "Rm" ? "Rm:diag/rm" : n)).join(",")}`, "examples/runs/strat-B.json");
    expect(fromH5.status, fromH5.stderr).toBe(0);
    expect(JSON.parse(fromH5.stdout)).toEqual(fromCsv);
    const fromNc = run("--series", `strat-B=${join(dir, "s.nc")}`, "--columns", `strat-B=${names.join(",")}`, "examples/runs/strat-B.json");
    expect(fromNc.status, fromNc.stderr).toBe(0);
    expect(JSON.parse(fromNc.stdout)).toEqual(fromCsv);
  }, 120_000);
});
