import { data, Form, href, redirect } from "react-router";
import { requireRound } from "~/access/page-guards.server";
import { ParameterSpaceChart } from "~/components/workspace/lazy-plots";
import { IssueList, RunForm } from "~/components/workspace/run-form";
import { RunsTable } from "~/components/workspace/runs-table";
import { serviceError } from "~/workspace/action-errors.server";
import { keyMapText, parseKeyMap, SUGGESTED_MAP } from "~/workspace/namelist-map";
import { RUNS_PAGE_SIZE } from "~/components/workspace/use-runs-page";
import { roundRunCount, roundRunPoints, roundRunRows } from "~/workspace/round-data.server";
import { formToRecord } from "~/workspace/run-form-fields";
import { addRun, importNamelist, parseJsonText, saveKeyMap, savedKeyMap } from "~/workspace/run-edits.server";
import { BULK_LIMITS } from "~/workspace/run-import-limits";
import { checkBulkBounds, importRuns, recordsFromJsonFiles, recordsFromNamelists, type BulkFile } from "~/workspace/run-import.server";
import type { Route } from "./+types/index";

export const meta: Route.MetaFunction = () => [{ title: "Runs · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-runs");
  const canEdit = access.can("write-runs");
  // The table's first page, sorted and paged in SQL; later pages and other orders come from the API route.
  const [rows, total, points, map] = await Promise.all([
    roundRunRows(db, access.round.id, { limit: RUNS_PAGE_SIZE }),
    roundRunCount(db, access.round.id),
    roundRunPoints(db, access.round.id),
    canEdit ? savedKeyMap(db, access.submission.id) : null,
  ]);
  const deleted = new URL(args.request.url).searchParams.get("deleted")?.slice(0, 200) ?? null;
  return { rows, total, points, canEdit, deleted, keyMap: keyMapText(map ?? SUGGESTED_MAP), keyMapSaved: Boolean(map) };
}

/** The chosen files of a multiple-file input, bounded before any is read. */
async function chosenFiles(form: FormData): Promise<BulkFile[]> {
  const files = form.getAll("files").filter((v): v is File => typeof v !== "string" && v.size > 0);
  checkBulkBounds(files.map((f) => ({ name: f.name || "file", size: f.size })));
  return Promise.all(files.map(async (f) => ({ name: (f.name || "file").slice(0, 200), text: await f.text() })));
}

async function fileText(v: FormDataEntryValue | null) {
  return v && typeof v !== "string" && v.size > 0 ? await v.text() : typeof v === "string" ? v : "";
}

export async function action(args: Route.ActionArgs) {
  const { db, access, user } = await requireRound(args, "write-runs");
  const { round, submission } = access;
  const form = await args.request.formData();
  const intent = String(form.get("intent"));
  const runPage = (runId: string) => href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { venueId: submission.venueId, submissionId: submission.id, round: String(round.number), runId });
  try {
    if (intent === "form") {
      const out = await addRun(db, { submissionId: submission.id, roundId: round.id, input: formToRecord(form), origin: "form", userId: user.id });
      throw redirect(runPage(out.run.id));
    }
    if (intent === "json") {
      const text = (await fileText(form.get("file"))) || String(form.get("json") ?? "");
      if (!text.trim()) return data({ intent, error: { message: "Choose a run-record JSON file (or paste one) first.", issues: [] } }, { status: 400 });
      const out = await addRun(db, { submissionId: submission.id, roundId: round.id, input: parseJsonText(text), origin: "json", userId: user.id });
      throw redirect(runPage(out.run.id));
    }
    if (intent === "namelist") {
      const map = parseKeyMap(String(form.get("keyMap") ?? ""));
      const text = (await fileText(form.get("file"))) || String(form.get("namelist") ?? "");
      if (!text.trim()) return data({ intent, error: { message: "Choose a namelist file (or paste one) first.", issues: [] } }, { status: 400 });
      const out = await importNamelist(db, { submissionId: submission.id, roundId: round.id, base: formToRecord(form), namelist: text, map, userId: user.id });
      // Kept only once an import succeeded with it, so a failed import stores nothing at all.
      if (form.get("saveMap") === "on") await saveKeyMap(db, submission.id, map);
      throw redirect(runPage(out.run.id));
    }
    if (intent === "bulk-json" || intent === "bulk-namelist") {
      const files = await chosenFiles(form);
      const map = intent === "bulk-namelist" ? parseKeyMap(String(form.get("keyMap") ?? "")) : null;
      const read = map ? recordsFromNamelists(files, map, formToRecord(form)) : recordsFromJsonFiles(files);
      const created = await importRuns(db, { submissionId: submission.id, roundId: round.id, userId: user.id, origin: map ? "namelist" : "json", ...read });
      if (map && form.get("saveMap") === "on") await saveKeyMap(db, submission.id, map);
      return data({ intent, imported: created.map((c) => c.label) });
    }
  } catch (e) {
    if (e instanceof Response) throw e;
    return serviceError(e, { intent, values: Object.fromEntries([...form.entries()].filter(([, v]) => typeof v === "string")) as Record<string, string> });
  }
  return data({ intent, error: { message: `Unknown action "${intent}".`, issues: [] } }, { status: 400 });
}

export default function Runs({ loaderData: d, actionData, params }: Route.ComponentProps) {
  const p = { venueId: params.venueId, submissionId: params.submissionId, round: params.round };
  const err = (intent: string) =>
    actionData && "error" in actionData && "intent" in actionData && actionData.intent === intent ? actionData.error : undefined;
  const values = actionData && "values" in actionData ? (actionData.values as Record<string, string>) : {};
  const jsonErr = err("json");
  const nlErr = err("namelist");
  const formErr = err("form");
  const bulkJsonErr = err("bulk-json");
  const bulkNlErr = err("bulk-namelist");
  const imported = actionData && "imported" in actionData ? actionData.imported : null;
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="runs-h">
        <h3 id="runs-h" className="text-lead">
          Runs
        </h3>
        {d.deleted ? (
          <p role="status" className="text-lichen" data-testid="run-deleted">
            Run {d.deleted} was deleted from this round.
          </p>
        ) : null}
        {d.rows.length ? <RunsTable
            rows={d.rows}
            total={d.total}
            runHref={(r) => href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs/:runId", { ...p, runId: r.runId })}
            csvHref={href("/venues/:venueId/submissions/:submissionId/rounds/:round/runs.csv", p)}
            source={href("/api/v1/submissions/:submissionId/rounds/:round/runs", p)}
          /> : <p className="text-caption">No runs yet.</p>}
      </section>
      <ParameterSpaceChart points={d.points} />
      {d.canEdit ? (
        <section aria-labelledby="add-h" className="flex flex-col gap-4">
          <h3 id="add-h" className="text-lead">
            Add a run
          </h3>
          <details className="card" open={Boolean(jsonErr)}>
            <summary className="cursor-pointer font-semibold">Upload a run record (runproof.run/1 JSON)</summary>
            <Form method="post" encType="multipart/form-data" className="mt-3 flex flex-col gap-2" data-testid="json-upload">
              <input type="hidden" name="intent" value="json" />
              <label htmlFor="run-json-file" className="font-semibold">
                Run record file
              </label>
              <input id="run-json-file" type="file" name="file" accept=".json,application/json" className="field-input" />
              <p className="text-caption">
                The format is published as a JSON Schema at <a href={href("/schemas/run-1.json")}>/schemas/run-1.json</a>.
              </p>
              {jsonErr ? <IssueList message={jsonErr.message} issues={jsonErr.issues} testId="json-error" /> : null}
              <button type="submit" className="btn self-start">
                Upload the run record
              </button>
            </Form>
          </details>
          {imported ? (
            <p role="status" className="text-lichen" data-testid="bulk-imported">
              Imported {imported.length} run{imported.length === 1 ? "" : "s"}: {imported.join(", ")}. The checker is checking them.
            </p>
          ) : null}
          <details className="card" open={Boolean(bulkJsonErr)}>
            <summary className="cursor-pointer font-semibold">Import many run records at once (JSON files)</summary>
            <Form method="post" encType="multipart/form-data" className="mt-3 flex flex-col gap-2" data-testid="bulk-json">
              <input type="hidden" name="intent" value="bulk-json" />
              <label htmlFor="bulk-json-files" className="font-semibold">
                Run record files (each one record, or an array of records)
              </label>
              <input id="bulk-json-files" type="file" name="files" multiple accept=".json,application/json" className="field-input" />
              <p className="text-caption">
                All or nothing: one bad record stores none of them, and each problem is named by file, record and field. At most {BULK_LIMITS.files} files,{" "}
                {BULK_LIMITS.records} records, {BULK_LIMITS.fileBytes / 1024} KB a file and {BULK_LIMITS.totalBytes / 1024 / 1024} MB in all.
              </p>
              {bulkJsonErr ? <IssueList message={bulkJsonErr.message} issues={bulkJsonErr.issues} testId="bulk-json-error" /> : null}
              <button type="submit" className="btn self-start">
                Import the runs
              </button>
            </Form>
          </details>
          <details className="card" open={Boolean(bulkNlErr)}>
            <summary className="cursor-pointer font-semibold">Import many Fortran namelists at once</summary>
            <RunForm
              intent="bulk-namelist"
              idPrefix="bnl"
              submitLabel="Import the namelists"
              values={bulkNlErr ? values : {}}
              message={bulkNlErr?.message}
              issues={bulkNlErr?.issues ?? []}
              multipart
              extra={
                <div className="grid gap-3 md:grid-cols-2">
                  <div className="flex flex-col gap-1">
                    <label htmlFor="bulk-namelist-files" className="font-semibold">
                      Namelist files (one run each; its label is the file's name unless the key map or the label field below gives one)
                    </label>
                    <input id="bulk-namelist-files" type="file" name="files" multiple className="field-input" />
                    <p className="text-caption">
                      All or nothing, at most {BULK_LIMITS.files} files of {BULK_LIMITS.fileBytes / 1024} KB each. The fields below are shared by every run; each namelist's values take precedence.
                    </p>
                  </div>
                  <div className="flex flex-col gap-1">
                    <label htmlFor="bulk-namelist-map" className="font-semibold">
                      Your key map (key = run-record path; "ignore" skips a key)
                    </label>
                    <textarea id="bulk-namelist-map" name="keyMap" rows={8} className="field-input font-mono" defaultValue={values.keyMap ?? d.keyMap} />
                    <label className="flex items-center gap-1 text-caption">
                      <input type="checkbox" name="saveMap" defaultChecked /> Keep this key map for the submission
                    </label>
                  </div>
                </div>
              }
            />
          </details>
          <details className="card" open={Boolean(nlErr)}>
            <summary className="cursor-pointer font-semibold">Import a Fortran namelist</summary>
            <RunForm
              intent="namelist"
              idPrefix="nl"
              submitLabel="Import the namelist"
              values={nlErr ? values : {}}
              message={nlErr?.message}
              issues={nlErr?.issues ?? []}
              extra={
                <div className="grid gap-3 md:grid-cols-2">
                  <div className="flex flex-col gap-1">
                    <label htmlFor="namelist-text" className="font-semibold">
                      Namelist (ISO/IEC 1539 NAMELIST input)
                    </label>
                    <textarea id="namelist-text" name="namelist" rows={8} className="field-input font-mono" defaultValue={values.namelist ?? ""} placeholder={"&phys_param\n  ek = 1.0d-4, ra = 2.0e7, pr = 1.0, prmag = 2.0\n/"} />
                  </div>
                  <div className="flex flex-col gap-1">
                    <label htmlFor="namelist-map" className="font-semibold">
                      Your key map (key = run-record path; "ignore" skips a key)
                    </label>
                    <textarea id="namelist-map" name="keyMap" rows={8} className="field-input font-mono" defaultValue={values.keyMap ?? d.keyMap} />
                    <label className="flex items-center gap-1 text-caption">
                      <input type="checkbox" name="saveMap" defaultChecked /> Keep this key map for the submission {d.keyMapSaved ? "(one is saved)" : "(none saved yet)"}
                    </label>
                  </div>
                  <p className="text-caption md:col-span-2">Fill in below what the namelist does not say (label, conventions, …); the namelist's values take precedence.</p>
                </div>
              }
            />
          </details>
          <details className="card" open={Boolean(formErr) || d.rows.length === 0}>
            <summary className="cursor-pointer font-semibold">Fill in the form</summary>
            <div className="mt-3">
              <RunForm intent="form" idPrefix="new" submitLabel="Add the run" values={formErr ? values : {}} message={formErr?.message} issues={formErr?.issues ?? []} />
            </div>
          </details>
        </section>
      ) : null}
    </div>
  );
}
