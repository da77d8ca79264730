/** What `npm run bench` measures of a running server: load, event loop, SQL statements, JS size. */
import type { ChildProcess } from "node:child_process";
import { existsSync, readFileSync, rmSync } from "node:fs";
import { setTimeout as sleep } from "node:timers/promises";
import { gzipSync } from "node:zlib";
import autocannon from "autocannon";

export const STATS_FILE = "/tmp/runproof-bench-loop.json";

export type Loop = { p99Ms: number; maxMs: number; peakRssMb: number; cpuMs: number };

/** Event-loop delay p99 and peak RSS of the server since the last call (see loop-monitor.mjs). */
export async function loopStats(server: ChildProcess): Promise<Loop> {
  rmSync(STATS_FILE, { force: true });
  server.kill("SIGUSR2");
  for (let i = 0; i < 100 && !existsSync(STATS_FILE); i++) await sleep(20);
  return JSON.parse(readFileSync(STATS_FILE, "utf8")) as Loop;
}

export async function load(url: string, opts: { cookie?: string; connections: number; seconds: number }) {
  const out = await autocannon({ url, connections: opts.connections, duration: opts.seconds, headers: opts.cookie ? { cookie: opts.cookie } : {} });
  return { rps: out.requests.average, p50: out.latency.p50, p99: out.latency.p99, ok: out["2xx"], other: out.non2xx + out.errors + out.timeouts, total: out.requests.total };
}

export async function jsGzip(base: string, path: string, cookie?: string) {
  const html = await (await fetch(base + path, { headers: cookie ? { cookie } : {} })).text();
  const srcs = new Set([...html.matchAll(/(?:src|href)="(\/assets\/[^"]+\.js)"/g)].map((m) => m[1]!));
  let total = 0;
  for (const src of srcs) total += gzipSync(Buffer.from(await (await fetch(base + src)).arrayBuffer())).length;
  return { files: srcs.size, kb: total / 1024 };
}

async function statementsSoFar(base: string) {
  const text = await (await fetch(`${base}/metrics`)).text();
  const m = /^runproof_sql_statements_sent (\d+)$/m.exec(text);
  if (!m) throw new Error("/metrics has no runproof_sql_statements_sent: is the server the production build of this checkout?");
  return Number(m[1]);
}

/**
 * SQL statements one GET of `path` sends, read from the server's /metrics before and after (the
 * metrics read itself costs a fixed number, measured first and subtracted). Nothing else may be
 * talking to the server meanwhile.
 */
export async function statementsOf(base: string, path: string, cookie?: string) {
  const once = async () => {
    const a = await statementsSoFar(base);
    const b = await statementsSoFar(base);
    const res = await fetch(base + path, { headers: cookie ? { cookie } : {} });
    await res.arrayBuffer();
    if (!res.ok) throw new Error(`GET ${path} answered ${res.status}`);
    const c = await statementsSoFar(base);
    return c - b - (b - a);
  };
  // The first request on a fresh pool connection also asks for the array types: not the page's own.
  await once();
  return Math.min(await once(), await once());
}
