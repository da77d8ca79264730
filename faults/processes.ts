/**
 * Processes and services the fault tests start, stop and restart: the production server and job
 * workers (spawned here, on the fault run's own database) and this checkout's maildev, s3rver and
 * PostgreSQL (through scripts/services.sh and pg_ctl, by their pid files; nothing else is touched).
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { existsSync, readFileSync } from "node:fs";
import { connect } from "node:net";

const root = process.cwd();
const run = `${root}/.data/run`;
export const AUTH_SECRET = randomBytes(32).toString("hex");

export type Proc = { child: ChildProcess; log: string[]; stop(signal?: NodeJS.Signals): Promise<void> };

function track(child: ChildProcess): Proc {
  const log: string[] = [];
  const keep = (chunk: Buffer) => log.push(...chunk.toString("utf8").split("\n").filter(Boolean));
  child.stdout?.on("data", keep);
  child.stderr?.on("data", keep);
  return {
    child,
    log,
    stop: (signal = "SIGTERM") =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once("exit", () => resolve());
        child.kill(signal);
      }),
  };
}

const baseEnv = (port?: number) => ({
  ...process.env,
  NODE_ENV: "production",
  AUTH_SECRET,
  APP_URL: `http://127.0.0.1:${port ?? 3192}`,
  AUTH_RATE_LIMIT: "false",
  OUTBOX_POLL_MS: "500",
  LOG_LEVEL: "warn",
  // The test process itself runs no jobs (vitest config); the processes started here do.
  OUTBOX_WORKER: "true",
  JOBS_QUEUE: "true",
});

export async function waitFor(what: string, ok: () => Promise<boolean> | boolean, timeoutMs = 60_000, stepMs = 200) {
  const t0 = Date.now();
  while (Date.now() - t0 < timeoutMs) {
    if (await Promise.resolve(ok()).catch(() => false)) return Date.now() - t0;
    await new Promise((r) => setTimeout(r, stepMs));
  }
  throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
}

/** The production server (build/server) on `port`, with extra environment. */
export async function startApp(port: number, env: Record<string, string> = {}) {
  const p = track(spawn(process.execPath, ["scripts/serve.mjs"], { env: { ...baseEnv(port), PORT: String(port), HOST: "127.0.0.1", ...env }, stdio: ["ignore", "pipe", "pipe"] }));
  await waitFor(`the server on ${port}`, async () => (await fetch(`http://127.0.0.1:${port}/healthz`)).ok);
  return p;
}

/** A job worker (`npm run worker`). */
export async function startWorker(env: Record<string, string> = {}) {
  const p = track(spawn(process.execPath, ["--max-old-space-size=768", "--import", "tsx", "scripts/worker.ts"], { env: { ...baseEnv(), ...env }, stdio: ["ignore", "pipe", "pipe"] }));
  await waitFor("the worker", () => p.log.some((l) => l.includes("Runproof worker ready")), 90_000);
  return p;
}

export const portOpen = (port: number) =>
  new Promise<boolean>((resolve) => {
    const s = connect(port, "127.0.0.1");
    s.once("connect", () => (s.destroy(), resolve(true)));
    s.once("error", () => resolve(false));
  });

/** Stops this checkout's maildev or s3rver (its whole process group, by its pid file). */
export async function stopService(name: "maildev" | "s3rver", port: number) {
  const file = `${run}/${name}.pid`;
  if (!existsSync(file)) throw new Error(`${name} is not running from this checkout (no ${file})`);
  const pid = Number(readFileSync(file, "utf8").trim());
  try {
    process.kill(-pid, "SIGTERM");
  } catch {
    process.kill(pid, "SIGTERM");
  }
  await waitFor(`${name} to stop`, async () => !(await portOpen(port)), 20_000);
}

/** Starts whatever of this checkout's services is not running. */
export function servicesUp() {
  execFileSync("bash", ["scripts/services.sh", "up", "--quiet"], { stdio: ["ignore", "inherit", "inherit"] });
}

/** Restarts this checkout's PostgreSQL cluster (a clean, fast shutdown: sessions are cut). */
export function restartPostgres() {
  execFileSync("bash", ["-c", 'source scripts/lib/common.sh && rp_pg_resolve && rp_as_pg "$PG_BIN/pg_ctl" -D "$PG_DATA" -l "$PG_LOG" -m fast -w -t 60 restart >/dev/null'], {
    stdio: ["ignore", "inherit", "inherit"],
  });
}
