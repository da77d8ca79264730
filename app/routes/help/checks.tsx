import { FAMILIES, rules } from "~/checker/registry";
import { workedExampleResults } from "~/checker/worked-examples";
import { AdvisoryNote } from "~/components/advisory-note";
import { href } from "react-router";
import type { Route } from "./+types/checks";

export const meta: Route.MetaFunction = () => [{ title: "Checks reference · Runproof" }];

/** Generated from the rule registry, so this page and the checker never disagree. */
export function loader() {
  const examples = workedExampleResults();
  return {
    examples,
    families: Object.entries(FAMILIES).map(([family, title]) => ({
      family,
      title,
      rules: rules
        .filter((r) => r.family === family)
        .map((r) => ({
          id: r.id,
          title: r.title,
          explanation: r.explanation,
          severities: r.severities,
          threshold: r.threshold ?? null,
          policyKey: r.policyKey ?? null,
          defaultThreshold: r.defaultThreshold === undefined ? null : JSON.stringify(r.defaultThreshold),
          source: r.source,
        })),
    })),
  };
}

const severityClass: Record<string, string> = {
  mismatch: "bg-ember-wash text-ember",
  caution: "bg-amber-wash text-amber",
  note: "bg-fjord-wash text-fjord",
};

export default function ChecksReference({ loaderData }: Route.ComponentProps) {
  return (
    <main className="mx-auto max-w-6xl p-gutter">
      <h1 className="text-title">What the checker looks at</h1>
      <p className="mt-3 max-w-3xl text-basalt-soft">
        Every rule of the checker, its identifier as it appears on flags, what it compares, its default threshold (a
        venue may set its own) and where the method comes from. The same engine runs in the app, behind{" "}
        <code className="font-mono">POST /api/v1/check</code> and in <code className="font-mono">npm run check</code>.
      </p>
      <section className="card mt-4 max-w-3xl" aria-labelledby="cli-h" data-testid="cli-download">
        <h2 id="cli-h" className="text-lead">
          Check on your own machine
        </h2>
        <p className="mt-1">
          <a href={href("/help/downloads/runproof-check.mjs")} download className="underline">
            Download the command-line checker
          </a>{" "}
          (<code className="font-mono">runproof-check.mjs</code>, one file for Node 20 or newer, nothing to install). It prints the same JSON as the
          API:
        </p>
        <pre className="mt-2 overflow-auto rounded border border-rule p-2 font-mono text-caption">
          {`node runproof-check.mjs --claim claim.json --series strat-B=series.csv run-a.json run-b.json
node runproof-check.mjs --series strat-B=ts.dat --columns strat-B=t,kineticEnergy,-,Rm strat-B.json
node runproof-check.mjs --series strat-B=out.h5 --columns strat-B=t:time,Rm:diag/rm strat-B.json`}
        </pre>
        <p className="mt-1 text-caption">Exit status 0 when the input was valid (whatever it flags), 2 with a message when it was not; --help lists every option.</p>
      </section>
      <AdvisoryNote className="mt-4 max-w-3xl" />
      {loaderData.families.map((f) => (
        <section key={f.family} className="mt-8" aria-labelledby={`family-${f.family}`}>
          <h2 id={`family-${f.family}`} className="text-lead">
            {f.family}. {f.title}
          </h2>
          <table className="mt-3 w-full text-left text-caption" data-testid={`rules-${f.family}`}>
            <thead>
              <tr className="border-b border-rule">
                <th className="py-1 pr-3">Rule</th>
                <th className="pr-3">What it checks</th>
                <th className="pr-3">Severity</th>
                <th className="pr-3">Default threshold</th>
                <th>Source</th>
              </tr>
            </thead>
            <tbody>
              {f.rules.map((r) => (
                <tr key={r.id} id={r.id} className="border-b border-rule align-top">
                  <td className="py-2 pr-3 font-mono whitespace-nowrap">{r.id}</td>
                  <td className="pr-3">
                    <span className="font-semibold">{r.title}.</span> {r.explanation}
                  </td>
                  <td className="pr-3">
                    {r.severities.map((s) => (
                      <span key={s} className={`mr-1 rounded px-1.5 py-0.5 font-mono ${severityClass[s]}`}>
                        {s}
                      </span>
                    ))}
                  </td>
                  <td className="pr-3">
                    {r.threshold ?? "—"}
                    {r.policyKey ? (
                      <div className="font-mono text-basalt-soft">
                        {r.policyKey} = {r.defaultThreshold}
                      </div>
                    ) : null}
                  </td>
                  <td>{r.source}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {loaderData.examples
            .filter((e) => e.family === f.family)
            .map((e) => (
              <article key={e.id} id={e.id} className="card mt-4 max-w-4xl" data-testid="worked-example">
                <h3 className="font-semibold">
                  Worked example: {e.title} <code className="font-mono text-caption text-basalt-soft">{e.rule}</code>
                </h3>
                <p className="mt-2 text-caption font-semibold">What the authors wrote</p>
                <ul className="list-disc pl-5 font-mono text-caption">
                  {e.given.map((g) => (
                    <li key={g}>{g}</li>
                  ))}
                </ul>
                <p className="mt-2 text-caption font-semibold">What the checker does</p>
                <ol className="list-decimal pl-5 text-caption">
                  {e.steps.map((st) => (
                    <li key={st}>{st}</li>
                  ))}
                </ol>
                <p className="mt-2 text-caption font-semibold">What the checker says</p>
                {e.flags.map((fl) => (
                  <p key={fl.message} className={`mt-1 rounded px-2 py-1 text-caption ${severityClass[fl.severity]}`}>
                    <span className="font-mono">{fl.severity}</span>: {fl.message}
                  </p>
                ))}
              </article>
            ))}
        </section>
      ))}
    </main>
  );
}
