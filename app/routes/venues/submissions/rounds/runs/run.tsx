import { data, Form, href, redirect } from "react-router";
import { FlagsPanel } from "~/components/workspace/flags-panel";
import { RunPlotsPanel } from "~/components/workspace/run-plots-panel";
import { RunForm } from "~/components/workspace/run-form";
import { CsvUpload } from "~/components/workspace/upload";
import { env } from "~/config/env.server";
import { serviceError } from "~/workspace/action-errors.server";
import { requireRound } from "~/access/page-guards.server";
import { flagPanelView } from "~/workspace/flag-panel.server";
import { runPlotFiles, storedDerived } from "~/workspace/round-data.server";
import { DERIVED_LABELS, recordLines } from "~/review/pdf/run-record";
import { sig4 } from "~/lib/sig-figs";
import { fieldId, fieldForQuantity, formToRecord, recordToValues } from "~/workspace/run-form-fields";
import { editRun } from "~/workspace/run-edits.server";
import { roundRun, runVersionHistory } from "~/workspace/runs.server";
import { claimsNamingRun, deleteRun } from "~/workspace/removals.server";
import { duplicateRun } from "~/workspace/run-template.server";
import { savedSeriesMaps } from "~/workspace/series-maps.server";
import { diffRunRecords } from "~/workspace/run-diff";
import type { SeriesPlot } from "~/workspace/view-types";
import { SeriesStatsTable } from "~/components/workspace/series-stats";
import type { Route } from "./+types/run";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Run ${data?.run.label ?? ""} · Runproof` }];

async function runOfRound(db: Parameters<typeof roundRun>[0], roundId: string, runId: string) {
  const run = await roundRun(db, roundId, runId);
  if (!run) throw data("Not found", { status: 404 });
  return run;
}

/** Symbols for the derived values whose label is words only. */
const DERIVED_SYMBOLS: Record<string, string> = {
  tangentCylinderLatitudeDeg: "θ_TC",
  layerTangentLatitudeDeg: "θ_L",
  layerThicknessKm: "d_L",
  "runLength.viscous": "T/τ_ν",
  "runLength.magnetic": "T/τ_η",
  "runLength.thermal": "T/τ_κ",
  "runLength.rotations": "T·Ω/2π",
  "runLength.overturns": "T/τ_U",
  "averagingWindow.magnetic": "W/τ_η",
  "averagingWindow.overturns": "W/τ_U",
};

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-runs");
  const { round } = access;
  const run = await runOfRound(db, round.id, args.params.runId);
  const [history, plots, flags, derived] = await Promise.all([
    runVersionHistory(db, run.runId),
    // The files and which plots they give; the points come from the plots route once the page is on screen.
    runPlotFiles(db, run.versionId),
    flagPanelView(db, round.id, { scope: { run: run.label }, groupings: ["rule", "claim"], params: new URL(args.request.url).searchParams }),
    storedDerived(db, run.versionId),
  ]);
  // The recomputed values as the check job stored them for this run version (nothing is recomputed here).
  const valueAt = (key: string) => key.split(".").reduce<unknown>((o, k) => (o && typeof o === "object" ? (o as Record<string, unknown>)[k] : undefined), derived);
  const recomputed = DERIVED_LABELS.flatMap(([key, label]) => {
    const v = valueAt(key);
    if (typeof v !== "number" || !Number.isFinite(v)) return [];
    const [symbol, ...words] = label.split(", ");
    // Labels without a symbol of their own ("run length, magnetic diffusion times") get one here.
    const own = DERIVED_SYMBOLS[key];
    return [{ key, symbol: own ?? symbol!, name: own ? label : words.join(", "), value: sig4(v) }];
  });
  // A frozen round shows only the versions up to the one it used.
  const visible = history.filter((h) => h.version <= run.version || round.state === "draft");
  // Version diff: ?from=&to= name two versions of the visible history; by default the one before against this round's.
  const url = new URL(args.request.url);
  const pick = (name: string, fallback: number | undefined) => {
    const n = Number(url.searchParams.get(name));
    return visible.some((h) => h.version === n) ? n : fallback;
  };
  const toVersion = pick("to", run.version);
  const fromVersion = pick("from", visible.find((h) => h.version < (toVersion ?? 0))?.version);
  const recordOf = (v: number | undefined) => visible.find((h) => h.version === v)?.record;
  const diff = fromVersion !== undefined && toVersion !== undefined && fromVersion !== toVersion ? { from: fromVersion, to: toVersion, groups: diffRunRecords(recordOf(fromVersion), recordOf(toVersion)) } : null;
  const series = derived.series && typeof derived.series === "object" ? (derived.series as NonNullable<SeriesPlot["stats"]>) : null;
  return {
    diff,
    series,
    checkError: round!.checkError,
    run: { runId: run.runId, label: run.label, version: run.version, origin: run.origin, values: recordToValues(run.record), record: run.record },
    // A frozen round shows only the versions up to the one it used.
    history: visible.map((h) => ({ version: h.version, origin: h.origin, createdAt: h.createdAt.toISOString() })),
    plots,
    recomputed,
    groups: recordLines(run.record),
    flags,
    canEdit: access.can("write-runs"),
    seriesMaps: access.can("write-runs") ? await savedSeriesMaps(db, access.submission.id) : {},
    copiedFrom: new URL(args.request.url).searchParams.get("copied")?.slice(0, 200) ?? null,
    namedBy: access.can("write-runs") ? await claimsNamingRun(db, round.id, run.label) : [],
    limitBytes: env.UPLOAD_LIMIT_MB * 1024 * 1024,
  };
}

export async function action(args: Route.ActionArgs) {
  const { db, access, user } = await requireRound(args, "write-runs");
  const { round } = access;
  const run = await runOfRound(db, round.id, args.params.runId);
  const form = await args.request.formData();
  const intent = String(form.get("intent") ?? "edit");
  const roundPage = { venueId: access.submission.venueId, submissionId: access.submission.id, round: String(round.number) };
  try {
    if (intent === "duplicate") {
      const copy = await duplicateRun(db, { submissionId: access.submission.id, roundId: round.id, runId: run.runId, userId: user.id });
      throw redirect(`${href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...roundPage, runId: copy.run.id })}?copied=${encodeURIComponent(run.label)}#record-h`);
    }
    if (intent === "delete") {
      const gone = await deleteRun(db, { roundId: round.id, runId: run.runId });
      throw redirect(`${href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs", roundPage)}?deleted=${encodeURIComponent(gone.label)}`);
    }
    const out = await editRun(db, {
      runId: run.runId,
      roundId: round.id,
      input: formToRecord(form),
      origin: "form",
      userId: user.id,
      expectedVersion: Number(form.get("expectedVersion")),
    });
    return { ok: true as const, version: out.version.version };
  } catch (e) {
    if (e instanceof Response) throw e;
    return serviceError(e, { intent });
  }
}

const mapsOf = (maps: Record<string, string>, kind: string) => ({ columns: maps[`${kind}.columns`], hdf5: maps[`${kind}.hdf5`], netcdf: maps[`${kind}.netcdf`] });

export default function Run({ loaderData: d, actionData, params }: Route.ComponentProps) {
  const p = { venueId: params.venueId, submissionId: params.submissionId, round: params.round };
  const error = actionData && "error" in actionData ? actionData.error : undefined;
  const copiedFrom = d.copiedFrom;
  const runAction = actionData && "intent" in actionData && actionData.intent !== "edit";
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h3 className="text-lead">
          Run <span className="font-mono">{d.run.label}</span>
        </h3>
        <p className="text-caption text-basalt-soft">
          Version {d.run.version} ({ORIGIN_WORDS[d.run.origin] ?? d.run.origin}) is the one this round uses; earlier versions and what changed are listed below.
        </p>
        {copiedFrom ? (
          <p role="status" className="mt-2 text-lichen" data-testid="run-copied">
            A copy of run {copiedFrom}: change what differs below and save.
          </p>
        ) : null}
        {d.canEdit ? (
          <div className="mt-2 flex flex-wrap gap-2" data-testid="run-actions">
            <Form method="post">
              <input type="hidden" name="intent" value="duplicate" />
              <button type="submit" className="btn-quiet btn">
                Duplicate as template
              </button>
            </Form>
            <Form
              method="post"
              onSubmit={(e) => {
                const message = d.namedBy.length
                  ? `Run ${d.run.label} cannot be deleted while claims name it: ${d.namedBy.map((c) => c.title).join("; ")}. Take it out of those claims first.`
                  : `Delete run ${d.run.label} from round ${params.round}? Its record (${d.history.length} version${d.history.length === 1 ? "" : "s"}), its attached files (${d.plots.files.length}) and its flags in this round are removed. Earlier rounds that used it keep it.`;
                if (d.namedBy.length) {
                  window.alert(message);
                  e.preventDefault();
                } else if (!window.confirm(message)) e.preventDefault();
              }}
            >
              <input type="hidden" name="intent" value="delete" />
              <button type="submit" className="btn-quiet btn">
                Delete the run
              </button>
            </Form>
          </div>
        ) : null}
        {error && runAction ? (
          <p role="alert" className="mt-2 text-ember" data-testid="run-action-error">
            {error.message}
          </p>
        ) : null}
        {actionData && "ok" in actionData ? (
          <p role="status" className="mt-2 text-lichen">
            Saved as version {actionData.version}; the checker re-ran.
          </p>
        ) : null}
      </div>
      <div className="grid gap-4 lg:grid-cols-2">
        <section aria-labelledby="full-record-h" className="card" data-testid="run-full-record">
          <h3 id="full-record-h" className="text-lead">
            The run as recorded
          </h3>
          <dl className="mt-2 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-caption">
            {d.groups.map((g, i) => (
              <div key={i} className="contents">
                <dt className="font-semibold">{g.group}</dt>
                <dd className="font-mono break-words">{g.line}</dd>
              </div>
            ))}
          </dl>
        </section>
        <section aria-labelledby="derived-h" className="card" data-testid="run-derived">
          <h3 id="derived-h" className="text-lead">
            Recomputed by the checker
          </h3>
          {d.recomputed.length === 0 ? (
            <p className="mt-2 text-caption">Not checked yet: the values appear when the check of this version is done.</p>
          ) : (
            <table className="mt-2 text-caption">
              <tbody>
                {d.recomputed.map((r) => (
                  <tr key={r.key}>
                    <th scope="row" className="pr-3 text-left font-semibold">
                      <abbr title={r.name || r.symbol} className="cursor-help no-underline">{r.symbol}</abbr>
                    </th>
                    <td className="pr-3 text-basalt-soft">{r.name}</td>
                    <td className="font-mono">{r.value}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          <p className="mt-2 text-caption text-basalt-soft">Four significant figures, from the stated parameters under the run's declared conventions.</p>
          <h4 className="mt-4 font-semibold">Series statistics</h4>
          {d.series && Object.keys(d.series).length ? (
            <SeriesStatsTable stats={d.series} />
          ) : (
            <p className="text-caption">No time series attached to this version, so no series statistics.</p>
          )}
        </section>
      </div>
      <VersionHistory d={d} />
      <FlagsPanel
        view={d.flags}
        rowsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags", p)}
        checkError={d.checkError}
        runHref={(_l, field) => (field ? `#${field}` : null)}
        claimHref={(id, row) => `${href("/venues/:venueId/submissions/:submissionId/rounds/:round/claims/:claimId", { ...p, claimId: id })}${row !== null ? `#stated-${row}` : ""}`}
        answerAction={d.canEdit ? (id) => href("/venues/:venueId/submissions/:submissionId/rounds/:round/flags/:flagId/answer", { ...p, flagId: id }) : undefined}
      />
      <section aria-labelledby="plots-h" className="flex flex-col gap-4">
        <h3 id="plots-h" className="text-lead">
          Series and spectra
        </h3>
        {d.plots.analysing ? (
          <p role="status" className="text-caption" data-testid="file-analysing">
            Analysing the uploaded file… its plot and statistics appear here when the check is done.
          </p>
        ) : null}
        <RunPlotsPanel
          plotsHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId/plots", { ...p, runId: d.run.runId })}
          has={{ series: d.plots.series, spectrum: d.plots.spectrum }}
          plotKey={d.plots.plotKey}
          analysing={d.plots.analysing}
        />
        {d.plots.files.length ? (
          <ul className="text-caption" data-testid="attachments">
            {d.plots.files.map((f) => (
              <li key={f.id}>
                {f.kind}: {f.filename} — {f.rowCount} rows, {Math.ceil(f.size / 1024)} KB
              </li>
            ))}
          </ul>
        ) : null}
        {d.canEdit ? (
          <div className="grid gap-4 md:grid-cols-2">
            <CsvUpload action={href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId/attachments", { ...p, runId: d.run.runId })} kind="series" label="Attach a time series" limitBytes={d.limitBytes} maps={mapsOf(d.seriesMaps, "series")} />
            <CsvUpload action={href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId/attachments", { ...p, runId: d.run.runId })} kind="spectrum" label="Attach a spectrum" limitBytes={d.limitBytes} maps={mapsOf(d.seriesMaps, "spectrum")} />
          </div>
        ) : null}
      </section>
      <section aria-labelledby="record-h">
        <h3 id="record-h" className="text-lead">
          Run record
        </h3>
        {d.canEdit ? (
          <RunForm
            key={d.run.version}
            intent="edit"
            submitLabel="Save as a new version"
            values={d.run.values}
            lockLabel
            message={runAction ? undefined : error?.message}
            issues={runAction ? [] : (error?.issues ?? [])}
            extra={<input type="hidden" name="expectedVersion" value={d.run.version} />}
          />
        ) : (
          <details>
            <summary className="cursor-pointer text-caption">The record as JSON (runproof.run/1)</summary>
            <pre className="overflow-auto rounded border border-rule p-3 text-caption">{JSON.stringify(d.run.record, null, 2)}</pre>
          </details>
        )}
      </section>
    </div>
  );
}

/** Every version of the run, and what changed between any two of them (chosen in the URL). */
function VersionHistory({ d }: { d: Route.ComponentProps["loaderData"] }) {
  return (
    <section aria-labelledby="versions-h" className="card" data-testid="run-versions">
      <h3 id="versions-h" className="text-lead">
        Versions and what changed
      </h3>
      <ol className="mt-1 text-caption">
        {d.history.map((h) => (
          <li key={h.version}>
            Version {h.version} — {ORIGIN_WORDS[h.origin] ?? h.origin}, {h.createdAt.slice(0, 16).replace("T", " ")} UTC{h.version === d.run.version ? " (used by this round)" : ""}
          </li>
        ))}
      </ol>
      {d.history.length > 1 ? (
        <Form method="get" className="mt-2 flex flex-wrap items-end gap-3 text-caption" preventScrollReset>
          <label className="flex flex-col">
            From version
            <select name="from" defaultValue={d.diff?.from} className="field-input">
              {d.history.map((h) => <option key={h.version} value={h.version}>{h.version}</option>)}
            </select>
          </label>
          <label className="flex flex-col">
            To version
            <select name="to" defaultValue={d.diff?.to} className="field-input">
              {d.history.map((h) => <option key={h.version} value={h.version}>{h.version}</option>)}
            </select>
          </label>
          <button type="submit" className="btn-quiet">Compare</button>
        </Form>
      ) : (
        <p className="mt-1 text-caption">Only one version so far: nothing to compare.</p>
      )}
      {d.diff ? (
        <div className="mt-3" data-testid="version-diff">
          <p className="text-caption font-semibold">
            Version {d.diff.from} → version {d.diff.to}: {d.diff.groups.reduce((n, g) => n + g.changes.length, 0)} field(s) changed
          </p>
          {d.diff.groups.length === 0 ? <p className="text-caption">The two versions hold the same values.</p> : null}
          {d.diff.groups.map((g) => (
            <table key={g.group} className="mt-2 w-full text-left text-caption">
              <caption className="text-left font-semibold">{g.group}</caption>
              <thead>
                <tr className="border-b border-rule">
                  <th scope="col" className="pr-3">Field</th>
                  <th scope="col" className="pr-3">Version {d.diff!.from}</th>
                  <th scope="col">Version {d.diff!.to}</th>
                </tr>
              </thead>
              <tbody className="font-mono">
                {g.changes.map((c) => (
                  <tr key={c.path} className="border-b border-rule" data-testid="diff-row">
                    <th scope="row" className="pr-3 text-left font-normal">{c.path}</th>
                    <td className="pr-3 text-ember"><del>{c.from}</del></td>
                    <td className="text-lichen"><ins className="no-underline">{c.to}</ins></td>
                  </tr>
                ))}
              </tbody>
            </table>
          ))}
        </div>
      ) : null}
    </section>
  );
}

/** How a version arrived, in words. */
const ORIGIN_WORDS: Record<string, string> = { form: "entered in the form", json: "uploaded as JSON", namelist: "imported from a namelist", api: "sent through the API", seed: "from the demo data" };
