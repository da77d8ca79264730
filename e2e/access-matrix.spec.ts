/**
 * The access matrix: every route of app/routes.ts, requested over HTTP against the production
 * build — the page, its `.data` request, and a POST per intent where there is an action — by ten
 * kinds of people, against a round in every state at a single- and a double-blind venue.
 *
 * The expected outcome of each cell is declared by hand in `RULES` below, from the product's
 * rules (not read from the access policy's own table): a draft is private to its authors; a sent
 * round is frozen; editors see sent rounds of their venue; reviewers the rounds they accepted;
 * nobody learns that something they may not see exists (404, never 403, on pages).
 *
 * Codes in a grid: one letter per state — draft, sent, under review, decided.
 *   o  shown (200)             r  redirect elsewhere (3xx, not to sign-in)
 *   -  missing (404)           f  frozen (409: the authors' own round, already sent)
 *   a  the action was reached (any answer but 401/403/404/405/500 or a sign-in redirect)
 *   m  method not allowed (405)
 * A route with no rule fails the test. Anonymous visitors are sent to sign in on every page
 * and get 401 from the API.
 */
import { expect, request as playwrightRequest, test, type APIRequestContext } from "@playwright/test";
import { readFileSync } from "node:fs";
import type { RouteConfigEntry } from "@react-router/dev/routes";
import routes from "../app/routes";
import type { AccessWorld, Persona, WorldState } from "./support/make-access-world";
import { fixture } from "./support/review";
import { ORIGIN } from "./support/origin";

const PASSWORD = "matrix-passphrase-7741";
const STATES: WorldState[] = ["draft", "sent", "under-review", "decided"];
const PEOPLE: Persona[] = ["stranger", "author", "coauthor", "invited", "reviewer", "otherRound", "editorOther", "editor", "admin"];
type Who = Persona | "anonymous";
type Grid = Partial<Record<Persona, string>>; // unlisted persona: "----"
type Rule =
  | { kind: "round"; get: Grid; post?: Record<string, Grid>; destructive?: string[]; api?: boolean; apiPost?: "u" | "m"; anonymous?: string }
  | { kind: "global"; get: Partial<Record<Who, string>>; post?: Partial<Record<Who, string>>; noData?: boolean }
  | { kind: "skip"; why: string };

// --- who may do what, by hand ------------------------------------------------------------------
const authors = (g: string): Grid => ({ author: g, coauthor: g });
const readers = (g: { authors: string; reviewer: string; editor: string; invited?: string }): Grid => ({
  ...authors(g.authors),
  reviewer: g.reviewer,
  editor: g.editor,
  admin: g.editor,
  ...(g.invited ? { invited: g.invited } : {}),
});
/** Round content: authors always; editors and the admin once sent; the reviewer of that round. */
const CONTENT = readers({ authors: "oooo", reviewer: "--oo", editor: "-ooo" });
/** Author writes: only while the round is a draft; afterwards their own round answers "frozen". */
const AUTHOR_WRITE = authors("afff");
/** Through the API an invitee may see the round's summary, and is told the rest is not theirs (403). */
const CONTENT_API: Grid = { ...CONTENT, invited: "--x-" };
/** Everyone who may open some round of the submission is sent on to it. */
const SUBMISSION_LINK: Grid = { ...authors("rrrr"), invited: "--r-", reviewer: "--rr", otherRound: "--rr", editor: "-rrr", admin: "-rrr" };
const SIGNED_IN: Partial<Record<Who, string>> = Object.fromEntries([...PEOPLE.map((p) => [p, "o"]), ["anonymous", "s"]]);
const PUBLIC: Partial<Record<Who, string>> = Object.fromEntries([...PEOPLE, "anonymous"].map((p) => [p, "o"]));
const EVERYONE = (code: string): Partial<Record<Who, string>> => Object.fromEntries([...PEOPLE, "anonymous"].map((p) => [p, code]));
const SIGNED_IN_ACTS: Partial<Record<Who, string>> = { ...EVERYONE("a"), anonymous: "s" };
const ADMIN_ONLY: Partial<Record<Who, string>> = { ...Object.fromEntries(PEOPLE.map((p) => [p, "x"])), admin: "o", anonymous: "s" };

const RULES: Record<string, Rule> = {
  // the round tree
  "routes/venues/submissions/layout.tsx": { kind: "skip", why: "a layout: requested through its index and children" },
  "routes/venues/submissions/index.tsx": { kind: "round", get: SUBMISSION_LINK },
  "routes/venues/submissions/details.tsx": { kind: "round", get: authors("oooo"), post: { details: AUTHOR_WRITE, invite: AUTHOR_WRITE } },
  "routes/venues/submissions/rounds/layout.tsx": { kind: "skip", why: "a layout: requested through its index and children" },
  // The overview: an invitee who has not answered is sent on to the invitation.
  "routes/venues/submissions/rounds/overview.tsx": {
    kind: "round",
    get: { ...CONTENT, invited: "--r-" },
    // Deleting the whole draft: the corresponding author only, never once sent.
    post: { "": { author: "afff", coauthor: "-fff" }, "delete-draft": { author: "afff", coauthor: "-fff" } },
    destructive: ["delete-draft"],
  },
  "routes/venues/submissions/rounds/runs/index.tsx": {
    kind: "round",
    get: CONTENT,
    post: { form: AUTHOR_WRITE, json: AUTHOR_WRITE, namelist: AUTHOR_WRITE, "bulk-json": AUTHOR_WRITE, "bulk-namelist": AUTHOR_WRITE },
  },
  // Duplicating adds a run under a label of its own; deleting removes the matrix's run.
  "routes/venues/submissions/rounds/runs/run.tsx": { kind: "round", get: CONTENT, post: { edit: AUTHOR_WRITE, duplicate: AUTHOR_WRITE, delete: AUTHOR_WRITE }, destructive: ["delete"] },
  // A run's plot copies (JSON read by the run page and the reviewer's workspace): exactly whom the run page answers.
  "routes/venues/submissions/rounds/runs/plot-data.ts": { kind: "round", get: CONTENT },
  "routes/venues/submissions/rounds/runs/attachments.ts": {
    kind: "round",
    get: readers({ authors: "mmmm", reviewer: "--mm", editor: "-mmm" }),
    post: { "": AUTHOR_WRITE },
  },
  "routes/venues/submissions/rounds/runs-csv.ts": { kind: "round", get: CONTENT },
  "routes/venues/submissions/rounds/claims/index.tsx": { kind: "round", get: CONTENT, post: { create: AUTHOR_WRITE } },
  "routes/venues/submissions/rounds/claims/claim.tsx": { kind: "round", get: CONTENT, post: { update: AUTHOR_WRITE, delete: AUTHOR_WRITE }, destructive: ["delete"] },
  // The series copies of a claim's runs (JSON read by the claim page's comparison chart): exactly whom the claim page answers.
  "routes/venues/submissions/rounds/claims/claim-plot-data.ts": { kind: "round", get: CONTENT },
  // The flags panel's rows, read when a group is opened: whoever may read the round's flags.
  "routes/venues/submissions/rounds/flags/rows.ts": { kind: "round", get: CONTENT },
  // Every flag for the reviewers' and the editor's table, read after the page: the same readers.
  "routes/venues/submissions/rounds/flags/table.ts": { kind: "round", get: CONTENT },
  "routes/venues/submissions/rounds/flags/answer.ts": { kind: "round", get: {}, post: { "": AUTHOR_WRITE } },
  "routes/venues/submissions/rounds/files.tsx": { kind: "round", get: CONTENT, post: { "": AUTHOR_WRITE } },
  "routes/venues/submissions/rounds/manuscript-pdf.ts": { kind: "round", get: CONTENT },
  // Round 1 has no earlier round to compare with: missing for everyone.
  "routes/venues/submissions/rounds/changes.tsx": { kind: "round", get: readers({ authors: "--oo", reviewer: "--oo", editor: "--oo" }) },
  "routes/venues/submissions/rounds/decision.tsx": { kind: "round", get: { ...authors("---o"), editor: "---o", admin: "---o" }, post: { respond: authors("---a") } },
  "routes/venues/submissions/rounds/letter-pdf.ts": { kind: "round", get: { ...authors("---o"), editor: "---o", admin: "---o" } },
  // The old leak: an editor downloading the packet of an unsent draft. Now missing.
  "routes/venues/submissions/rounds/packet-pdf.ts": { kind: "round", get: { reviewer: "--oo", editor: "-ooo", admin: "-ooo" } },
  "routes/venues/submissions/rounds/review.tsx": {
    kind: "round",
    get: { invited: "--o-", reviewer: "--oo" },
    post: {
      "accept-invitation": { invited: "--a-" },
      "decline-invitation": { invited: "--a-" },
      verdict: { reviewer: "--a-" },
      remark: { reviewer: "--a-" },
      "delete-remark": { reviewer: "--a-" },
      meta: { reviewer: "--a-" },
      submit: { reviewer: "--a-" },
    },
    destructive: ["accept-invitation", "decline-invitation", "submit"],
  },
  // The old leak: an editor reading an unsent draft on the desk. Now missing.
  "routes/venues/submissions/rounds/desk.tsx": {
    kind: "round",
    get: { editor: "-ooo", admin: "-ooo" },
    post: {
      invite: { editor: "-aa-" },
      reinvite: { editor: "-aa-" },
      "resend-invitation": { editor: "-aa-" },
      "withdraw-invitation": { editor: "-aa-" },
      "save-decision": { editor: "-aa-" },
      release: { editor: "-aa-" },
    },
  },
  // The authors' digest sent now: the venue's editors and the admin, once the round is sent (a POST only).
  "routes/venues/submissions/rounds/digest.ts": { kind: "round", get: {}, post: { "": { editor: "-aaa", admin: "-aaa" } } },
  "routes/venues/submissions/new.tsx": { kind: "global", get: SIGNED_IN, post: { ...Object.fromEntries(PEOPLE.map((p) => [p, "a"])), anonymous: "s" } },
  "routes/venues/desk.tsx": {
    kind: "global",
    get: { ...Object.fromEntries(PEOPLE.map((p) => [p, "-"])), editor: "o", admin: "o", anonymous: "s" },
    post: { ...Object.fromEntries(PEOPLE.map((p) => [p, "-"])), editor: "a", admin: "a", anonymous: "s" },
  },
  // Addresses of earlier versions: permanent redirects, then the new page decides.
  // (it names nothing the address did not already name, so it redirects without asking who you are)
  "routes/legacy/desk-round.tsx": { kind: "round", get: Object.fromEntries(PEOPLE.map((p) => [p, "rrrr"])), anonymous: "r" },
  "routes/legacy/submission-link.tsx": { kind: "round", get: SUBMISSION_LINK },
  "routes/legacy/review-round.tsx": { kind: "round", get: SUBMISSION_LINK },
  // the public API, read with the session cookie (writes need a token: 401 for every session)
  "routes/api/v1/submission.ts": { kind: "round", api: true, apiPost: "m", get: { ...authors("oooo"), invited: "--o-", reviewer: "--oo", otherRound: "--oo", editor: "-ooo", admin: "-ooo" } },
  "routes/api/v1/round.ts": { kind: "round", api: true, apiPost: "m", get: { ...CONTENT, invited: "--o-" } },
  "routes/api/v1/runs.ts": { kind: "round", api: true, get: CONTENT_API, apiPost: "u" },
  "routes/api/v1/run.ts": { kind: "round", api: true, get: CONTENT_API, apiPost: "m" },
  "routes/api/v1/attachments.ts": { kind: "round", api: true, get: Object.fromEntries(PEOPLE.map((p) => [p, "mmmm"])), anonymous: "m", apiPost: "u" },
  "routes/api/v1/claims.ts": { kind: "round", api: true, get: CONTENT_API, apiPost: "u" },
  "routes/api/v1/claim.ts": { kind: "round", api: true, get: CONTENT_API, apiPost: "m" },
  "routes/api/v1/flags.ts": { kind: "round", api: true, get: CONTENT_API, apiPost: "m" },
  "routes/api/v1/submissions.ts": { kind: "global", noData: true, get: { ...Object.fromEntries(PEOPLE.map((p) => [p, "o"])), anonymous: "u" }, post: EVERYONE("m") },
  "routes/api/v1/openapi.ts": { kind: "global", noData: true, get: PUBLIC },
  // The stateless check answers anyone; a form body is not a run record (4xx).
  "routes/api/v1/check.ts": { kind: "global", noData: true, get: EVERYONE("m"), post: EVERYONE("a") },
  "routes/api/v1/not-found.ts": { kind: "global", noData: true, get: EVERYONE("-"), post: EVERYONE("-") },
  "routes/api/auth.ts": { kind: "skip", why: "the auth library's own endpoints (sign-in is used by this test itself)" },
  "routes/schemas/run-1.ts": { kind: "global", noData: true, get: PUBLIC },
  "routes/schemas/claim-1.ts": { kind: "global", noData: true, get: PUBLIC },
  "routes/healthz.ts": { kind: "global", noData: true, get: PUBLIC },
  // pages outside the round tree
  "routes/shell.tsx": { kind: "skip", why: "the layout of every page" },
  "routes/home.tsx": { kind: "global", get: PUBLIC },
  "routes/help/checks.tsx": { kind: "global", get: PUBLIC },
  "routes/help/api.tsx": { kind: "global", get: PUBLIC },
  // Downloads the help pages offer: public files, like the pages.
  "routes/help/checker-download.ts": { kind: "global", noData: true, get: PUBLIC },
  "routes/help/push-run-download.ts": { kind: "global", noData: true, get: PUBLIC },
  "routes/auth/sign-in.tsx": { kind: "global", get: { ...Object.fromEntries(PEOPLE.map((p) => [p, "r"])), anonymous: "o" }, post: EVERYONE("a") },
  "routes/auth/sign-up.tsx": { kind: "global", get: PUBLIC, post: EVERYONE("a") },
  "routes/auth/check-email.tsx": { kind: "global", get: PUBLIC },
  "routes/auth/forgot-password.tsx": { kind: "global", get: PUBLIC, post: EVERYONE("a") },
  "routes/auth/reset-password.tsx": { kind: "global", get: PUBLIC, post: EVERYONE("a") },
  "routes/auth/sign-out.tsx": { kind: "skip", why: "signing out would end the sessions this test uses" },
  "routes/dashboard.tsx": { kind: "global", get: SIGNED_IN },
  "routes/account/index.tsx": { kind: "global", get: SIGNED_IN, post: SIGNED_IN_ACTS },
  "routes/account/tokens.tsx": { kind: "global", get: SIGNED_IN, post: SIGNED_IN_ACTS },
  "routes/account/digest.ts": { kind: "global", noData: true, get: Object.fromEntries([...PEOPLE, "anonymous"].map((p) => [p, p === "anonymous" ? "s" : "m"])), post: SIGNED_IN_ACTS },
  "routes/admin/layout.tsx": { kind: "skip", why: "a layout: requested through its pages" },
  "routes/admin/index.tsx": { kind: "global", get: ADMIN_ONLY },
  "routes/admin/users.tsx": { kind: "global", get: ADMIN_ONLY, post: { ...ADMIN_ONLY, admin: "a" } },
  "routes/admin/venues.tsx": { kind: "global", get: ADMIN_ONLY, post: { ...ADMIN_ONLY, admin: "a" } },
  // A link without its token (the token is the credential) is refused for everyone alike.
  "routes/submissions/join.tsx": { kind: "global", get: EVERYONE("b"), post: { ...EVERYONE("-"), anonymous: "s" } },
  "routes/invitations/invitation.tsx": { kind: "global", get: EVERYONE("-"), post: EVERYONE("a") },
  "routes/not-found.tsx": { kind: "global", get: Object.fromEntries([...PEOPLE, "anonymous"].map((p) => [p, "-"])) },
};

// --- the routes, read from app/routes.ts ---------------------------------------------------------
type FlatRoute = { file: string; path: string; hasAction: boolean; hasLoader: boolean; isPage: boolean; isIndex: boolean };

function flatten(entries: RouteConfigEntry[], prefix = ""): FlatRoute[] {
  return entries.flatMap((e) => {
    const path = e.path === undefined ? prefix : `${prefix}/${e.path}`.replace(/\/+/g, "/");
    const text = readFileSync(new URL(`../app/${e.file}`, import.meta.url), "utf8");
    const own: FlatRoute = {
      file: e.file,
      path: path || "/",
      hasAction: /export (async )?function action|export const action/.test(text),
      hasLoader: /export (async )?function loader|export const loader/.test(text),
      isPage: /export default/.test(text),
      isIndex: Boolean(e.index),
    };
    return [own, ...flatten(e.children ?? [], path)];
  });
}

function fill(path: string, c: AccessWorld["cells"]["single"]["draft"] | null, venueId: string) {
  return path
    .replace(":venueId", c?.venueId ?? venueId)
    .replace(":submissionId", c?.submissionId ?? "00000000-0000-4000-8000-000000000000")
    .replace(":round", String(c?.round ?? 1))
    .replace(":runId", c?.runId ?? "")
    .replace(":claimId", c?.claimId ?? "")
    .replace(":flagId", c?.flagId ?? "")
    .replace(":token", "no-such-invitation-token")
    .replace("/*", "/no-such-page-here");
}

function judge(code: string, status: number, location: string | null, api: boolean, isData: boolean, body: string) {
  const toSignIn = (location ?? "").includes("/sign-in") || (isData && body.includes('"/sign-in'));
  const redirected = isData ? status === 202 || (status >= 300 && status < 400) : status >= 300 && status < 400;
  switch (code) {
    case "o":
      return status === 200;
    case "-":
      return status === 404;
    case "x":
      return status === 403;
    case "f":
      return status === 409;
    case "m":
      return status === 405;
    case "b":
      return status === 400;
    case "u":
      return status === 401;
    case "s":
      return api ? status === 401 : redirected && toSignIn;
    case "r":
      return redirected && !toSignIn;
    case "a":
      return ![401, 403, 404, 405].includes(status) && status < 500 && !(redirected && toSignIn);
    default:
      throw new Error(`unknown code ${code}`);
  }
}

test("every route answers every kind of person as the rules say, in every round state", async ({ baseURL }) => {
  test.setTimeout(600_000);
  const flat = flatten(routes);
  const undeclared = flat.filter((r) => !RULES[r.file]).map((r) => `${r.file} (${r.path})`);
  expect(undeclared, "routes with no declared rule").toEqual([]);

  const world = fixture<AccessWorld>("make-access-world.ts", `m${Date.now()}`);
  const contexts = new Map<string, APIRequestContext>();
  const sessionFor = async (who: Who, blinding: "single" | "double") => {
    const key = who === "editor" ? world.editorOf[blinding] : who;
    if (contexts.has(key)) return contexts.get(key)!;
    const ctx = await playwrightRequest.newContext({ baseURL, extraHTTPHeaders: { origin: ORIGIN }, maxRedirects: 0 });
    if (key !== "anonymous") {
      const res = await ctx.post("/api/auth/sign-in/email", { data: { email: world.people[key as Persona | "editorDouble"].email, password: PASSWORD } });
      expect(res.status(), `sign-in of ${key}`).toBe(200);
    }
    contexts.set(key, ctx);
    return ctx;
  };

  type Job = { who: Who; blinding: "single" | "double"; method: "GET" | "POST"; url: string; intent: string; code: string; api: boolean; isData: boolean; label: string; secrets?: string[] };
  // The leak scan rides along: what authors read of a decided round names no reviewer and quotes
  // no editor-only note; at the double-blind venue nothing reviewers read names an author.
  const reviewerTraces = (["reviewer", "otherRound"] as const).flatMap((k) => [world.people[k].name, world.people[k].email, world.people[k].id]);
  const authorTraces = (["author", "coauthor"] as const).flatMap((k) => [world.people[k].name, world.people[k].email, world.people[k].id, `Institute of ${k} `]);
  const secretsFor = (who: Who, blinding: "single" | "double", state: WorldState) => {
    if ((who === "author" || who === "coauthor") && state === "decided") return [...reviewerTraces, "SECRET-NOTE"];
    if ((who === "reviewer" || who === "invited" || who === "otherRound") && blinding === "double") return authorTraces;
    return undefined;
  };
  let scanned = 0;
  const jobs: Job[] = [];
  // MATRIX_ONLY=parts,of,route,files checks only those routes (while working on them); every rule is still required.
  const only = process.env.MATRIX_ONLY?.split(",").filter(Boolean);
  for (const r of only?.length ? flat.filter((x) => only.some((o) => x.file.includes(o))) : flat) {
    const rule = RULES[r.file]!;
    if (rule.kind === "skip") continue;
    const wantsData = r.isPage && !(rule.kind === "global" && rule.noData);
    if (rule.kind === "global") {
      for (const who of [...PEOPLE, "anonymous"] as Who[]) {
        const url = fill(r.path, null, world.venues.single);
        const code = rule.get[who];
        if (!code) throw new Error(`${r.file}: no expectation for ${who}`);
        if (r.hasLoader || r.isPage) {
          jobs.push({ who, blinding: "single", method: "GET", url, intent: "", code, api: r.path.startsWith("/api/"), isData: false, label: `${who} GET ${r.path}` });
          if (wantsData) jobs.push({ who, blinding: "single", method: "GET", url: `${url === "/" ? "/_root" : url}.data`, intent: "", code, api: false, isData: true, label: `${who} GET ${r.path}.data` });
        }
        if (r.hasAction && !rule.post?.[who]) throw new Error(`${r.file} has an action but its rule declares no POST for ${who}`);
        if (r.hasAction) jobs.push({ who, blinding: "single", method: "POST", url, intent: "", code: rule.post![who]!, api: r.path.startsWith("/api/"), isData: false, label: `${who} POST ${r.path}` });
      }
      continue;
    }
    if (r.hasAction && !rule.post && !rule.apiPost) throw new Error(`${r.file} has an action but its rule declares no POST`);
    for (const blinding of ["single", "double"] as const) {
      STATES.forEach((state, i) => {
        const cell = world.cells[blinding][state];
        const url = fill(r.path, cell, world.venues[blinding]);
        for (const who of [...PEOPLE, "anonymous"] as Who[]) {
          const grid = (g: Grid) => (who === "anonymous" ? (rule.anonymous ?? "s") : (g[who] ?? "----")[i]!);
          const api = Boolean(rule.api);
          if (r.hasLoader || r.isPage) {
            const code = r.isPage || r.hasLoader ? grid(rule.get) : "-";
            const secrets = secretsFor(who, blinding, state);
            jobs.push({ who, blinding, method: "GET", url, intent: "", code: api && who === "anonymous" && !rule.anonymous ? "u" : code, api, isData: false, label: `${who} GET ${r.path} [${blinding}, ${state}]`, secrets });
            if (r.isPage) jobs.push({ who, blinding, method: "GET", url: `${url}.data`, intent: "", code, api: false, isData: true, label: `${who} GET ${r.path}.data [${blinding}, ${state}]`, secrets });
          }
          // Access does not depend on blinding; the double-blind venue's writes repeat the single one's.
          if (blinding === "double") continue;
          // An index route's action is addressed with `?index` (React Router's convention).
          const postUrl = r.isIndex ? `${url}?index` : url;
          if (rule.apiPost) {
            // Writes through the API need a token (every session is refused), or the method is not served.
            jobs.push({ who, blinding, method: "POST", url: postUrl, intent: "", code: rule.apiPost, api, isData: false, label: `${who} POST ${r.path} [${blinding}, ${state}]` });
          }
          for (const [intent, g] of Object.entries(rule.post ?? {})) {
            const code = grid(g);
            // An allowed call of an intent that changes the world (accept, decline, submit, delete)
            // would change the cells after it; its refusals are still checked.
            if (code === "a" && rule.destructive?.includes(intent)) continue;
            jobs.push({ who, blinding, method: "POST", url: postUrl, intent, code, api, isData: false, label: `${who} POST ${r.path} intent=${intent || "(none)"} [${blinding}, ${state}]` });
          }
        }
      });
    }
  }

  const failures: string[] = [];
  let next = 0;
  const worker = async () => {
    while (next < jobs.length) {
      const job = jobs[next++]!;
      const ctx = await sessionFor(job.who, job.blinding);
      const send = () =>
        job.method === "GET" ? ctx.get(job.url) : ctx.post(job.url, { form: job.intent ? { intent: job.intent } : { empty: "" } });
      // A kept-alive connection the server closes just as it is reused resets; that says nothing
      // about access, so such a request is sent once more on a fresh connection.
      const res = await send().catch((error: Error) => {
        if (/ECONNRESET|socket hang up/.test(error.message)) return send();
        throw error;
      });
      const body = job.isData || job.secrets ? await res.text() : "";
      if (job.secrets && res.status() === 200 && !(res.headers()["content-type"] ?? "").includes("pdf")) {
        scanned++;
        for (const secret of job.secrets) if (body.includes(secret)) failures.push(`${job.label}: the response carries "${secret}"`);
      }
      if (!judge(job.code, res.status(), res.headers()["location"] ?? null, job.api, job.isData, body)) {
        failures.push(`${job.label}: expected "${job.code}", got ${res.status()}${res.headers()["location"] ? ` → ${res.headers()["location"]}` : ""}`);
      }
    }
  };
  await Promise.all(Array.from({ length: 4 }, worker));
  console.log(`access matrix: ${jobs.length} cells checked over ${flat.length} routes; ${scanned} responses scanned for leaks`);
  if (!only?.length) expect(scanned, "responses scanned for leaks").toBeGreaterThan(40);
  for (const ctx of contexts.values()) await ctx.dispose();
  expect(failures, failures.slice(0, 60).join("\n")).toEqual([]);
});
