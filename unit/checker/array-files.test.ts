/**
 * HDF5 and NetCDF series. HDF5 files are written here with h5wasm itself; NetCDF classic
 * (CDF-1) and 64-bit offset (CDF-2) files are written byte by byte from the published
 * NetCDF classic format specification (Unidata, "The NetCDF Classic Format
 * Specification": magic "CDF" + version, numrecs, dim_list, gatt_list, var_list with
 * NC_DIMENSION = 0x0A, NC_VARIABLE = 0x0B, NC_DOUBLE = 6, big-endian data, names padded to
 * 4 bytes, begin as 32-bit (CDF-1) or 64-bit (CDF-2) offsets), since netcdfjs only reads.
 */
import h5wasm from "h5wasm";
import { describe, expect, it } from "vitest";
import { NetCDFReader } from "netcdfjs";
import { parseDatasetMap, readHdf5Columns, readNetcdfColumns, readNetcdfTyped } from "../../app/checker/array-files.ts";
import { check } from "../../app/checker/index.ts";
import { baseRun } from "./helpers.ts";
import { netcdf } from "./netcdf-writer.ts";

const n = 50;
const t = Array.from({ length: n }, (_, i) => i * 0.4);
const re = t.map((x) => 100 + Math.sin(x));
const rm = re.map((x) => 5 * x);

async function hdf5(write: (f: InstanceType<typeof h5wasm.File>) => void): Promise<Uint8Array> {
  const { FS } = await h5wasm.ready;
  const name = `/test-${Math.random().toString(36).slice(2)}.h5`;
  const f = new h5wasm.File(name, "w");
  write(f);
  f.flush();
  f.close();
  const bytes = FS.readFile(name) as Uint8Array;
  FS.unlink(name);
  return bytes;
}

describe("HDF5 series (files written by h5wasm)", () => {
  it("reads datasets by name and by path into columns", async () => {
    const bytes = await hdf5((f) => {
      f.create_dataset({ name: "t", data: new Float64Array(t) });
      f.create_dataset({ name: "Re", data: new Float64Array(re) });
      f.create_group("diag");
      f.get("diag") && (f.get("diag") as InstanceType<typeof h5wasm.Group>).create_dataset({ name: "rm", data: new Float32Array(rm) });
    });
    expect([...bytes.slice(0, 8)]).toEqual([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]); // HDF5 signature (HDF5 File Format Specification)
    const cols = await readHdf5Columns(bytes, parseDatasetMap("t,Re,Rm:diag/rm"), "series");
    expect(cols.t).toEqual(t);
    expect(cols.Re).toEqual(re);
    cols.Rm!.forEach((v, i) => expect(v).toBeCloseTo(rm[i]!, 3)); // stored as float32
    const out = check({ runs: [baseRun()], series: { "ref-A": cols } });
    expect(out.runs[0]!.derived.series!.Re!.mean).toBeCloseTo(re.reduce((a, b) => a + b) / n, 0);
  });
  it("errors say what, where and how to fix", async () => {
    const bytes = await hdf5((f) => {
      f.create_dataset({ name: "t", data: new Float64Array(t) });
      f.create_dataset({ name: "grid", data: new Float64Array(4), shape: [2, 2] });
      f.create_dataset({ name: "short", data: new Float64Array(3) });
    });
    await expect(readHdf5Columns(bytes, parseDatasetMap("t,Re"), "series")).rejects.toThrow(/dataset "Re" \(for column Re\) is not in the file; it holds .*t/);
    await expect(readHdf5Columns(bytes, parseDatasetMap("t,grid"), "series")).rejects.toThrow(/shape \[2, 2\]; a column must be 1-D/);
    await expect(readHdf5Columns(bytes, parseDatasetMap("t,short"), "series")).rejects.toThrow(/has 3 values but "t" has 50/);
    await expect(readHdf5Columns(new TextEncoder().encode("t,Re\n0,1\n"), parseDatasetMap("t,Re"), "series")).rejects.toThrow(/not HDF5/);
  });
});

describe("NetCDF series (classic and 64-bit offset files written from the format specification)", () => {
  it.each([1, 2] as const)("reads CDF-%i variables into columns", async (version) => {
    const bytes = netcdf({ t, Re: re, rm }, version);
    const cols = await readNetcdfColumns(bytes, parseDatasetMap("t,Re,Rm:rm"), "series");
    expect(cols).toEqual({ t, Re: re, Rm: rm });
  });
  it.each([1, 2] as const)("reads CDF-%i double variables bit for bit as netcdfjs's own reader does", async (version) => {
    // Reference: netcdfjs's getDataVariable, value by value; ours reads the contiguous block at `begin`.
    const noisy = t.map((x) => Math.exp(x) * 1e-7 + Math.PI);
    const bytes = netcdf({ t, Re: noisy }, version);
    const reference = new NetCDFReader(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    const cols = await readNetcdfTyped(bytes, parseDatasetMap("t,Re"), "series");
    expect(Array.from(cols.Re!)).toEqual(reference.getDataVariable("Re"));
    expect(Array.from(cols.t!)).toEqual(reference.getDataVariable("t"));
    // A file cut short inside the data is refused, saying so.
    await expect(readNetcdfTyped(bytes.slice(0, bytes.length - 16), parseDatasetMap("t,Re"), "series")).rejects.toThrow(/cut off|not NetCDF/);
  });
  it("errors name the variable and the fix", async () => {
    const bytes = netcdf({ t, Re: re });
    await expect(readNetcdfColumns(bytes, parseDatasetMap("t,Rm"), "series")).rejects.toThrow(/"Rm" \(for column Rm\) is not a variable of the file; it holds t, Re/);
    await expect(readNetcdfColumns(bytes, parseDatasetMap("time:Re,t"), "series")).rejects.toThrow(/first column of a series must be "t"/);
    await expect(readNetcdfColumns(netcdf({ t: [...t].reverse(), Re: re }), parseDatasetMap("t,Re"), "series")).rejects.toThrow(/must increase/);
    await expect(readNetcdfColumns(new Uint8Array([1, 2, 3, 4]), parseDatasetMap("t,Re"), "series")).rejects.toThrow(/not NetCDF classic/);
  });
});
