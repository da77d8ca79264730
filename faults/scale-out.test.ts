/**
 * Scale-out: Debian's nginx (scripts/system-deps.sh nginx) in front of two app processes and two
 * job workers on one PostgreSQL. Sessions, rate limits, jobs and uploads must behave as with one
 * process: a session made through one app is valid in the other, the sign-in limit counts across
 * both, every queued mail and round check is done exactly once, and concurrent uploads through both
 * apps are all stored. Part of `npm run test:faults` (run alone: `npm run test:faults -- scale-out`).
 */
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { eq, inArray, like, sql as dsql } from "drizzle-orm";
import PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDatabase } from "~db/client";
import { DEMO_PASSWORD, demoPeople } from "~db/demo-data";
import { attachments, outbox, rounds, storedFiles, user } from "~db/schema";
import { QUEUES } from "~/jobs/queues";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { addRun } from "~/workspace/run-edits.server";
import { markRoundChanged } from "~/workspace/recheck.server";
import { makeDraftRound } from "../e2e/support/make-draft-round";
import { portOpen, startApp, startWorker, waitFor, type Proc } from "./processes";

const url = process.env.DATABASE_URL!;
if (!new URL(url).pathname.endsWith("_test")) throw new Error("the scale-out test runs on a *_test database only");
const { db, sql } = createDatabase(url, 4);
const CATCHER = process.env.MAIL_CATCHER_URL ?? "http://127.0.0.1:1080";
const NGINX_PORT = Number(process.env.SCALE_PORT ?? 3193);
const APP_PORTS = [NGINX_PORT + 1, NGINX_PORT + 2];
const origin = `http://127.0.0.1:${NGINX_PORT}`;
const procs: Proc[] = [];
let nginx: ChildProcess | undefined;
let prefix = "";

beforeAll(async () => {
  prefix = mkdtempSync(join(tmpdir(), "runproof-nginx-"));
  const conf = join(prefix, "nginx.conf");
  writeFileSync(
    conf,
    `${process.getuid?.() === 0 ? "user root;\n" : ""}worker_processes 1;
daemon off;
pid ${prefix}/nginx.pid;
error_log ${prefix}/error.log warn;
events { worker_connections 512; }
http {
  access_log off;
  client_body_temp_path ${prefix}/body;
  proxy_temp_path ${prefix}/proxy;
  fastcgi_temp_path ${prefix}/fastcgi;
  uwsgi_temp_path ${prefix}/uwsgi;
  scgi_temp_path ${prefix}/scgi;
  upstream runproof { ${APP_PORTS.map((p) => `server 127.0.0.1:${p};`).join(" ")} }
  server {
    listen 127.0.0.1:${NGINX_PORT};
    client_max_body_size 30m;
    location / {
      proxy_pass http://runproof;
      proxy_http_version 1.1;
      proxy_set_header Connection "";
      proxy_set_header Host $http_host;
      proxy_set_header X-Forwarded-For $proxy_add_x_forwarded_for;
      proxy_set_header X-Forwarded-Proto $scheme;
      proxy_request_buffering off;
      add_header X-Runproof-Upstream $upstream_addr always;
    }
  }
}
`,
  );
  // Both apps answer for the proxy's address and trust it (and only it) for the client address.
  const env = { APP_URL: origin, TRUST_PROXY: "loopback", AUTH_RATE_LIMIT: "true" };
  for (const port of APP_PORTS) procs.push(await startApp(port, env));
  for (let i = 0; i < 2; i++) procs.push(await startWorker({ APP_URL: origin }));
  nginx = spawn("/usr/sbin/nginx", ["-c", conf, "-p", prefix, "-e", `${prefix}/error.log`], { stdio: "ignore" });
  await waitFor("nginx", () => portOpen(NGINX_PORT), 20_000);
});

afterAll(async () => {
  if (nginx && nginx.exitCode === null) {
    const gone = new Promise((r) => nginx!.once("exit", r));
    nginx.kill("SIGQUIT");
    await gone;
  }
  for (const p of procs) await p.stop();
  rmSync(prefix, { recursive: true, force: true });
  await sql.end({ timeout: 5 });
});

const author = demoPeople.find((p) => p.key === "author")!;

async function signIn(email: string, password: string) {
  return fetch(`${origin}/api/auth/sign-in/email`, { method: "POST", headers: { origin, "content-type": "application/json" }, body: JSON.stringify({ email, password }) });
}

describe("two app processes and two workers behind nginx", () => {
  it("keeps a session made through one app valid in the other", async () => {
    const res = await signIn(author.email, DEMO_PASSWORD);
    expect(res.status).toBe(200);
    const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const upstreams = new Set<string>();
    for (let i = 0; i < 10; i++) {
      const page = await fetch(`${origin}/dashboard`, { headers: { cookie }, redirect: "manual" });
      expect(page.status).toBe(200);
      upstreams.add(page.headers.get("x-runproof-upstream")!);
    }
    expect(upstreams.size, "requests reached both apps").toBe(2);
  });

  it("counts sign-in attempts for one account across both apps (10 per 15 minutes)", async () => {
    const victim = demoPeople.find((p) => p.key === "reviewer1")!;
    const statuses: number[] = [];
    const upstreams = new Set<string>();
    for (let i = 0; i < 12; i++) {
      const body = new URLSearchParams({ email: victim.email, password: `wrong-${i}-password` });
      const res = await fetch(`${origin}/sign-in`, { method: "POST", headers: { origin, "content-type": "application/x-www-form-urlencoded" }, body, redirect: "manual" });
      statuses.push(res.status);
      upstreams.add(res.headers.get("x-runproof-upstream")!);
    }
    expect(upstreams.size).toBe(2);
    // Per process, round-robin would allow 20 guesses; shared, the 11th is refused.
    expect(statuses.slice(0, 10).every((s) => s === 400), statuses.join(",")).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });

  it("delivers every queued mail exactly once and checks every changed round exactly once", async () => {
    const tag = `scale-${Date.now()}`;
    for (let i = 0; i < 20; i++) await enqueueMail(db, author.email, compose({ subject: `Scale ${tag} #${i}`, greeting: "Hello,", paragraphs: ["One of twenty."] }));
    const [me] = await db.select({ id: user.id }).from(user).where(eq(user.email, author.email));
    const roundIds: string[] = [];
    for (let i = 0; i < 6; i++) {
      const fx = await makeDraftRound(db, `Scale ${tag} ${i}`);
      const [round] = await db.select().from(rounds).where(eq(rounds.submissionId, fx.submissionId));
      await addRun(db, { submissionId: fx.submissionId, roundId: round!.id, origin: "form", userId: me!.id, input: { format: "runproof.run/1", label: "scale", geometry: { radiusRatio: 0.35 }, conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" }, controls: { E: 1e-4, Ra: 1e7, Pr: 1 } } });
      roundIds.push(round!.id);
    }
    const boss = new PgBoss({ connectionString: url, max: 1, schema: "pgboss", supervise: false, schedule: false });
    await boss.start();
    const sent: string[] = [];
    try {
      for (const id of roundIds) {
        await markRoundChanged(db, id);
        // null when a worker's sweep queued this round's check first (one waiting check per round).
        const jobId = await boss.send(QUEUES.recheck, { roundId: id }, { singletonKey: id });
        if (jobId) sent.push(jobId);
      }
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
    const caught = async () => ((await (await fetch(`${CATCHER}/api/email`)).json()) as { subject: string }[]).filter((m) => m.subject.includes(tag));
    await waitFor("twenty mails", async () => (await caught()).length >= 20, 120_000, 500);
    await waitFor("six checked rounds", async () => (await db.select().from(rounds).where(inArray(rounds.id, roundIds))).every((r) => r.checkedSeq === r.changeSeq), 120_000, 500);
    await new Promise((r) => setTimeout(r, 4000));
    const subjects = (await caught()).map((m) => m.subject).sort();
    expect(subjects).toEqual(Array.from({ length: 20 }, (_, i) => `Scale ${tag} #${i}`).sort());
    const mailRows = await db.select({ state: outbox.state }).from(outbox).where(like(outbox.subject, `%${tag}%`));
    expect(mailRows.every((m) => m.state === "sent")).toBe(true);
    // Each check job ran once: completed, never retried (a second worker taking it would show as a retry or a failure).
    expect(sent.length).toBeGreaterThan(0);
    const jobs = await sql<{ state: string; retry_count: number }[]>`select state, retry_count from pgboss.job where id in ${sql(sent)}`;
    expect(jobs.map((j) => `${j.state}/${j.retry_count}`)).toEqual(Array(sent.length).fill("completed/0"));
  });

  it("stores every one of twenty concurrent uploads through both apps", async () => {
    const res = await signIn(author.email, DEMO_PASSWORD);
    const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const fx = await makeDraftRound(db, `Scale uploads ${Date.now()}`);
    const [round] = await db.select().from(rounds).where(eq(rounds.submissionId, fx.submissionId));
    const [me] = await db.select({ id: user.id }).from(user).where(eq(user.email, author.email));
    const runIds: string[] = [];
    for (let i = 0; i < 5; i++) {
      const { run } = await addRun(db, { submissionId: fx.submissionId, roundId: round!.id, origin: "form", userId: me!.id, input: { format: "runproof.run/1", label: `up-${i}`, geometry: { radiusRatio: 0.35 }, conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" }, controls: { E: 1e-4, Ra: 1e7, Pr: 1 }, time: { start: 0, end: 3.9 } } });
      runIds.push(run.id);
    }
    const csv = (n: number) => `t,kineticEnergy\n${Array.from({ length: 40 }, (_, i) => `${i / 10},${n + Math.sin(i)}`).join("\n")}\n`;
    const answers = await Promise.all(
      Array.from({ length: 20 }, async (_, n) => {
        const r = await fetch(`${origin}/venues/${fx.venueId}/submissions/${fx.submissionId}/rounds/1/runs/${runIds[n % 5]}/attachments?kind=series&filename=s${n}.csv`, { method: "POST", headers: { origin, cookie, "content-type": "text/csv" }, body: csv(n) });
        return { status: r.status, upstream: r.headers.get("x-runproof-upstream") };
      }),
    );
    expect(answers.map((a) => a.status)).toEqual(Array(20).fill(201));
    expect(new Set(answers.map((a) => a.upstream)).size).toBe(2);
    const rows = await db.select({ active: attachments.active, runVersionId: attachments.runVersionId }).from(attachments).innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId)).where(like(storedFiles.key, `attachments/${round!.id}/%`));
    expect(rows).toHaveLength(20);
    expect(rows.filter((r) => r.active)).toHaveLength(5);
    expect((await db.select({ n: dsql<number>`count(distinct ${attachments.runVersionId})::int` }).from(attachments).innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId)).where(like(storedFiles.key, `attachments/${round!.id}/%`)))[0]!.n).toBe(5);
  });
});
