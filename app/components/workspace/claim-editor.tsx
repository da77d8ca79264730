import { useState } from "react";
import { useFetcher } from "react-router";
import { isStatable, QUANTITY_NAMES, STATABLE, suggestQuantity, VARIABLE_PATHS } from "~/checker/quantity-keys";
import { describe, parseStated, StatedValueError } from "~/checker/stated";

type StatedKind = "value" | "ratio" | "scaling";
type Stated = { kind: StatedKind; quantity: string; value: string; run: string; ratioA: string; ratioB: string; scalesWith: string };
type RunRef = { label: string; part: string };
export type ClaimDraft = { title: string; figure: string; statement: string; runs: RunRef[]; varies: string; stated: Stated[] };
type Reply = { ok?: boolean; error?: { message: string; issues: { path: string; message: string }[] } };

export function claimDraftOf(c?: { figure: string | null; statement: string; record: unknown }): ClaimDraft {
  const r = (c?.record ?? {}) as {
    title?: string;
    runs?: RunRef[];
    varies?: string[];
    stated?: { quantity: string; value: string | number; run?: string; ratio?: [string, string]; scalesWith?: string }[];
  };
  return {
    title: r.title ?? "",
    figure: c?.figure ?? "",
    statement: c?.statement ?? "",
    runs: r.runs?.length ? r.runs : [{ label: "", part: "reference" }],
    varies: (r.varies ?? []).join(", "),
    stated: (r.stated ?? []).map((s) => ({
      kind: s.ratio ? "ratio" : s.scalesWith !== undefined ? "scaling" : "value",
      quantity: s.quantity,
      value: String(s.value),
      run: s.run ?? "",
      ratioA: s.ratio?.[0] ?? "",
      ratioB: s.ratio?.[1] ?? "",
      scalesWith: s.scalesWith ?? "",
    })),
  };
}

/** The claim as `runproof.claim/1`, built from the editor's rows. */
export function recordOf(d: ClaimDraft) {
  const varies = d.varies.split(/[,\s]+/).filter(Boolean);
  return {
    format: "runproof.claim/1",
    title: d.title,
    runs: d.runs.filter((r) => r.label),
    ...(varies.length ? { varies } : {}),
    ...(d.stated.length ? { stated: d.stated.map(statedOf) } : {}),
  };
}

function statedOf(s: Stated) {
  const base = { quantity: s.quantity.trim(), value: s.value };
  if (s.kind === "ratio") return { ...base, ratio: [s.ratioA, s.ratioB] };
  if (s.kind === "scaling") return { ...base, scalesWith: s.scalesWith.trim() };
  return { ...base, ...(s.run ? { run: s.run } : {}) };
}

/** What a typed quantity means, or what to type instead — shown as the author types. */
function quantityHint(q: string): { ok: boolean; text: string } | null {
  const t = q.trim();
  if (!t) return null;
  if (isStatable(t)) return { ok: true, text: QUANTITY_NAMES[t] ?? t };
  const hint = suggestQuantity(t);
  return { ok: false, text: `not a known quantity${hint ? ` — did you mean ${hint} (${QUANTITY_NAMES[hint]})?` : "; pick one from the list"}` };
}

/** The interval a stated value means, e.g. 3.0e-5 → [2.95e-5, 3.05e-5). */
function valueHint(v: string): { ok: boolean; text: string } | null {
  if (!v.trim()) return null;
  try {
    return { ok: true, text: `${v.trim()} → ${describe(parseStated(v)).replace(/^"[^"]*"\s*(=\s*)?/, "")}` };
  } catch (e) {
    if (e instanceof StatedValueError) return { ok: false, text: e.message };
    throw e;
  }
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
      <datalist id="claim-quantities">
        {STATABLE.map((k) => (
          <option key={k} value={k}>
            {QUANTITY_NAMES[k]}
          </option>
        ))}
      </datalist>
      <datalist id="claim-paths">
        {VARIABLE_PATHS.map((p) => (
          <option key={p} value={p} />
        ))}
      </datalist>
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
        <input name="claim-varies" list="claim-paths" className="field-input" value={d.varies} onChange={(e) => set({ varies: e.target.value })} readOnly={readOnly} />
      </label>
      <table className="text-left text-caption" aria-label="Stated values">
        <thead>
          <tr>
            <th scope="col">#</th>
            <th scope="col">Kind</th>
            <th scope="col">Quantity</th>
            <th scope="col">Value as written</th>
            <th scope="col">Runs</th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {d.stated.map((s, i) => {
            const err = issueAt(`stated[${i}]`);
            const upd = (patch: Partial<Stated>) => set({ stated: d.stated.map((x, j) => (j === i ? { ...x, ...patch } : x)) });
            const qh = quantityHint(s.quantity);
            const vh = valueHint(s.value);
            return (
              <tr key={i} id={`stated-${i}`} data-testid="stated-row" className={err ? "bg-ember-wash" : ""}>
                <td>{i + 1}</td>
                <td>
                  <select aria-label={`Kind of value ${i + 1}`} className="field-input py-0.5" value={s.kind} onChange={(e) => upd({ kind: e.target.value as StatedKind })} disabled={readOnly}>
                    <option value="value">value</option>
                    <option value="ratio">ratio of two runs</option>
                    <option value="scaling">scaling exponent</option>
                  </select>
                </td>
                <td>
                  <input aria-label={`Quantity ${i + 1}`} list="claim-quantities" className="field-input py-0.5" value={s.quantity} onChange={(e) => upd({ quantity: e.target.value })} placeholder="e.g. Pm" readOnly={readOnly} />
                  {qh ? <span className={`block text-caption ${qh.ok ? "text-basalt-soft" : "field-error"}`} data-testid="quantity-hint">{qh.text}</span> : null}
                </td>
                <td>
                  <input aria-label={`Value ${i + 1}`} className="field-input py-0.5" value={s.value} onChange={(e) => upd({ value: e.target.value })} placeholder={s.kind === "scaling" ? "e.g. 0.41 ± 0.03" : "e.g. ≈ 2"} readOnly={readOnly} />
                  {vh ? <span className={`block font-mono text-caption ${vh.ok ? "text-basalt-soft" : "field-error"}`} data-testid="value-interval">{vh.text}</span> : null}
                  {err ? <span className="field-error block">{err}</span> : null}
                </td>
                <td>
                  {s.kind === "value" ? runSelect(s.run, (v) => upd({ run: v }), `stated-run-${i}`, `Run of value ${i + 1}`, true) : null}
                  {s.kind === "ratio" ? (
                    <span className="flex items-center gap-1">
                      {runSelect(s.ratioA, (v) => upd({ ratioA: v }), `stated-ratio-a-${i}`, `Numerator run of value ${i + 1}`, false)}
                      <span aria-hidden="true">/</span>
                      {runSelect(s.ratioB, (v) => upd({ ratioB: v }), `stated-ratio-b-${i}`, `Denominator run of value ${i + 1}`, false)}
                    </span>
                  ) : null}
                  {s.kind === "scaling" ? (
                    <label className="flex items-center gap-1">
                      <span>∝</span>
                      <input aria-label={`Scales with, value ${i + 1}`} list="claim-quantities" className="field-input py-0.5" value={s.scalesWith} onChange={(e) => upd({ scalesWith: e.target.value })} placeholder="e.g. RaBuoyancy" readOnly={readOnly} />
                      <span>^b over every run</span>
                    </label>
                  ) : null}
                </td>
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
          <button type="button" className="btn-quiet btn" onClick={() => set({ stated: [...d.stated, { kind: "value", quantity: "", value: "", run: "", ratioA: "", ratioB: "", scalesWith: "" }] })}>
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
