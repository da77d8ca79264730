/** Parse and validate a check input: schema, then cross-field checks with JSON paths. */
import { materialToSI } from "./material.ts";
import { formatPath, zodErrors, type InputError } from "./paths.ts";
import { checkInputSchema, type CheckInput, type Columns } from "./schema.ts";

export type ParseResult = { ok: true; value: CheckInput } | { ok: false; errors: InputError[] };

/** Accept a single run record or `{ runs, claim?, policy?, series?, spectra? }`. */
export function parseCheckInput(input: unknown): ParseResult {
  const wrapped =
    input && typeof input === "object" && (input as { format?: unknown }).format === "runproof.run/1" ? { runs: [input] } : input;
  const r = checkInputSchema.safeParse(wrapped);
  if (!r.success) return { ok: false, errors: zodErrors(r.error, wrapped) };
  const errors = crossChecks(r.data);
  return errors.length > 0 ? { ok: false, errors } : { ok: true, value: r.data };
}

function crossChecks(v: CheckInput): InputError[] {
  const errors: InputError[] = [];
  const labels = new Set<string>();
  v.runs.forEach((run, i) => {
    if (labels.has(run.label)) errors.push({ path: `runs[${i}].label`, message: `label "${run.label}" is used by an earlier run; labels must be unique` });
    labels.add(run.label);
    errors.push(...materialToSI(run.material, `runs[${i}].material`).errors);
    const t = run.time;
    if (t?.start !== undefined && t.end !== undefined && !(t.end > t.start)) {
      errors.push({ path: `runs[${i}].time.end`, message: `time.end (${t.end}) must be later than time.start (${t.start})` });
    }
  });
  for (const [kind, first] of [["series", "t"], ["spectra", "l"]] as const) {
    for (const [label, cols] of Object.entries(v[kind] ?? {})) {
      const where = formatPath([kind, label]);
      if (!labels.has(label)) errors.push({ path: where, message: `${where} names no run; use the label of one of the runs (${[...labels].join(", ")})` });
      errors.push(...columnChecks(cols, first, where));
    }
  }
  return errors;
}

function columnChecks(cols: Columns, first: "t" | "l", where: string): InputError[] {
  const errors: InputError[] = [];
  const names = Object.keys(cols);
  const x = cols[first];
  if (names[0] !== first || !x) return [{ path: where, message: `${where} must have "${first}" as its first column (found ${names[0] ?? "no columns"})` }];
  if (names.length < 2) errors.push({ path: where, message: `${where} has no data column besides "${first}"` });
  if (first === "l") {
    for (const n of names.slice(1)) if (n !== "kinetic" && n !== "magnetic") errors.push({ path: `${where}.${n}`, message: `spectrum column "${n}" is not allowed; use "kinetic" and/or "magnetic"` });
  }
  if (x.length < 2) errors.push({ path: `${where}.${first}`, message: `${where} needs at least 2 rows` });
  for (const [n, c] of Object.entries(cols)) {
    if (c.length !== x.length) errors.push({ path: `${where}.${n}`, message: `column ${n} has ${c.length} values, column ${first} has ${x.length}` });
    if (first === "l" && n !== "l" && c.some((e) => e < 0)) errors.push({ path: `${where}.${n}`, message: `spectrum column ${n} has a negative energy` });
  }
  for (let i = 1; i < x.length; i++) {
    if (!((x[i] ?? 0) > (x[i - 1] ?? 0))) {
      errors.push({ path: `${where}.${first}[${i}]`, message: `${first} must increase row by row (row ${i + 1}: ${x[i]} after ${x[i - 1]})` });
      break;
    }
  }
  if (first === "l" && x.some((l) => !Number.isInteger(l) || l < 0)) errors.push({ path: `${where}.l`, message: "degrees l must be non-negative integers" });
  return errors;
}
