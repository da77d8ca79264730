import { and, eq, inArray } from "drizzle-orm";
import type { Database } from "~db/client";
import { runs } from "~db/schema";
import { runSchema, type RunRecord } from "~/checker/schema";
import { type KeyMap, mergeRecord, namelistToRecord } from "./namelist-map";
import { markRoundChanged, requestRecheck } from "./recheck.server";
import { draftRoundById } from "./rounds.server";
import { createRun } from "./runs.server";
import { parseJsonText } from "./run-edits.server";
import { InvalidInput, PayloadTooLarge } from "./types";
import { zodIssues } from "./zod-issues";
import { BULK_LIMITS } from "./run-import-limits";

export { BULK_LIMITS };

export type BulkFile = { name: string; text: string };
type Issue = { path: string; message: string };

const kb = (n: number) => `${Math.round(n / 1024)} KB`;

/** Checks the bounds before any file is parsed; `sizes` are the files' byte lengths. */
export function checkBulkBounds(files: { name: string; size: number }[]) {
  if (files.length === 0) throw new InvalidInput("Choose at least one file to import; nothing was stored.", [{ path: "files", message: "no file chosen" }]);
  if (files.length > BULK_LIMITS.files) {
    throw new InvalidInput(`${files.length} files were chosen; one import takes at most ${BULK_LIMITS.files}. Nothing was stored: import them in parts.`, [
      { path: "files", message: `at most ${BULK_LIMITS.files} files at once` },
    ]);
  }
  const big = files.filter((f) => f.size > BULK_LIMITS.fileBytes);
  if (big.length) {
    throw new PayloadTooLarge(
      `${big.map((f) => `"${f.name}"`).join(", ")} ${big.length === 1 ? "is" : "are"} larger than ${kb(BULK_LIMITS.fileBytes)}, the limit of one file in an import; nothing was stored. Split the file into several.`,
    );
  }
  const total = files.reduce((s, f) => s + f.size, 0);
  if (total > BULK_LIMITS.totalBytes) {
    throw new PayloadTooLarge(`The files add up to ${kb(total)}; one import takes at most ${kb(BULK_LIMITS.totalBytes)}. Nothing was stored: import them in parts.`);
  }
}

/** Where a problem is: the file, the record's position in it (1-based) and its label when known. */
function place(file: string, index: number | null, label: unknown) {
  const name = typeof label === "string" && label ? ` ("${label.slice(0, 80)}")` : "";
  return index === null ? `${file}${name}` : `${file}, record ${index + 1}${name}`;
}

const prefixed = (where: string, issues: Issue[]) => issues.map((i) => ({ path: `${where} › ${i.path}`, message: i.message }));

/**
 * JSON files → candidate records: each file holds one run record or an array of them. Every
 * file is read and every problem collected (not only the first), each named by file and record.
 */
export function recordsFromJsonFiles(files: BulkFile[]): { candidates: { where: string; input: unknown }[]; issues: Issue[] } {
  const candidates: { where: string; input: unknown }[] = [];
  const issues: Issue[] = [];
  for (const f of files) {
    let parsed: unknown;
    try {
      parsed = parseJsonText(f.text);
    } catch (e) {
      if (!(e instanceof InvalidInput)) throw e;
      issues.push(...prefixed(f.name, e.issues));
      continue;
    }
    if (Array.isArray(parsed)) {
      if (parsed.length === 0) issues.push({ path: f.name, message: "the array holds no run record; remove the file or add records" });
      if (candidates.length + parsed.length > BULK_LIMITS.records) {
        throw new InvalidInput(`The files hold more than ${BULK_LIMITS.records} run records; one import takes at most ${BULK_LIMITS.records}. Nothing was stored: import them in parts.`, [
          { path: f.name, message: `${parsed.length} records in this file` },
        ]);
      }
      parsed.forEach((input, i) => candidates.push({ where: place(f.name, i, (input as { label?: unknown } | null)?.label), input }));
    } else {
      if (candidates.length + 1 > BULK_LIMITS.records) {
        throw new InvalidInput(`The files hold more than ${BULK_LIMITS.records} run records; nothing was stored. Import them in parts.`, [{ path: f.name, message: "over the limit of records" }]);
      }
      candidates.push({ where: place(f.name, null, (parsed as { label?: unknown } | null)?.label), input: parsed });
    }
  }
  return { candidates, issues };
}

/** The file's name without its extension: the label of a namelist's run when nothing else names it. */
export function labelFromFileName(name: string) {
  return name.replace(/^.*[\\/]/, "").replace(/\.[^.]*$/, "").trim().slice(0, 200) || name.slice(0, 200);
}

/** Namelist files → candidate records: the shared fields, each namelist's values over them (one key map). */
export function recordsFromNamelists(files: BulkFile[], map: KeyMap, base: Record<string, unknown>): { candidates: { where: string; input: unknown }[]; issues: Issue[] } {
  const candidates: { where: string; input: unknown }[] = [];
  const issues: Issue[] = [];
  for (const f of files) {
    try {
      const mapped = namelistToRecord(f.text, map);
      const input = mergeRecord(base, mapped);
      if (typeof input.label !== "string" || !input.label) input.label = labelFromFileName(f.name);
      candidates.push({ where: place(f.name, null, input.label), input });
    } catch (e) {
      if (!(e instanceof InvalidInput)) throw e;
      issues.push(...prefixed(f.name, e.issues));
    }
  }
  return { candidates, issues };
}

/**
 * Validates every candidate (schema, labels unique in the batch and in the submission) and then
 * writes all runs in one transaction, or nothing: one bad record anywhere refuses the whole
 * import with every problem named by file, record and field. Queues the round's check once.
 */
export async function importRuns(
  db: Database,
  opts: { submissionId: string; roundId: string; userId: string; origin: "json" | "namelist"; candidates: { where: string; input: unknown }[]; issues: Issue[] },
) {
  await draftRoundById(db, opts.roundId);
  const issues = [...opts.issues];
  const records: RunRecord[] = [];
  const firstPlace = new Map<string, string>();
  for (const c of opts.candidates) {
    const parsed = runSchema.safeParse(c.input);
    if (!parsed.success) {
      issues.push(...prefixed(c.where, zodIssues(parsed.error)));
      continue;
    }
    const earlier = firstPlace.get(parsed.data.label);
    if (earlier) {
      issues.push({ path: `${c.where} › label`, message: `the label is also used by ${earlier}; labels are unique within a submission` });
      continue;
    }
    firstPlace.set(parsed.data.label, c.where);
    records.push(parsed.data);
  }
  const labels = records.map((r) => r.label);
  if (labels.length) {
    const clashes = await db
      .select({ label: runs.label })
      .from(runs)
      .where(and(eq(runs.submissionId, opts.submissionId), inArray(runs.label, labels)));
    for (const { label } of clashes) {
      issues.push({ path: `${firstPlace.get(label)} › label`, message: `a run labelled "${label}" already exists in this submission; rename it in the file, or edit the existing run` });
    }
  }
  if (issues.length) {
    throw new InvalidInput(`${issues.length} problem${issues.length === 1 ? "" : "s"} in the import; nothing was stored. Fix each one named below and import all files again.`, issues.slice(0, 100));
  }
  const created = await db.transaction(async (tx) => {
    const out = [];
    for (const record of records) out.push(await createRun(tx, { submissionId: opts.submissionId, roundId: opts.roundId, record, origin: opts.origin, userId: opts.userId }));
    await markRoundChanged(tx, opts.roundId);
    return out;
  });
  await requestRecheck(db, opts.roundId, { alreadyMarked: true });
  return created.map((c) => ({ runId: c.run.id, label: c.run.label }));
}
