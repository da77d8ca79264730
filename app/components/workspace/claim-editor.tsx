import { useState } from "react";
import { useFetcher } from "react-router";

type Stated = { quantity: string; value: string; run: string };
type RunRef = { label: string; part: string };
export type ClaimDraft = { title: string; figure: string; statement: string; runs: RunRef[]; varies: string; stated: Stated[] };
type Reply = { ok?: boolean; error?: { message: string; issues: { path: string; message: string }[] } };

export function claimDraftOf(c?: { figure: string | null; statement: string; record: unknown }): ClaimDraft {
  const r = (c?.record ?? {}) as { title?: string; runs?: RunRef[]; varies?: string[]; stated?: { quantity: string; value: string | number; run?: string }[] };
  return {
    title: r.title ?? "",
    figure: c?.figure ?? "",
    statement: c?.statement ?? "",
    runs: r.runs?.length ? r.runs : [{ label: "", part: "reference" }],
    varies: (r.varies ?? []).join(", "),
    stated: (r.stated ?? []).map((s) => ({ quantity: s.quantity, value: String(s.value), run: s.run ?? "" })),
  };
}

/** The claim as `runproof.claim/1`, built from the editor's rows. */
function recordOf(d: ClaimDraft) {
  const varies = d.varies.split(/[,\s]+/).filter(Boolean);
  return {
    format: "runproof.claim/1",
    title: d.title,
    runs: d.runs.filter((r) => r.label),
    ...(varies.length ? { varies } : {}),
    ...(d.stated.length ? { stated: d.stated.map((s) => ({ quantity: s.quantity, value: s.value, ...(s.run ? { run: s.run } : {}) })) } : {}),
  };
}

/**
 * Table editor of a claim: runs with their parts and stated values as rows that are added and
 * removed in place; saving posts through a fetcher, so the page does not reload.
 */
export function ClaimEditor({ initial, runLabels, action, intent, version, readOnly }: { initial: ClaimDraft; runLabels: string[]; action?: string; intent: string; version?: number; readOnly?: boolean }) {
  const [d, setD] = useState(initial);
  const fetcher = useFetcher<Reply>();
  const issues = fetcher.data?.error?.issues ?? [];
  const issueAt = (prefix: string) => issues.filter((i) => i.path === prefix || i.path.startsWith(`${prefix}.`)).map((i) => i.message).join(" ");
  const set = (patch: Partial<ClaimDraft>) => setD({ ...d, ...patch });
  const save = () =>
    fetcher.submit(
      { intent, record: JSON.stringify(recordOf(d)), figure: d.figure, statement: d.statement, ...(version !== undefined ? { version: String(version) } : {}) },
      { method: "post", action },
    );
  const runSelect = (value: string, onChange: (v: string) => void, id: string, label: string, allowAll: boolean) => (
    <select id={id} aria-label={label} className="field-input py-0.5" value={value} onChange={(e) => onChange(e.target.value)} disabled={readOnly}>
      <option value="">{allowAll ? "every run of the claim" : "—"}</option>
      {runLabels.map((l) => (
        <option key={l} value={l}>
          {l}
        </option>
      ))}
    </select>
  );
  return (
    <div className="flex flex-col gap-4" data-testid="claim-editor">
      <div className="grid gap-3 md:grid-cols-[3fr_1fr]">
        <label className="flex flex-col gap-1">
          <span className="font-semibold">Title</span>
          <input name="claim-title" className="field-input" value={d.title} onChange={(e) => set({ title: e.target.value })} readOnly={readOnly} />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-semibold">Figure</span>
          <input name="claim-figure" className="field-input" value={d.figure} onChange={(e) => set({ figure: e.target.value })} placeholder="e.g. Fig. 3b" readOnly={readOnly} />
        </label>
      </div>
      <label className="flex flex-col gap-1">
        <span className="font-semibold">Statement (as in the manuscript)</span>
        <textarea name="claim-statement" rows={3} className="field-input" value={d.statement} onChange={(e) => set({ statement: e.target.value })} readOnly={readOnly} />
      </label>
      <table className="text-left text-caption" aria-label="Runs the claim rests on">
        <thead>
          <tr>
            <th scope="col">Run</th>
            <th scope="col">Part</th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {d.runs.map((r, i) => (
            <tr key={i} data-testid="claim-run-row">
              <td>{runSelect(r.label, (v) => set({ runs: d.runs.map((x, j) => (j === i ? { ...x, label: v } : x)) }), `claim-run-${i}`, `Run ${i + 1}`, false)}</td>
              <td>
                <input aria-label={`Part of run ${i + 1}`} className="field-input py-0.5" value={r.part} list="claim-parts" onChange={(e) => set({ runs: d.runs.map((x, j) => (j === i ? { ...x, part: e.target.value } : x)) })} readOnly={readOnly} />
              </td>
              <td>
                {!readOnly ? (
                  <button type="button" className="btn-quiet btn py-0.5" onClick={() => set({ runs: d.runs.filter((_, j) => j !== i) })}>
                    Remove run {i + 1}
                  </button>
                ) : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <datalist id="claim-parts">
        <option value="reference" />
        <option value="varied" />
        <option value="control" />
      </datalist>
      {issueAt("runs") ? <p className="field-error">{issueAt("runs")}</p> : null}
      {!readOnly ? (
        <button type="button" className="btn-quiet btn self-start" onClick={() => set({ runs: [...d.runs, { label: "", part: "varied" }] })}>
          Add a run
        </button>
      ) : null}
      <label className="flex flex-col gap-1">
        <span className="font-semibold">Parameters the claim varies</span>
        <span className="text-caption text-basalt-soft">Dotted paths of the run record, e.g. stableLayer, controls.Ra — separated by commas.</span>
        <input name="claim-varies" className="field-input" value={d.varies} onChange={(e) => set({ varies: e.target.value })} readOnly={readOnly} />
      </label>
      <table className="text-left text-caption" aria-label="Stated values">
        <thead>
          <tr>
            <th scope="col">#</th>
            <th scope="col">Quantity</th>
            <th scope="col">Value as written</th>
            <th scope="col">Run</th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {d.stated.map((s, i) => {
            const err = issueAt(`stated[${i}]`);
            const upd = (patch: Partial<Stated>) => set({ stated: d.stated.map((x, j) => (j === i ? { ...x, ...patch } : x)) });
            return (
              <tr key={i} id={`stated-${i}`} data-testid="stated-row" className={err ? "bg-ember-wash" : ""}>
                <td>{i + 1}</td>
                <td>
                  <input aria-label={`Quantity ${i + 1}`} className="field-input py-0.5" value={s.quantity} onChange={(e) => upd({ quantity: e.target.value })} placeholder="e.g. Pm" readOnly={readOnly} />
                </td>
                <td>
                  <input aria-label={`Value ${i + 1}`} className="field-input py-0.5" value={s.value} onChange={(e) => upd({ value: e.target.value })} placeholder="e.g. ≈ 2" readOnly={readOnly} />
                  {err ? <span className="field-error block">{err}</span> : null}
                </td>
                <td>{runSelect(s.run, (v) => upd({ run: v }), `stated-run-${i}`, `Run of value ${i + 1}`, true)}</td>
                <td>
                  {!readOnly ? (
                    <button type="button" className="btn-quiet btn py-0.5" onClick={() => set({ stated: d.stated.filter((_, j) => j !== i) })}>
                      Remove value {i + 1}
                    </button>
                  ) : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {!readOnly ? (
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className="btn-quiet btn" onClick={() => set({ stated: [...d.stated, { quantity: "", value: "", run: "" }] })}>
            Add a stated value
          </button>
          <button type="button" className="btn" onClick={save} disabled={fetcher.state !== "idle"}>
            Save the claim
          </button>
          <span role="status" className="text-caption">
            {fetcher.state !== "idle" ? "Saving and re-checking…" : fetcher.data?.ok ? "Claim saved; the checker re-ran." : ""}
          </span>
        </div>
      ) : null}
      {fetcher.data?.error ? (
        <div role="alert" className="rounded border border-ember bg-ember-wash p-3 text-ember" data-testid="claim-error">
          <p>{fetcher.data.error.message}</p>
          <ul className="list-disc pl-5 text-caption">
            {fetcher.data.error.issues.map((i) => (
              <li key={i.path + i.message}>
                <code>{i.path}</code>: {i.message}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
