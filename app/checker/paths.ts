/** JSON paths like `runs[1].material.eta` or `series["ref-A"].Re`, and readable zod errors. */
import type * as z from "zod";

export interface InputError {
  path: string;
  message: string;
}

export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let s = "";
  for (const p of path) {
    if (typeof p === "number") s += `[${p}]`;
    else {
      const k = String(p);
      s += /^[A-Za-z_$][\w$]*$/.test(k) ? (s === "" ? k : `.${k}`) : `[${JSON.stringify(k)}]`;
    }
  }
  return s === "" ? "(top level)" : s;
}

const describeValue = (v: unknown) => (v === undefined ? "nothing" : JSON.stringify(v)?.slice(0, 60) ?? String(v));

function at(root: unknown, path: ReadonlyArray<PropertyKey>): unknown {
  let v: unknown = root;
  for (const p of path) v = v && typeof v === "object" ? (v as Record<PropertyKey, unknown>)[p] : undefined;
  return v;
}

/** One readable error per zod issue: what, where, how to fix. */
export function zodErrors(error: z.core.$ZodError, input: unknown, prefix: ReadonlyArray<PropertyKey> = []): InputError[] {
  const out: InputError[] = [];
  for (const issue of error.issues) {
    const full = [...prefix, ...issue.path];
    const path = formatPath(full);
    const found = at(input, issue.path);
    switch (issue.code) {
      case "unrecognized_keys":
        for (const k of issue.keys) {
          out.push({ path: formatPath([...full, k]), message: `unknown key "${k}" at ${path}; remove it or correct its spelling (see the runproof.run/1 and runproof.claim/1 schemas)` });
        }
        break;
      case "invalid_type":
        out.push({ path, message: found === undefined ? `${path} is required (expected ${issue.expected})` : `${path} must be ${issue.expected}, found ${describeValue(found)}` });
        break;
      case "invalid_value":
        out.push({ path, message: `${path} must be one of ${issue.values.map((v) => JSON.stringify(v)).join(", ")}, found ${describeValue(found)}` });
        break;
      case "invalid_union": {
        const options = issue.errors.flat().flatMap((e) => (e.code === "invalid_value" ? e.values : []));
        const types = issue.errors.flat().flatMap((e) => (e.code === "invalid_type" ? [e.expected] : []));
        const want = options.length > 0 ? `one of ${options.map((v) => JSON.stringify(v)).join(", ")}` : types.length > 0 ? `a ${types.join(" or a ")}` : "valid";
        out.push({ path, message: `${path} must be ${want}, found ${describeValue(found)}` });
        break;
      }
      default:
        out.push({ path, message: `${path}: ${issue.message} (found ${describeValue(found)})` });
    }
  }
  return out;
}
