import { Link, href } from "react-router";
import { apiPaths } from "~/api/openapi";
import { AdvisoryNote } from "~/components/advisory-note";
import { env } from "~/config/env.server";
import type { Route } from "./+types/api";

export const meta: Route.MetaFunction = () => [{ title: "API guide · Runproof" }];

/** The endpoint list comes from the OpenAPI paths, so this page lists exactly what exists. */
export function loader({ request }: Route.LoaderArgs) {
  const endpoints = Object.entries(apiPaths).flatMap(([path, item]) =>
    (["get", "post", "put"] as const)
      .filter((m) => item?.[m])
      .map((m) => ({ method: m.toUpperCase(), path, summary: item![m]!.summary ?? "" })),
  );
  return { endpoints, origin: new URL(request.url).origin, perMinute: env.API_RATE_LIMIT_PER_MINUTE };
}

const steps = (origin: string) => ({
  list: `export RUNPROOF_TOKEN=rp_…   # from Your account › API tokens
curl -H "Authorization: Bearer $RUNPROOF_TOKEN" ${origin}/api/v1/submissions`,
  push: `curl -X POST -H "Authorization: Bearer $RUNPROOF_TOKEN" -H "Content-Type: application/json" \\
  --data @run-S4.json \\
  ${origin}/api/v1/submissions/$SUBMISSION/rounds/1/runs`,
  series: `curl -X POST -H "Authorization: Bearer $RUNPROOF_TOKEN" -H "Content-Type: text/csv" \\
  --data-binary @S4-series.csv \\
  "${origin}/api/v1/submissions/$SUBMISSION/rounds/1/runs/$RUN/attachments?kind=series&filename=S4-series.csv"`,
  update: `curl -X PUT -H "Authorization: Bearer $RUNPROOF_TOKEN" -H "Content-Type: application/json" \\
  -H 'If-Match: "1"' --data @run-S4.json \\
  ${origin}/api/v1/submissions/$SUBMISSION/rounds/1/runs/$RUN`,
  flags: `curl -H "Authorization: Bearer $RUNPROOF_TOKEN" \\
  "${origin}/api/v1/submissions/$SUBMISSION/rounds/1/flags?severity=mismatch"`,
});

function Example({ title, code }: { title: string; code: string }) {
  return (
    <div className="mt-4">
      <h3 className="font-semibold">{title}</h3>
      <pre tabIndex={0} aria-label={title} className="mt-1 overflow-x-auto rounded bg-vellum-deep p-3 font-mono text-caption">{code}</pre>
    </div>
  );
}

export default function ApiGuide({ loaderData }: Route.ComponentProps) {
  const ex = steps(loaderData.origin);
  return (
    <main className="mx-auto max-w-4xl p-gutter">
      <h1 className="text-title">Pushing runs from a script: the Runproof API</h1>
      <p className="mt-3 text-basalt-soft">
        Everything the workspace pages do with runs, series, claims and flags, a script can do over HTTP with JSON. The same
        access rules apply: you change only the draft rounds of your own submissions, reviewers read the rounds they review,
        editors the rounds sent to them. The machine-readable description is{" "}
        <a href="/api/v1/openapi.json" className="underline">/api/v1/openapi.json</a> (OpenAPI 3.1).
      </p>
      <h2 className="mt-6 text-heading font-semibold">Tokens</h2>
      <p className="mt-2">
        Create a token on <Link to={href("/account/tokens")} className="underline">Your account › API tokens</Link>. It is shown once;
        Runproof keeps only its hash. Choose <em>read only</em> or <em>read and write</em> (scope <code>write:runs</code>: runs,
        series and claims of draft rounds) and an expiry. Send it as <code>Authorization: Bearer rp_…</code>. Revoke it there
        when a machine is retired. Each token may make {loaderData.perMinute} calls a minute; past that the answer is 429 with
        Retry-After.
      </p>
      <h2 className="mt-6 text-heading font-semibold">Examples</h2>
      <Example title="Your submissions" code={ex.list} />
      <Example title="Add a run (a runproof.run/1 record, see /schemas/run-1.json)" code={ex.push} />
      <Example title="Attach its time series (CSV, first column t)" code={ex.series} />
      <Example title="Change it: a new version, naming the version you edited" code={ex.update} />
      <Example title="Read the flags the checker found" code={ex.flags} />
      <p className="mt-4">
        A complete Node script that pushes a run and its series:{" "}
        <a href={href("/help/downloads/push-run.mjs")} download data-testid="push-run-download" className="underline">
          download push-run.mjs
        </a>{" "}
        (Node 18 or newer, no dependencies; <code>RUNPROOF_TOKEN=rp_… node push-run.mjs &lt;submissionId&gt; &lt;round&gt; run.json [series.csv]</code>). The
        command-line checker, which answers like <code>POST /api/v1/check</code> without a server, is on{" "}
        <Link to={href("/help/checks")} className="underline">the checks reference</Link>.
      </p>
      <AdvisoryNote className="mt-4" />
      <h2 className="mt-6 text-heading font-semibold">Errors</h2>
      <p className="mt-2">
        Every error has the same shape: <code>{"{ error: { code, message, details: [{ path, message }] } }"}</code>. Validation
        errors name the JSON path of each problem (e.g. <code>controls.E</code>). Status codes: 400 invalid input, 401 no or a
        bad, revoked or expired token, 403 a missing scope or a round you may only read, 404 not found or not yours, 409 a sent
        (frozen) round or a stale version, 413 a body over the limit, 429 too many calls.
      </p>
      <h2 className="mt-6 text-heading font-semibold">Endpoints</h2>
      <table className="mt-2 w-full text-left text-caption">
        <thead>
          <tr><th>Method</th><th>Path</th><th>What it does</th></tr>
        </thead>
        <tbody>
          {loaderData.endpoints.map((e) => (
            <tr key={`${e.method} ${e.path}`} className="border-t border-rule">
              <td className="font-mono">{e.method}</td>
              <td className="font-mono">{e.path}</td>
              <td>{e.summary}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </main>
  );
}
