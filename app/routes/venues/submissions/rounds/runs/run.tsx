import { data, Form, href, redirect } from "react-router";
import { FlagsPanel } from "~/components/workspace/flags-panel";
import { SeriesChart, SpectrumChart } from "~/components/workspace/lazy-plots";
import { RunForm } from "~/components/workspace/run-form";
import { CsvUpload } from "~/components/workspace/upload";
import type { RunRecord } from "~/checker/schema";
import { env } from "~/config/env.server";
import { serviceError } from "~/workspace/action-errors.server";
import { requireRound } from "~/access/page-guards.server";
import { roundFlags } from "~/workspace/flags-query.server";
import { runPlots, storedDerived } from "~/workspace/round-data.server";
import { DERIVED_LABELS, recordLines } from "~/review/pdf/run-record";
import { sig4 } from "~/lib/sig-figs";
import { fieldId, fieldForQuantity, formToRecord, recordToValues } from "~/workspace/run-form-fields";
import { editRun } from "~/workspace/run-edits.server";
import { roundRunList, runVersionHistory } from "~/workspace/runs.server";
import { claimsNamingRun, deleteRun } from "~/workspace/removals.server";
import { duplicateRun } from "~/workspace/run-template.server";
import { savedSeriesMaps } from "~/workspace/series-maps.server";
import type { Route } from "./+types/run";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Run ${data?.run.label ?? ""} · Runproof` }];

async function runOfRound(db: Parameters<typeof roundRunList>[0], roundId: string, runId: string) {
  const run = (await roundRunList(db, roundId)).find((r) => r.runId === runId);
  if (!run) throw data("Not found", { status: 404 });
  return run;
}

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-runs");
  const { round } = access;
  const run = await runOfRound(db, round.id, args.params.runId);
  const [history, plots, flags, derived] = await Promise.all([
    runVersionHistory(db, run.runId),
    runPlots(db, run.versionId, run.record as RunRecord),
    roundFlags(db, round.id),
    storedDerived(db, run.versionId),
  ]);
  // The recomputed values as the check job stored them for this run version (nothing is recomputed here).
  const valueAt = (key: string) => key.split(".").reduce<unknown>((o, k) => (o && typeof o === "object" ? (o as Record<string, unknown>)[k] : undefined), derived);
  const recomputed = DERIVED_LABELS.flatMap(([key, label]) => {
    const v = valueAt(key);
    if (typeof v !== "number" || !Number.isFinite(v)) return [];
    const [symbol, ...words] = label.split(", ");
    return [{ key, symbol: symbol!, name: words.join(", "), value: sig4(v) }];
  });
  return {
    checkError: round!.checkError,
    run: { runId: run.runId, label: run.label, version: run.version, origin: run.origin, values: recordToValues(run.record), record: run.record },
    // A frozen round shows only the versions up to the one it used.
    history: history.filter((h) => h.version <= run.version || round.state === "draft").map((h) => ({ version: h.version, origin: h.origin, createdAt: h.createdAt.toISOString() })),
    plots,
    recomputed,
    groups: recordLines(run.record),
    flags: flags.filter((f) => f.runLabel === run.label),
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
          Version {d.run.version} ({d.run.origin}) is the one this round uses. History:{" "}
          {d.history.map((h) => `v${h.version} (${h.origin}, ${h.createdAt.slice(0, 10)})`).join(" · ")}
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
                    <th scope="row" className="pr-3 text-left font-semibold" title={r.name || undefined}>
                      {r.symbol}
                    </th>
                    <td className="pr-3 text-basalt-soft">{r.name}</td>
                    <td className="font-mono">{r.value}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          <p className="mt-2 text-caption text-basalt-soft">Four significant figures, from the stated parameters under the run's declared conventions.</p>
        </section>
      </div>
      <FlagsPanel
        flags={d.flags}
        checkError={d.checkError}
        runLabels={[d.run.label]}
        claims={[]}
        runHref={(_l, q) => {
          const f = q.map(fieldForQuantity).find(Boolean);
          return f ? `#${fieldId(f)}` : null;
        }}
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
        {d.plots.series ? <SeriesChart plot={d.plots.series} title="Time series" /> : d.plots.analysing ? null : <p className="text-caption">No time series attached.</p>}
        {d.plots.spectrum ? <SpectrumChart plot={d.plots.spectrum} title="Spectrum" /> : <p className="text-caption">No spectrum attached.</p>}
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
