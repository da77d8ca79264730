/**
 * Generated hostile requests to every route with an action (read from app/routes.ts, as the access
 * matrix does), sent over HTTP to a running production server by a person who may reach the
 * action. For each case it records the status and, when the request was refused (status ≥ 400),
 * whether any table gained or lost rows meanwhile. Used by e2e/action-fuzz.spec.ts (a few cases per
 * action) and scripts/measure-reliability.ts (500 per action, with the server's log read as well).
 */
import { readFileSync } from "node:fs";
import type { RouteConfigEntry } from "@react-router/dev/routes";
import fc from "fast-check";
import type { Sql } from "postgres";
import routes from "../../app/routes";
import type { AccessWorld, Persona } from "./make-access-world";

type Cell = AccessWorld["cells"]["single"]["draft"];
export type Who = Persona | "anonymous";
export type Target = { file: string; url: string; who: Who; intents: string[]; body: "form" | "json"; token?: boolean; method?: "POST" | "PUT" };

/** API actions whose only write is a PUT (a new version of the resource); every other action takes POST. */
const PUT_ACTIONS = new Set(["routes/api/v1/run.ts", "routes/api/v1/claim.ts"]);

/**
 * Tables that change without the request under test writing them: sessions and rate-limit
 * counters (written on every sign-in attempt, by design), the check job's results (a worker
 * process writes them after an earlier accepted change) and e-mail verification tokens.
 */
export const VOLATILE_TABLES = new Set(["session", "rate_limit", "rate_limit_counter", "run_checks", "flags", "verification"]);

type Flat = { file: string; path: string; hasAction: boolean; isIndex: boolean };
function flatten(entries: RouteConfigEntry[], prefix = ""): Flat[] {
  return entries.flatMap((e) => {
    const path = e.path === undefined ? prefix : `${prefix}/${e.path}`.replace(/\/+/g, "/");
    const text = readFileSync(new URL(`../../app/${e.file}`, import.meta.url), "utf8");
    return [
      { file: e.file, path: path || "/", hasAction: /export (async )?function action|export const action/.test(text), isIndex: Boolean(e.index) },
      ...flatten(e.children ?? [], path),
    ];
  });
}

/** The intents a route's action tells apart, read from its source. */
function intentsOf(file: string) {
  const text = readFileSync(new URL(`../../app/${file}`, import.meta.url), "utf8");
  return [...new Set([...text.matchAll(/intent\s*===\s*"([a-z-]+)"/g)].map((m) => m[1]!))];
}

/** Who is sent to each action, and against which round: someone the action does not refuse outright. */
function personFor(file: string): { who: Who; state: keyof AccessWorld["cells"]["single"] } {
  if (file.includes("/rounds/desk.tsx")) return { who: "editor", state: "under-review" };
  if (file.includes("/rounds/review.tsx")) return { who: "reviewer", state: "under-review" };
  if (file.includes("/rounds/decision.tsx")) return { who: "author", state: "decided" };
  if (file.startsWith("routes/admin/")) return { who: "admin", state: "draft" };
  if (file === "routes/venues/desk.tsx") return { who: "editor", state: "draft" };
  if (file.startsWith("routes/auth/") || file === "routes/api/v1/check.ts") return { who: "anonymous", state: "draft" };
  if (file === "routes/invitations/invitation.tsx" || file === "routes/submissions/join.tsx") return { who: "stranger", state: "draft" };
  return { who: "author", state: "draft" };
}

function fill(path: string, c: Cell) {
  return path
    .replace(":venueId", c.venueId)
    .replace(":submissionId", c.submissionId)
    .replace(":round", String(c.round))
    .replace(":runId", c.runId)
    .replace(":claimId", c.claimId)
    .replace(":flagId", c.flagId)
    .replace(":token", "no-such-invitation-token")
    .replace("/*", "/no-such-page-here");
}

/** Every route with an action, with its person and URL; the auth library's endpoint by its two form-like calls. */
export function actionTargets(world: AccessWorld): Target[] {
  const out: Target[] = [];
  for (const r of flatten(routes)) {
    if (!r.hasAction) continue;
    if (r.file === "routes/api/auth.ts") {
      for (const url of ["/api/auth/sign-in/email", "/api/auth/sign-up/email", "/api/auth/request-password-reset"]) {
        out.push({ file: r.file, url, who: "anonymous", intents: [], body: "json" });
      }
      continue;
    }
    const { who, state } = personFor(r.file);
    const url = fill(r.path, world.cells.single[state]);
    const api = r.path.startsWith("/api/v1/");
    out.push({
      file: r.file,
      url: r.isIndex ? `${url}?index` : url,
      who,
      intents: intentsOf(r.file),
      body: api ? "json" : "form",
      token: api && r.file !== "routes/api/v1/check.ts",
      method: PUT_ACTIONS.has(r.file) ? "PUT" : "POST",
    });
  }
  return out;
}

// --- generated values ----------------------------------------------------------------------------

const FIELD_NAMES = [
  "intent", "title", "abstract", "keywords", "label", "statement", "figure", "body", "email", "password", "name",
  "affiliation", "decision", "letter", "version", "expectedVersion", "runId", "claimId", "flagId", "remarkId",
  "invitationId", "contributorId", "userId", "venueId", "tokenId", "token", "answer", "response", "verdict",
  "recommendation", "editorNote", "anchorKind", "anchorRef", "dueAt", "editorEmail", "role", "next", "namelist",
  "keyMap", "json", "record", "file", "manuscript", "confirm", "digest", "scopes", "expiresInDays", "slug", "blinding",
];

const SPECIAL = [
  "", " ", "0", "-1", "1", "2147483647", "2147483648", "99999999999", "-99999999999", "1e308", "-1e308", "NaN",
  "Infinity", "null", "undefined", "true", "[]", "{}", '{"type":"doc","content":[]}', '{"type":"doc","content":[{"type":"paragraph"}]}',
  "{\"a\":", "[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]",
  "\u0000", "a\u0000b", "\ud800", "x\udfffy", "\u202e", "\ufeff", "../../etc/passwd", "/\\evil.example", "//evil.example",
  "javascript:alert(1)", "<script>alert(1)</script>", "'; drop table runs; --", "%00", "%", "=HYPERLINK(\"x\")",
  "accept", "reject", "major-revision", "minor-revision", "round", "claim", "run", "author", "co-author", "editor",
  "2026-13-45", "2026-02-30", "1970-01-01", "9999-12-31", "00000000-0000-0000-0000-000000000000", "not-a-uuid",
  "a@b", "x@runproof.example", "ab".repeat(5_000),
];

function valueArb(ids: string[]) {
  return fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...SPECIAL) },
    { weight: 3, arbitrary: fc.string({ unit: "grapheme-ascii", maxLength: 60 }) },
    { weight: 2, arbitrary: fc.string({ maxLength: 60 }) },
    { weight: 1, arbitrary: fc.oneof(mutated(RUN), mutated(CLAIM)).map((r) => JSON.stringify(r)) },
    { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 30 }) },
    { weight: 1, arbitrary: fc.constantFrom(...ids) },
    { weight: 1, arbitrary: fc.uuid() },
    { weight: 1, arbitrary: fc.oneof(fc.integer(), fc.double()).map(String) },
    { weight: 1, arbitrary: fc.json({ maxDepth: 3 }) },
  );
}

const example = (path: string) => JSON.parse(readFileSync(new URL(`../../examples/${path}`, import.meta.url), "utf8")) as unknown;
const RUN = example("runs/ref-A.json");
const CLAIM = example("claims/layer-zonal-flow.json");

/** Every path to a leaf of a JSON value. */
function leafPaths(value: unknown, at: (string | number)[] = []): (string | number)[][] {
  if (value && typeof value === "object") {
    const entries = Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value);
    return entries.flatMap(([k, v]) => leafPaths(v, [...at, k]));
  }
  return [at];
}

/** A valid record with one to three leaves replaced by hostile values, so cases get past the schema's first checks. */
function mutated(record: unknown) {
  const paths = leafPaths(record);
  const hostile = fc.oneof(
    fc.constantFrom(0, -1, 1e308, -1e308, 2 ** 31, 2 ** 53, 1e-320, 4096, 4097, 1e8, "", "\u0000", null, true, [], {}, "NaN"),
    fc.double(),
    fc.integer(),
    fc.string({ maxLength: 40 }),
  );
  return fc.array(fc.tuple(fc.nat(paths.length - 1), hostile), { minLength: 1, maxLength: 3 }).map((edits) => {
    const copy = structuredClone(record) as Record<string | number, unknown>;
    for (const [i, v] of edits) {
      const path = paths[i]!;
      let node = copy;
      for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
      if (path.length) node[path.at(-1)!] = v;
    }
    return copy;
  });
}

export type Case = { intent: string | null; fields: [string, string][]; multipart: boolean; raw: string | null; json: unknown };

export function caseArb(target: Target, ids: string[]): fc.Arbitrary<Case> {
  const value = valueArb(ids);
  const field = fc.tuple(fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...FIELD_NAMES) }, { weight: 1, arbitrary: fc.string({ maxLength: 12 }) }), value);
  const intent = target.intents.length
    ? fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...target.intents) }, { weight: 1, arbitrary: value })
    : fc.option(value, { nil: null, freq: 3 });
  // Bytes a browser would never send: invalid UTF-8 and broken percent escapes.
  const raw = fc.option(fc.constantFrom("x=%ED%A0%80", "x=%FF%FE", "x=%", "x=%zz", "=&&=&", "a=1&a=2&a=3", "x=" + "%41".repeat(2_000)), { nil: null, freq: 4 });
  const run = mutated(RUN);
  const claim = mutated(CLAIM);
  const jsonBody = fc.oneof(
    fc.json({ maxDepth: 4 }).map((t) => JSON.parse(t) as unknown),
    run,
    claim,
    fc.tuple(fc.array(run, { minLength: 1, maxLength: 3 }), fc.option(claim, { nil: undefined })).map(([runs, c]) => ({ runs, claim: c })),
    fc.dictionary(fc.constantFrom(...FIELD_NAMES, "format", "controls", "resolution", "runs", "geometry", "stated", "series"), fc.jsonValue({ maxDepth: 3 })),
  );
  return fc.record({ intent, fields: fc.array(field, { maxLength: 8 }), multipart: fc.boolean(), raw, json: jsonBody });
}

// --- sending --------------------------------------------------------------------------------------

export type Session = { cookie: string; token?: string };

/** Signs in through the auth endpoint and keeps the session cookie. */
export async function signIn(origin: string, email: string, password: string): Promise<Session> {
  const res = await fetch(`${origin}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { origin, "content-type": "application/json" },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in of ${email}: ${res.status} ${await res.text()}`);
  const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  return { cookie };
}

function encode(target: Target, c: Case): { body: BodyInit; type?: string } {
  if (target.body === "json") return { body: JSON.stringify(c.json), type: "application/json" };
  const fields: [string, string][] = c.intent === null ? c.fields : [["intent", c.intent], ...c.fields];
  if (c.multipart) {
    const form = new FormData();
    for (const [k, v] of fields) form.append(k, v);
    form.append("file", new Blob([fields.map(([, v]) => v).join(",")], { type: "text/csv" }), "ü bad\u0000name.csv");
    return { body: form };
  }
  const text = new URLSearchParams(fields).toString();
  return { body: c.raw ? `${text}&${c.raw}` : text, type: "application/x-www-form-urlencoded" };
}

/** Row counts of every table in the public schema, in one round trip. */
export async function rowCounts(sql: Sql): Promise<Record<string, number>> {
  const tables = await sql<{ name: string }[]>`select table_name as name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by 1`;
  const query = tables.map((t) => `select '${t.name}' as name, count(*)::int as n from "${t.name}"`).join(" union all ");
  const rows = await sql.unsafe<{ name: string; n: number }[]>(query);
  return Object.fromEntries(rows.map((r) => [r.name, r.n]));
}

export type Finding = { target: string; status: number; what: string; request: string };
export type TargetReport = { file: string; url: string; who: Who; method: string; cases: number; statuses: Record<number, number> };

export async function fuzzActions(opts: {
  origin: string;
  sql: Sql;
  targets: Target[];
  sessions: Partial<Record<Who, Session>>;
  ids: string[];
  numRuns: number;
  seed?: number;
  log?: (line: string) => void;
  /** Stops early when the server under test has gone (a crash is the finding then). */
  alive?: () => boolean;
}) {
  const findings: Finding[] = [];
  const reports: TargetReport[] = [];
  let counts = await rowCounts(opts.sql);
  for (const target of opts.targets) {
    const session = opts.sessions[target.who];
    const report: TargetReport = { file: target.file, url: target.url, who: target.who, method: target.method ?? "POST", cases: 0, statuses: {} };
    const cases = fc.sample(caseArb(target, opts.ids), { numRuns: opts.numRuns, seed: opts.seed });
    for (const c of cases) {
      if (opts.alive && !opts.alive()) {
        findings.push({ target: target.url, status: 0, what: "the server process has exited", request: "" });
        return { findings, reports };
      }
      const { body, type } = encode(target, c);
      const headers: Record<string, string> = { origin: opts.origin };
      if (type) headers["content-type"] = type;
      if (session?.cookie && !target.token) headers.cookie = session.cookie;
      if (target.token && session?.token) headers.authorization = `Bearer ${session.token}`;
      // A PUT names the version it edited, in If-Match or in the body: half the cases send a header.
      if (target.method === "PUT" && c.multipart) headers["if-match"] = (c.fields[0]?.[1] ?? '"1"').replace(/[^\x20-\x7e]/g, "").slice(0, 200);
      const shown = typeof body === "string" ? body.slice(0, 300) : JSON.stringify(c.fields).slice(0, 300);
      let status = 0;
      let text = "";
      for (let attempt = 0; attempt < 2; attempt++) {
        try {
          const res = await fetch(`${opts.origin}${target.url}`, { method: target.method ?? "POST", headers, body, redirect: "manual" });
          status = res.status;
          text = await res.text();
          break;
        } catch (error) {
          // A kept-alive connection closed just as it was reused says nothing about the action.
          if (attempt === 1) findings.push({ target: target.url, status: 0, what: `no answer: ${(error as Error).message}`, request: shown });
        }
      }
      report.cases++;
      report.statuses[status] = (report.statuses[status] ?? 0) + 1;
      if (status >= 500) findings.push({ target: target.url, status, what: text.slice(0, 300), request: shown });
      const after = await rowCounts(opts.sql);
      if (status >= 400) {
        const changed = Object.keys(after).filter((t) => !VOLATILE_TABLES.has(t) && after[t] !== counts[t]);
        if (changed.length) {
          findings.push({ target: target.url, status, what: `rows changed on a refused request: ${changed.map((t) => `${t} ${counts[t]}→${after[t]}`).join(", ")}`, request: shown });
        }
      }
      counts = after;
    }
    opts.log?.(`${target.who} ${target.method ?? "POST"} ${target.url}: ${report.cases} cases, ${JSON.stringify(report.statuses)}`);
    reports.push(report);
  }
  return { findings, reports };
}

/** Ids of the world a case may name (so some requests reach deep into the actions). */
export function worldIds(world: AccessWorld) {
  const ids = new Set<string>();
  for (const blinding of ["single", "double"] as const) {
    for (const cell of Object.values(world.cells[blinding])) {
      for (const id of [cell.venueId, cell.submissionId, cell.runId, cell.claimId, cell.flagId, cell.remarkId]) if (id) ids.add(id);
    }
  }
  for (const p of Object.values(world.people)) ids.add(p.id);
  return [...ids];
}
