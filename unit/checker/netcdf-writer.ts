/**
 * Writes NetCDF classic (CDF-1) and 64-bit offset (CDF-2) files from the published format
 * specification (Unidata, "The NetCDF Classic Format Specification"), for tests: netcdfjs
 * only reads.
 */
/** A NetCDF classic file with one dimension `time` and double variables over it. */
export function netcdf(vars: Record<string, number[]>, version: 1 | 2 = 1): Uint8Array {
  const enc = new TextEncoder();
  const parts: number[] = [];
  const int32 = (v: number) => parts.push((v >>> 24) & 255, (v >>> 16) & 255, (v >>> 8) & 255, v & 255);
  const name = (s: string) => {
    const b = enc.encode(s);
    int32(b.length);
    parts.push(...b);
    while (parts.length % 4) parts.push(0);
  };
  const entries = Object.entries(vars);
  const len = entries[0]![1].length;
  const header = (begins: number[]) => {
    parts.length = 0;
    parts.push(0x43, 0x44, 0x46, version); // "CDF" + version byte
    int32(0); // numrecs
    int32(0x0a); int32(1); name("time"); int32(len); // dim_list
    int32(0); int32(0); // gatt_list ABSENT
    int32(0x0b); int32(entries.length); // var_list
    entries.forEach(([v], i) => {
      name(v);
      int32(1); int32(0); // one dimension: dimid 0
      int32(0); int32(0); // vatt_list ABSENT
      int32(6); // NC_DOUBLE
      int32(len * 8); // vsize
      if (version === 2) int32(0); // high word of a 64-bit begin
      int32(begins[i] ?? 0);
    });
    return parts.length;
  };
  const size = header(entries.map(() => 0));
  const begins = entries.map((_, i) => size + i * len * 8);
  header(begins);
  const out = new Uint8Array(size + entries.length * len * 8);
  out.set(parts);
  const view = new DataView(out.buffer);
  entries.forEach(([, values], i) => values.forEach((v, k) => view.setFloat64(begins[i]! + 8 * k, v, false))); // big-endian
  return out;
}

