import { createReadStream, readFileSync } from "node:fs";
import { performance } from "node:perf_hooks";
const { parseDatasetMap, typedColumnsFromArrays } = await import("/work/wt-checker/app/checker/array-files.ts");
const h5wasm = (await import("h5wasm")).default; const { FS } = await h5wasm.ready;
const file = process.argv[2]!;
const MAP = parseDatasetMap("t,kineticEnergy,magneticEnergy,Re,Rm,Nu");
for (let k = 0; k < 3; k++) {
  let t = performance.now(); const lap = (s: string) => { const n = performance.now(); console.log(k, s, (n - t).toFixed(0)); t = n; };
  const parts: Uint8Array[] = []; let size = 0;
  for await (const c of createReadStream(file)) { parts.push(c); size += c.length; }
  const bytes = new Uint8Array(size); let at = 0; for (const p of parts) { bytes.set(p, at); at += p.length; }
  lap("gather");
  FS.writeFile("/x.h5", bytes); lap("fs.write");
  const f = new h5wasm.File("/x.h5", "r"); lap("open");
  const paths = new Set(f.paths()); lap("paths");
  const arrays = MAP.map((e) => { const ds = f.get(e.dataset) as any; const shape = ds.shape; const v = ds.value; return [e, v, ""] as any; }); lap("values");
  const cols = typedColumnsFromArrays(arrays, "series"); lap("typed");
  f.close(); FS.unlink("/x.h5"); lap("close");
}
