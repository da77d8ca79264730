import { Form } from "react-router";
import { RUN_SECTIONS, fieldId, type RunField } from "~/workspace/run-form-fields";

type Issue = { path: string; message: string };

function Input({ f, value, error, prefix }: { f: RunField; value?: string; error?: string; prefix: string }) {
  const id = fieldId(f.path, prefix);
  const common = {
    id,
    name: f.path,
    defaultValue: value ?? "",
    "aria-invalid": error ? true : undefined,
    "aria-describedby": error ? `${id}-error` : f.hint ? `${id}-hint` : undefined,
    className: "field-input py-0.5",
  };
  return (
    <div className="flex flex-col gap-0.5">
      <label htmlFor={id} className="text-caption font-semibold">
        {f.label}
        {f.required ? " *" : ""}
      </label>
      {f.kind === "enum" || f.kind === "bool" ? (
        <select {...common}>
          <option value="">—</option>
          {(f.kind === "bool" ? ["true", "false"] : (f.options ?? [])).map((o) => (
            <option key={o} value={o}>
              {o}
            </option>
          ))}
        </select>
      ) : (
        <input {...common} type="text" inputMode={f.kind === "text" ? undefined : "decimal"} />
      )}
      {f.hint ? (
        <span id={`${id}-hint`} className="text-caption text-basalt-soft">
          {f.hint}
        </span>
      ) : null}
      {error ? (
        <span id={`${id}-error`} className="field-error" role="alert">
          {error}
        </span>
      ) : null}
    </div>
  );
}

/** The run form: one input per field of `runproof.run/1`, named by the field's path. */
export function RunForm({
  values = {},
  issues = [],
  message,
  intent,
  submitLabel,
  lockLabel,
  extra,
  idPrefix = "run",
  multipart,
}: {
  /** Sends files chosen in `extra` too (multipart/form-data). */
  multipart?: boolean;
  idPrefix?: string;
  values?: Record<string, string>;
  issues?: Issue[];
  message?: string;
  intent: string;
  submitLabel: string;
  lockLabel?: boolean;
  extra?: React.ReactNode;
}) {
  const byPath = new Map<string, string>();
  for (const i of issues) for (const p of i.path.split(", ")) byPath.set(p, [byPath.get(p), i.message].filter(Boolean).join(" "));
  const known = new Set(RUN_SECTIONS.flatMap((s) => s.fields.map((f) => f.path)));
  const loose = issues.filter((i) => !i.path.split(", ").some((p) => known.has(p)));
  return (
    <Form method="post" encType={multipart ? "multipart/form-data" : undefined} className="flex flex-col gap-4" data-testid={`run-form-${intent}`}>
      <input type="hidden" name="intent" value={intent} />
      {extra}
      {message ? (
        <div role="alert" className="rounded border border-ember bg-ember-wash p-3 text-ember">
          <p>{message}</p>
          {loose.length ? (
            <ul className="list-disc pl-5 text-caption">
              {loose.map((i) => (
                <li key={i.path + i.message}>
                  <code>{i.path}</code>: {i.message}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      {RUN_SECTIONS.map((s) => (
        <fieldset key={s.title} className="rounded border border-rule p-3">
          <legend className="px-1 font-semibold">{s.title}</legend>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            {s.fields.map((f) =>
              lockLabel && f.path === "label" ? (
                <div key={f.path} className="flex flex-col">
                  <span className="text-caption font-semibold">Label</span>
                  <input type="hidden" name="label" value={values.label ?? ""} />
                  <span className="font-mono">{values.label}</span>
                </div>
              ) : (
                <Input key={f.path} f={f} value={values[f.path]} error={byPath.get(f.path)} prefix={idPrefix} />
              ),
            )}
          </div>
        </fieldset>
      ))}
      <button type="submit" className="btn self-start">
        {submitLabel}
      </button>
    </Form>
  );
}

/** Issues of a failed import (JSON path or line number first), for uploads that have no form fields. */
export function IssueList({ message, issues, testId }: { message: string; issues: Issue[]; testId?: string }) {
  return (
    <div role="alert" className="rounded border border-ember bg-ember-wash p-3 text-ember" data-testid={testId}>
      <p>{message}</p>
      <ul className="list-disc pl-5 text-caption">
        {issues.map((i) => (
          <li key={i.path + i.message}>
            <code>{i.path}</code>: {i.message}
          </li>
        ))}
      </ul>
    </div>
  );
}
