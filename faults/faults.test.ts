/**
 * Faults (`npm run test:faults`; not part of `npm test`, since it stops this checkout's services):
 * the mail catcher down, object storage down during an upload, PostgreSQL restarted under load, a
 * job worker killed in the middle of a check. Each test prints its figures (FIGURE lines) for
 * docs/reliability.md. Runs on a database of its own, made by scripts/test-faults.sh.
 */
import { request as httpRequest } from "node:http";
import { execFile } from "node:child_process";
import { readFileSync } from "node:fs";
import { loadavg } from "node:os";
import { promisify } from "node:util";
import { eq, like, sql as dsql } from "drizzle-orm";
import PgBoss from "pg-boss";
import { afterAll, describe, expect, it } from "vitest";
import { createDatabase } from "~db/client";
import { DEMO_PASSWORD, demoPeople } from "~db/demo-data";
import { attachments, outbox, rounds, runChecks, runs, runVersions, storedFiles, user } from "~db/schema";
import { createApiToken } from "~/api/api-tokens.server";
import { DATABASE_RETRY_AFTER_SECONDS } from "~/lib/database-unavailable";
import { QUEUE_SETTINGS, QUEUES } from "~/jobs/queues";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { attachCsv } from "~/workspace/attachments.server";
import { addRun } from "~/workspace/run-edits.server";
import { makeDraftRound } from "../e2e/support/make-draft-round";
import { servicesUp, startApp, startWorker, stopService, waitFor, type Proc } from "./processes";

const url = process.env.DATABASE_URL!;
if (!new URL(url).pathname.endsWith("_test")) throw new Error("the fault tests run on a *_test database only");
const { db, sql } = createDatabase(url, 4);
const SMTP_PORT = Number(process.env.SMTP_PORT ?? 1025);
const S3_PORT = Number(process.env.S3_PORT ?? 4569);
const CATCHER = process.env.MAIL_CATCHER_URL ?? "http://127.0.0.1:1080";
const PORT = Number(process.env.FAULTS_PORT ?? 3192);
const origin = `http://127.0.0.1:${PORT}`;
const started: Proc[] = [];
// The writers of the database test send more than the API's per-token limit (120 a minute):
// the limit is lifted so that every refusal seen is the outage's.
const APP_ENV = { API_RATE_LIMIT_PER_MINUTE: "100000" };
const figure = (name: string, value: string) => console.log(`FIGURE ${name}: ${value} (load average ${loadavg()[0]!.toFixed(2)})`);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const author = demoPeople.find((p) => p.key === "author")!;
const authorId = async () => (await db.select({ id: user.id }).from(user).where(eq(user.email, author.email)))[0]!.id;
const example = (path: string) => JSON.parse(readFileSync(new URL(`../examples/${path}`, import.meta.url), "utf8"));
const runInput = (label: string) => ({ ...example("runs/ref-A.json"), label });

afterAll(async () => {
  for (const p of started) await p.stop("SIGTERM");
  servicesUp();
  await sql.end({ timeout: 5 });
});

async function signIn() {
  const res = await fetch(`${origin}/api/auth/sign-in/email`, { method: "POST", headers: { origin, "content-type": "application/json" }, body: JSON.stringify({ email: author.email, password: DEMO_PASSWORD }) });
  expect(res.status).toBe(200);
  return res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
}

async function draftWithRun(title: string, label = "fault-run") {
  const fx = await makeDraftRound(db, `${title} ${Date.now()}`);
  const [round] = await db.select().from(rounds).where(eq(rounds.submissionId, fx.submissionId));
  const { run } = await addRun(db, { submissionId: fx.submissionId, roundId: round!.id, origin: "form", userId: await authorId(), input: runInput(label) });
  return { ...fx, roundId: round!.id, runId: run.id };
}

describe("the mail catcher is down", () => {
  it("keeps queued mail and delivers it exactly once when the catcher is back", async () => {
    started.push(await startWorker());
    await stopService("maildev", SMTP_PORT);
    const tag = `fault-mail-${Date.now()}`;
    const id = await enqueueMail(db, author.email, compose({ subject: `Notice ${tag}`, greeting: "Hello,", paragraphs: ["A message queued while mail was down."] }));
    const row = async () => (await db.select().from(outbox).where(eq(outbox.id, id!)))[0]!;
    await waitFor("a failed delivery attempt", async () => (await row()).attempts >= 1, 30_000);
    expect((await row()).state).toBe("queued");
    expect((await row()).lastError).toBeTruthy();
    const downAt = Date.now();
    servicesUp();
    const caught = async () => ((await (await fetch(`${CATCHER}/api/email`)).json()) as { subject: string }[]).filter((m) => m.subject.includes(tag));
    await waitFor("the delivery", async () => (await caught()).length >= 1, 120_000, 500);
    figure("mail delivered after the catcher came back", `${((Date.now() - downAt) / 1000).toFixed(1)} s (back-off 10 s, 20 s, …)`);
    // Several more outbox passes: still one copy.
    await sleep(4000);
    expect(await caught()).toHaveLength(1);
    expect((await row()).state).toBe("sent");
  });
});

describe("object storage goes down during an upload", () => {
  it("answers 503 with a clear message, stores no row, and takes the same upload once storage is back", async () => {
    started.push(await startApp(PORT, APP_ENV));
    const cookie = await signIn();
    const fx = await draftWithRun("Storage fault");
    const path = `/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/runs/${fx.runId}/attachments?kind=series&filename=series.csv`;
    const csv = Buffer.from(`t,kineticEnergy\n${Array.from({ length: 60_000 }, (_, i) => `${i / 100},${100 + Math.sin(i / 50)}`).join("\n")}\n`);
    const rowsOfRound = async () =>
      (await db.select({ id: attachments.id }).from(attachments).innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId)).where(like(storedFiles.key, `attachments/${fx.roundId}/%`))).length;
    const filesBefore = (await db.select({ n: dsql<number>`count(*)::int` }).from(storedFiles))[0]!.n;

    const answer = await new Promise<{ status: number; body: string; ms: number }>((resolve, reject) => {
      const t0 = Date.now();
      const req = httpRequest(`${origin}${path}`, { method: "POST", headers: { origin, cookie, "content-type": "text/csv", "content-length": String(csv.length) } });
      req.on("response", (res) => {
        let body = "";
        res.on("data", (c) => (body += c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, body, ms: Date.now() - t0 }));
      });
      req.on("error", reject);
      const third = Math.floor(csv.length / 3);
      req.write(csv.subarray(0, third));
      // Storage stops with a third of the file sent; the rest follows.
      void stopService("s3rver", S3_PORT).then(() => req.end(csv.subarray(third)), reject);
    });
    figure("upload with storage down answered", `${answer.status} in ${(answer.ms / 1000).toFixed(1)} s`);
    expect(answer.status).toBe(503);
    expect(JSON.parse(answer.body).error.message).toMatch(/storage is not answering.*Nothing was saved.*again/);
    expect(await rowsOfRound()).toBe(0);
    expect((await db.select({ n: dsql<number>`count(*)::int` }).from(storedFiles))[0]!.n).toBe(filesBefore);

    servicesUp();
    const again = await fetch(`${origin}${path}`, { method: "POST", headers: { origin, cookie, "content-type": "text/csv" }, body: csv });
    expect(again.status, await again.clone().text()).toBe(201);
    expect(await rowsOfRound()).toBe(1);
  });
});

describe("PostgreSQL restarts under load", () => {
  it("answers 503 with Retry-After while it is away, serves again without restarting the app, and every acknowledged write is in the database", async () => {
    const app = started.find((p) => p.child.spawnargs.includes("scripts/serve.mjs")) ?? (started.push(await startApp(PORT, APP_ENV)), started.at(-1)!);
    const pid = app.child.pid;
    const fx = await draftWithRun("Database restart");
    const { secret } = await createApiToken(db, { userId: await authorId(), name: "fault test", scopes: ["read", "write:runs"], expiresInDays: 1 });
    const cookie = await signIn();
    const runsUrl = `${origin}/api/v1/submissions/${fx.submissionId}/rounds/1/runs`;
    const pageUrl = `${origin}/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/runs`;
    type Outcome = { label: string; status: number; at: number; ms: number; retryAfter: string | null; body: string };
    const outcomes: Outcome[] = [];
    const pages: Outcome[] = [];
    let n = 0;
    let stop = false;
    let stopReading = false;
    const t0 = Date.now();
    const answer = (label: string, sent: number) => async (r: Response): Promise<Outcome> => ({ label, status: r.status, at: Date.now() - t0, ms: Date.now() - sent, retryAfter: r.headers.get("retry-after"), body: await r.text() });
    const failedAt = (label: string, sent: number) => (): Outcome => ({ label, status: 0, at: Date.now() - t0, ms: Date.now() - sent, retryAfter: null, body: "" });
    // Four clients write runs through the API; a refused write is tried again after 250 ms.
    const client = async () => {
      while (!stop) {
        const label = `pg-${n++}`;
        const sent = Date.now();
        const o = await fetch(runsUrl, { method: "POST", headers: { authorization: `Bearer ${secret}`, "content-type": "application/json" }, body: JSON.stringify(runInput(label)) })
          .then(answer(label, sent))
          .catch(failedAt(label, sent));
        outcomes.push(o);
        if (o.status !== 201) await sleep(250);
      }
    };
    // One signed-in person reads a page of the round (a document request, not the API).
    const reader = async () => {
      while (!stopReading) {
        const sent = Date.now();
        pages.push(await fetch(pageUrl, { headers: { cookie }, redirect: "manual" }).then(answer("page", sent)).catch(failedAt("page", sent)));
        await sleep(250);
      }
    };
    const clients = Array.from({ length: 4 }, client);
    const reading = reader();
    await sleep(4000);
    const restartAt = Date.now() - t0;
    await promisify(execFile)("bash", ["-c", 'source scripts/lib/common.sh && rp_pg_resolve && rp_as_pg "$PG_BIN/pg_ctl" -D "$PG_DATA" -l "$PG_LOG" -m fast -w -t 60 restart >/dev/null']);
    const upAt = Date.now() - t0;
    await waitFor("a write acknowledged after the restart", () => outcomes.some((o) => o.status === 201 && o.at > upAt), 60_000).catch((e: unknown) => {
      stop = stopReading = true;
      // Say so when the app died instead of answering (see docs/reliability.md, "Not covered yet").
      if (app.child.exitCode !== null || app.child.signalCode !== null) {
        throw new Error(`the app process exited during the restart (code ${app.child.exitCode ?? app.child.signalCode}); its last lines:\n${app.log.slice(-12).join("\n")}`);
      }
      throw e;
    });
    await sleep(3000);
    stop = true;
    await Promise.all(clients);
    await waitFor("a page served after the restart", () => pages.some((p) => p.status === 200 && p.at > upAt), 60_000);
    stopReading = true;
    await reading;
    const firstOkAfter = outcomes.find((o) => o.status === 201 && o.at > upAt)!.at;
    const failed = outcomes.filter((o) => o.status !== 201);
    const acknowledged = outcomes.filter((o) => o.status === 201).map((o) => o.label);
    const stored = new Set((await db.select({ label: runs.label }).from(runs).where(eq(runs.submissionId, fx.submissionId))).map((r) => r.label));
    const tally = (list: Outcome[]) => {
      const by = new Map<number, number>();
      for (const o of list) by.set(o.status, (by.get(o.status) ?? 0) + 1);
      return [...by].sort((a, b) => a[0] - b[0]).map(([status, k]) => `${status}×${k}`).join(" ");
    };
    const firstPageAfter = pages.find((p) => p.status === 200 && p.at > upAt)?.at;
    figure(
      "PostgreSQL fast restart under 4 writing clients and a page reader",
      `restart took ${((upAt - restartAt) / 1000).toFixed(1)} s; first acknowledged write ${((firstOkAfter - upAt) / 1000).toFixed(1)} s after it; ${outcomes.length} writes (${tally(outcomes)}), ${acknowledged.length} acknowledged, ${failed.length} refused; page loads ${pages.length} (${tally(pages)}), first page after the restart ${firstPageAfter === undefined ? "none" : `${((firstPageAfter - upAt) / 1000).toFixed(1)} s after it`}; answers 500: ${[...outcomes, ...pages].filter((o) => o.status === 500).length}; slowest 503 ${(Math.max(0, ...[...outcomes, ...pages].filter((o) => o.status === 503).map((o) => o.ms)) / 1000).toFixed(1)} s; acknowledged but missing: ${acknowledged.filter((l) => !stored.has(l)).length}`,
    );
    expect(acknowledged.filter((l) => !stored.has(l))).toEqual([]);
    expect(app.child.pid).toBe(pid);
    expect(app.child.exitCode).toBeNull();
    expect((await fetch(`${origin}/readyz`)).status).toBe(200);
    // The refusals during the restart are answers, not hangs or dropped connections, and every
    // one is a 503 saying the database is away, with Retry-After (never a 500).
    expect(failed.filter((f) => f.status === 0)).toEqual([]);
    expect(failed.length, "the restart came and went without a refused write: nothing was tested").toBeGreaterThan(0);
    expect(failed.map((f) => f.status).filter((s) => s !== 503)).toEqual([]);
    for (const f of failed) {
      expect(f.retryAfter).toBe(String(DATABASE_RETRY_AFTER_SECONDS));
      expect(JSON.parse(f.body).error.code).toBe("database_unavailable");
    }
    const pageRefusals = pages.filter((p) => p.status !== 200);
    expect(pageRefusals.map((p) => p.status).filter((s) => s !== 503)).toEqual([]);
    for (const p of pageRefusals) {
      expect(p.retryAfter).toBe(String(DATABASE_RETRY_AFTER_SECONDS));
      expect(p.body).toContain("reach its database right now");
    }
    // Pages are served again too, without restarting the app.
    expect(firstPageAfter).toBeDefined();
  });
});

describe("a worker is killed in the middle of a check", () => {
  it("has the check done again by another worker, its results stored once", async () => {
    const worker = started.find((p) => p.child.spawnargs.includes("scripts/worker.ts")) ?? (started.push(await startWorker()), started.at(-1)!);
    const fx = await draftWithRun("Killed worker", "kill-0");
    const userId = await authorId();
    const runIds = [fx.runId];
    for (let i = 1; i < 4; i++) runIds.push((await addRun(db, { submissionId: fx.submissionId, roundId: fx.roundId, origin: "form", userId, input: runInput(`kill-${i}`) })).run.id);
    // Big series make the check take seconds: the job is analysing them when the worker dies.
    for (const runId of runIds) {
      const text = `t,kineticEnergy\n${Array.from({ length: 150_000 }, (_, i) => `${i / 100},${100 + Math.sin(i / 70)}`).join("\n")}\n`;
      await attachCsv(db, { roundId: fx.roundId, runId, kind: "series", body: new Blob([text]).stream() as ReadableStream<Uint8Array>, filename: "big.csv", userId, limitBytes: 50 * 1024 * 1024 });
    }
    const boss = new PgBoss({ connectionString: url, max: 1, schema: "pgboss", supervise: false, schedule: false });
    await boss.start();
    try {
      // A short expiry for this test's job only, so the dead worker's job is noticed in seconds
      // (the queue's own is QUEUE_SETTINGS: 15 minutes).
      await boss.send(QUEUES.recheck, { roundId: fx.roundId }, { singletonKey: fx.roundId, expireInSeconds: 10, retryLimit: QUEUE_SETTINGS[QUEUES.recheck].retryLimit, retryDelay: 1 });
      const jobs = () => sql<{ id: string; state: string; retry_count: number }[]>`select id, state, retry_count from pgboss.job where name = ${QUEUES.recheck} and singleton_key = ${fx.roundId} order by created_on`;
      await waitFor("the check to start", async () => (await jobs()).some((j) => j.state === "active"), 60_000, 50).catch((e: unknown) => {
        if (worker.child.exitCode !== null || worker.child.signalCode !== null) {
          throw new Error(`the worker had exited before this test (code ${worker.child.exitCode ?? worker.child.signalCode}); its last lines:\n${worker.log.slice(-40).join("\n")}`);
        }
        throw new Error(`${e instanceof Error ? e.message : e}; the worker's last lines:\n${worker.log.slice(-40).join("\n")}`);
      });
      await sleep(300);
      worker.child.kill("SIGKILL");
      await waitFor("the worker to die", () => worker.child.exitCode !== null || worker.child.signalCode !== null, 10_000);
      const [mid] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
      expect(mid!.checkedSeq, "the check finished before the worker was killed: make it heavier").toBeLessThan(mid!.changeSeq);
      const killedAt = Date.now();
      const second = await startWorker();
      started.push(second);
      await waitFor("the round to be checked", async () => {
        const [r] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
        return r!.checkedSeq === r!.changeSeq;
      }, 240_000, 500);
      const list = await jobs();
      figure("check finished in a second worker after a kill", `${((Date.now() - killedAt) / 1000).toFixed(1)} s; jobs for the round: ${list.map((j) => `${j.state}(retries ${j.retry_count})`).join(", ")}`);
      // The killed job no longer counts as running: it expired and waits for its retry (a no-op
      // by then: the check is idempotent), and the round's check was done by another worker.
      expect(list[0]!.state).not.toBe("active");
      expect(list.filter((j) => j.state === "completed").length).toBeGreaterThanOrEqual(1);
      const checked = await db.select({ n: dsql<number>`count(*)::int` }).from(runChecks).innerJoin(runVersions, eq(runVersions.id, runChecks.runVersionId)).innerJoin(runs, eq(runs.id, runVersions.runId)).where(eq(runs.submissionId, fx.submissionId));
      expect(checked[0]!.n).toBe(runIds.length);
      const analysed = await db.select({ analysis: attachments.analysis }).from(attachments).innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId)).where(like(storedFiles.key, `attachments/${fx.roundId}/%`));
      expect(analysed.filter((a) => a.analysis).length).toBe(runIds.length);
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
  });
});
