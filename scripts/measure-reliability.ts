/**
 * Hostile-input figures for docs/reliability.md: starts the production server (scripts/serve.mjs,
 * after `react-router build`) on a spare port, sends each hostile request while a second client
 * keeps loading a page, and records status, answer time, the server's memory and the page's p99.
 * Parser-only cases (huge CSV files) are timed in this process. A measurement, not a test.
 *
 *   npm run --silent measure:reliability   (services up; DATABASE_URL etc. from scripts/lib/common.sh)
 */
import { spawn } from "node:child_process";
import { randomBytes } from "node:crypto";
import { readFileSync, writeFileSync } from "node:fs";
import { request as httpRequest } from "node:http";
import { parseCsv } from "../app/checker/csv.ts";

const port = Number(process.env.MEASURE_PORT ?? 3190);
const origin = `http://127.0.0.1:${port}`;
const rssMb = (pid: number) => {
  const status = readFileSync(`/proc/${pid}/status`, "utf8");
  const kb = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+)`).exec(status)?.[1] ?? 0);
  return { rss: kb("VmRSS") / 1024, peak: kb("VmHWM") / 1024 };
};

/** Sends `total` bytes (streamed in 1 MiB pieces) or a fixed body; resolves on the first response. */
function send(path: string, opts: { type: string; body?: Buffer | string; streamBytes?: number }) {
  return new Promise<{ status: number; ms: number }>((resolve) => {
    const t0 = performance.now();
    const length = opts.streamBytes ?? Buffer.byteLength(opts.body ?? "");
    const req = httpRequest(`${origin}${path}`, { method: "POST", headers: { origin, "content-type": opts.type, "content-length": String(length) } });
    let done = false;
    req.on("response", (res) => {
      res.resume();
      done = true;
      resolve({ status: res.statusCode ?? 0, ms: performance.now() - t0 });
      req.destroy();
    });
    req.on("error", () => !done && resolve({ status: 0, ms: performance.now() - t0 }));
    if (opts.streamBytes) {
      const piece = Buffer.alloc(1024 * 1024, "a");
      let sent = 0;
      const pump = () => {
        while (!done && sent < length) {
          sent += piece.length;
          if (!req.write(piece)) return void req.once("drain", pump);
        }
        if (!done) req.end();
      };
      pump();
    } else req.end(opts.body);
  });
}

async function pageLatencies(stop: { done: boolean }) {
  const times: number[] = [];
  while (!stop.done) {
    const t0 = performance.now();
    await fetch(`${origin}/sign-in`).then((r) => r.arrayBuffer());
    times.push(performance.now() - t0);
  }
  return times;
}

const p99 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.99))] ?? NaN;
const fmt = (x: number) => (x >= 100 ? x.toFixed(0) : x.toPrecision(3));

const run = (overrides: object) => ({
  format: "runproof.run/1", label: "hostile", geometry: { radiusRatio: 0.35 },
  conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
  controls: { E: 1e-4, Ra: 1e7, Pr: 1 }, ...overrides,
});
const nested = (depth: number) => `${"[".repeat(depth)}${"]".repeat(depth)}`;

const cases: { name: string; path: string; type: string; body?: string; streamBytes?: number }[] = [
  { name: "200 MB form body to /sign-in", path: "/sign-in", type: "application/x-www-form-urlencoded", streamBytes: 200 * 1024 * 1024 },
  { name: "200 MB JSON body to /api/v1/check", path: "/api/v1/check", type: "application/json", streamBytes: 200 * 1024 * 1024 },
  { name: "radialPoints 1e8 to /api/v1/check", path: "/api/v1/check", type: "application/json", body: JSON.stringify({ runs: [run({ resolution: { radialPoints: 1e8, radialGrid: "chebyshev" } })] }) },
  { name: "maxDegree 1e9 to /api/v1/check", path: "/api/v1/check", type: "application/json", body: JSON.stringify({ runs: [run({ resolution: { maxDegree: 1e9 } })] }) },
  { name: "JSON nested 500,000 deep to /api/v1/check", path: "/api/v1/check", type: "application/json", body: nested(500_000) },
  { name: "series of 1,000,000 rows in a check (JSON)", path: "/api/v1/check", type: "application/json", body: JSON.stringify({ runs: [run({})], series: { hostile: { t: Array.from({ length: 1e6 }, (_, i) => i) } } }) },
  { name: "JSON body to a page action", path: "/sign-in", type: "application/json", body: JSON.stringify({ email: "a@b.example" }) },
  { name: "NUL byte in a form field", path: "/forgot-password", type: "application/x-www-form-urlencoded", body: "email=a%00%40b.example" },
];

async function main() {
  const server = spawn(process.execPath, ["scripts/serve.mjs"], {
    env: { ...process.env, PORT: String(port), HOST: "127.0.0.1", NODE_ENV: "production", APP_URL: origin, AUTH_SECRET: randomBytes(32).toString("hex"), OUTBOX_WORKER: "false", LOG_LEVEL: "warn" },
    stdio: ["ignore", "ignore", "inherit"],
  });
  try {
    for (let i = 0; i < 300; i++) {
      if (await fetch(`${origin}/healthz`).then((r) => r.ok, () => false)) break;
      await new Promise((r) => setTimeout(r, 200));
    }
    for (let i = 0; i < 20; i++) await fetch(`${origin}/sign-in`).then((r) => r.arrayBuffer()); // warm up
    const base = rssMb(server.pid!);
    const rows: string[] = [];
    for (const c of cases) {
      const stop = { done: false };
      const background = pageLatencies(stop);
      const before = rssMb(server.pid!);
      const answer = await send(c.path, c);
      await new Promise((r) => setTimeout(r, 300));
      stop.done = true;
      const latencies = await background;
      const after = rssMb(server.pid!);
      rows.push(`| ${c.name} | ${answer.status} | ${fmt(answer.ms)} ms | ${fmt(after.rss - before.rss)} MB | ${fmt(p99(latencies))} ms (${latencies.length} loads) |`);
      console.error(rows.at(-1));
    }
    const end = rssMb(server.pid!);
    const parser: string[] = [];
    const timeParse = (name: string, text: string) => {
      const t0 = performance.now();
      let outcome = "accepted";
      try {
        parseCsv(text, "series");
      } catch (e) {
        outcome = `refused: ${(e as Error).message.slice(0, 80)}`;
      }
      parser.push(`| ${name} | ${fmt(performance.now() - t0)} ms | ${outcome} |`);
    };
    timeParse("header of 1,000,000 columns", `t,${Array.from({ length: 1e6 }, (_, i) => `c${i}`).join(",")}\n0,1\n`);
    timeParse("2,600,000 rows (25 MB)", `t,Ek\n${Array.from({ length: 2.6e6 }, (_, i) => `${i},1`).join("\n")}\n`);

    const out = `| hostile request | status | answered in | server RSS change | p99 of /sign-in meanwhile |
| --- | --- | --- | --- | --- |
${rows.join("\n")}

Server RSS: ${fmt(base.rss)} MB after warm-up, ${fmt(end.rss)} MB at the end (peak ${fmt(end.peak)} MB).

| CSV parsed in process | time to answer | outcome |
| --- | --- | --- |
${parser.join("\n")}
`;
    const doc = "docs/reliability.md";
    const text = readFileSync(doc, "utf8");
    const marked = text.replace(/(<!-- measured:start -->\n)[\s\S]*?(<!-- measured:end -->)/, `$1${out}$2`);
    writeFileSync(doc, marked);
    console.log(out);
  } finally {
    server.kill("SIGTERM");
  }
}

await main();
