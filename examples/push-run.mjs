#!/usr/bin/env node
/**
 * Pushes one run record and (optionally) its time series to a draft round of Runproof, then
 * prints the checker's flags. Node 18+ (plain fetch), no dependencies.
 *
 *   RUNPROOF_URL=http://127.0.0.1:3000 RUNPROOF_TOKEN=rp_… \
 *     node examples/push-run.mjs <submissionId> <round> examples/runs/strat-B.json [examples/series/strat-B.csv]
 *
 * If a run with the record's label already exists in the round, a new version of it is made
 * (PUT with If-Match, so a concurrent edit is reported as 409 instead of being overwritten).
 */
import { readFile } from "node:fs/promises";
import { basename } from "node:path";

const [submissionId, round, recordPath, seriesPath] = process.argv.slice(2);
const base = (process.env.RUNPROOF_URL ?? "http://127.0.0.1:3000").replace(/\/$/, "");
const token = process.env.RUNPROOF_TOKEN;
if (!submissionId || !round || !recordPath || !token) {
  console.error("usage: RUNPROOF_TOKEN=rp_… node examples/push-run.mjs <submissionId> <round> <run.json> [series.csv]");
  process.exit(2);
}
const roundUrl = `${base}/api/v1/submissions/${submissionId}/rounds/${round}`;
const auth = { authorization: `Bearer ${token}` };

/** Every API error has the shape { error: { code, message, details: [{ path, message }] } }. */
async function call(method, url, { body, type = "application/json", headers = {} } = {}) {
  const res = await fetch(url, { method, headers: { ...auth, ...(body ? { "content-type": type } : {}), ...headers }, body });
  const json = await res.json();
  if (!res.ok) {
    const { code, message, details } = json.error;
    console.error(`${method} ${url}: ${res.status} ${code}: ${message}`);
    for (const d of details) console.error(`  ${d.path}: ${d.message}`);
    process.exit(1);
  }
  return { json, etag: res.headers.get("etag") };
}

const recordText = await readFile(recordPath, "utf8");
const { label } = JSON.parse(recordText);
const list = await call("GET", `${roundUrl}/runs?pageSize=100`);
const existing = list.json.items.find((r) => r.label === label);
const run = existing
  ? (await call("PUT", `${roundUrl}/runs/${existing.id}`, { body: recordText, headers: { "if-match": `"${existing.version}"` } })).json
  : (await call("POST", `${roundUrl}/runs`, { body: recordText })).json;
console.log(`${existing ? "updated" : "added"} run ${run.label} (version ${run.version})`);

if (seriesPath) {
  const name = basename(seriesPath);
  const url = `${roundUrl}/runs/${run.id}/attachments?kind=series&filename=${encodeURIComponent(name)}`;
  const attached = await call("POST", url, { body: await readFile(seriesPath), type: "text/csv" });
  console.log(`attached ${name}: ${attached.json.rowCount} rows, columns ${attached.json.columns.join(", ")}`);
}

const flags = await call("GET", `${roundUrl}/flags?run=${encodeURIComponent(run.label)}`);
console.log(`${flags.json.items.length} flag(s) on ${run.label}:`);
for (const f of flags.json.items) console.log(`  [${f.severity}] ${f.rule}: ${f.message}`);
console.log(flags.json.advisory);
