/**
 * Generated hostile requests to every form and API action, 500 per action by default, against the
 * production server and a job worker started here with their logs captured, on a database of its own; figures go to
 * docs/reliability.md between the fuzz markers. A measurement, not a test (the few-case version is
 * e2e/action-fuzz.spec.ts). Needs `react-router build` and the services.
 *
 *   npm run --silent measure:fuzz [-- cases-per-action]
 *   FUZZ_ONLY=<regex over route files> FUZZ_MARK=<block name> npm run --silent measure:fuzz   (some actions only)
 * The sign-in and API limits are lifted on this server so that cases reach the actions.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { loadavg } from "node:os";
import { readFileSync, writeFileSync } from "node:fs";
import postgres from "postgres";
import { createDatabase } from "../database/client.ts";
import { actionTargets, fuzzActions, signIn, worldIds, type Session, type Who } from "../e2e/support/action-fuzz.ts";
import { WORLD_PASSWORD } from "../e2e/support/make-access-world.ts";
import { makeFuzzWorld } from "../e2e/support/make-fuzz-world.ts";
import { dropScratchDatabase, scratchDatabase } from "./lib/scratch-database.ts";

const cases = Number(process.argv[2] ?? 500);
const port = Number(process.env.MEASURE_PORT ?? 3191);
const origin = `http://127.0.0.1:${port}`;

/** Lines a process wrote that say something went wrong: pino level ≥ 50, or anything not a pino line (stack traces). */
function watch(child: ChildProcess, name: string, bad: string[]) {
  let rest = "";
  const onData = (chunk: Buffer) => {
    const lines = (rest + chunk.toString("utf8")).split("\n");
    rest = lines.pop()!;
    for (const line of lines) {
      if (!line.trim()) continue;
      try {
        const entry = JSON.parse(line) as { level?: number; msg?: string };
        if ((entry.level ?? 0) >= 50) bad.push(`${name}: ${line.slice(0, 400)}`);
      } catch {
        // Node's own warning about the AWS SDK and Node 20 is not an error of ours.
        if (/Runproof worker ready|NodeVersionSupportWarning|versions published after|require node >=22|You are running node|continue receiving updates|security updates please|a\.co\/|--trace-warnings/.test(line)) continue;
        bad.push(`${name}: ${line.slice(0, 400)}`);
      }
    }
  };
  child.stdout?.on("data", onData);
  child.stderr?.on("data", onData);
}

async function main() {
  // A database of its own: row counts must not move with other tests' writes.
  const databaseUrl = await scratchDatabase("fuzz");
  const env = { ...process.env, DATABASE_URL: databaseUrl, NODE_ENV: "production", APP_URL: origin, AUTH_SECRET: randomBytes(32).toString("hex"), AUTH_RATE_LIMIT: "false", API_RATE_LIMIT_PER_MINUTE: "1000000", OUTBOX_POLL_MS: "300", LOG_LEVEL: "warn" };
  const bad: string[] = [];
  const server = spawn(process.execPath, ["scripts/serve.mjs"], { env: { ...env, PORT: String(port), HOST: "127.0.0.1" }, stdio: ["ignore", "pipe", "pipe"] });
  const worker = spawn(process.execPath, ["--max-old-space-size=768", "--import", "tsx", "scripts/worker.ts"], { env, stdio: ["ignore", "pipe", "pipe"] });
  watch(server, "server", bad);
  watch(worker, "worker", bad);
  const { db, sql: fixtureSql } = createDatabase(databaseUrl, 2);
  const sql = postgres(databaseUrl, { max: 1 });
  try {
    for (let i = 0; i < 300; i++) {
      if (await fetch(`${origin}/healthz`).then((r) => r.ok, () => false)) break;
      await new Promise((r) => setTimeout(r, 200));
    }
    const { world, authorToken } = await makeFuzzWorld(db, `fz${Date.now()}`);
    const only = process.env.FUZZ_ONLY ? new RegExp(process.env.FUZZ_ONLY) : null;
    const targets = actionTargets(world).filter((t) => !only || only.test(t.file));
    const sessions: Partial<Record<Who, Session>> = { anonymous: { cookie: "" } };
    for (const who of new Set(targets.map((t) => t.who))) if (who !== "anonymous") sessions[who] = await signIn(origin, world.people[who].email, WORLD_PASSWORD);
    sessions.author!.token = authorToken;
    const load0 = loadavg()[0]!;
    const t0 = performance.now();
    const { findings, reports } = await fuzzActions({ origin, sql, targets, sessions, ids: worldIds(world), numRuns: cases, log: (l) => console.error(l), alive: () => server.exitCode === null && server.signalCode === null });
    const minutes = (performance.now() - t0) / 60_000;
    const alive = server.exitCode === null && worker.exitCode === null;
    const total = reports.reduce((n, r) => n + r.cases, 0);
    const count = (pred: (s: number) => boolean) => reports.reduce((n, r) => n + Object.entries(r.statuses).filter(([s]) => pred(Number(s))).reduce((m, [, k]) => m + k, 0), 0);
    const fiveHundreds = findings.filter((f) => f.status >= 500).length;
    const leftRows = findings.filter((f) => f.what.startsWith("rows changed")).length;
    const rows = reports.map((r) => `| ${r.who} | \`${r.file.replace(/^routes\//, "")}\`${r.url.startsWith("/api/auth") ? ` (${r.url})` : ""}${r.method === "POST" ? "" : ` (${r.method})`} | ${r.cases} | ${Object.entries(r.statuses).map(([s, n]) => `${s}×${n}`).join(" ")} |`);
    const out = `${total.toLocaleString("en")} requests to ${reports.length} actions (${cases} per action) in ${minutes.toFixed(1)} min, load average ${load0.toFixed(2)} → ${loadavg()[0]!.toFixed(2)} (2 cores):
responses ≥ 500: **${fiveHundreds}**; refused requests that left rows: **${leftRows}**; error lines in the server's and worker's logs: **${bad.length}**; both processes alive at the end: **${alive ? "yes" : "no"}**. Accepted (< 400): ${count((s) => s < 400)}, refused (4xx): ${count((s) => s >= 400 && s < 500)}.

| person | action | cases | statuses |
| --- | --- | --- | --- |
${rows.join("\n")}
`;
    const byKind = new Map<string, number>();
    for (const f of findings) byKind.set(`${f.status} ${f.target} ${f.what.slice(0, 80)}`, (byKind.get(`${f.status} ${f.target} ${f.what.slice(0, 80)}`) ?? 0) + 1);
    for (const [k, n] of byKind) console.error(`FINDING ×${n}: ${k}`);
    for (const f of findings.slice(0, 30)) console.error(`FINDING ${f.status} ${f.target}: ${f.what}\n   sent: ${f.request}`);
    for (const line of bad.slice(0, 30)) console.error(`LOG ${line}`);
    const doc = "docs/reliability.md";
    // FUZZ_MARK names another block of the document (e.g. a re-run of some actions only).
    const mark = process.env.FUZZ_MARK ?? "fuzz";
    writeFileSync(doc, readFileSync(doc, "utf8").replace(new RegExp(`(<!-- ${mark}:start -->\\n)[\\s\\S]*?(<!-- ${mark}:end -->)`), `$1${out}$2`));
    console.log(out);
    if (findings.length || bad.length || !alive) process.exitCode = 1;
  } finally {
    server.kill("SIGTERM");
    worker.kill("SIGTERM");
    await sql.end({ timeout: 5 });
    await fixtureSql.end({ timeout: 5 });
    await new Promise((r) => setTimeout(r, 2000));
    await dropScratchDatabase(databaseUrl);
  }
}

await main();
