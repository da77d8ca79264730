/**
 * The checker work that runs in a worker thread (app/threads/checker-pool.server.ts): pure CPU,
 * no I/O, plain data in and out. The thread's entry (checker-thread.ts) calls `runCheckerTask`;
 * the same function runs in the caller's process nowhere else.
 *
 * Errors cross the thread boundary as plain objects (structured clone keeps no class), so the
 * checker's own errors are sent as a `WireError` and rebuilt with their class on the other side.
 */
import { check, CheckInputError, checkPreparedRound, ClaimCheckError, parseCheckInput, type CheckOutput, type ClaimRecord, type InputError, type PreparedInput } from "~/checker";
import type { TypedColumns } from "~/checker/csv";
import { analyseColumns } from "~/workspace/attachment-analysis";

export type RoundCheckInput = PreparedInput & { claims: ClaimRecord[] };

export type CheckerTask =
  /** POST /api/v1/check: the JSON body as parsed, validated and checked in the thread. */
  | { kind: "api-check"; body: unknown }
  /** The round re-check's evaluation, from stored analyses (recheckRound). */
  | { kind: "round-check"; input: RoundCheckInput }
  /** One stored file's analysis: statistics per column and the plot copy (typed columns, transferred). */
  | { kind: "analyse-file"; fileKind: "series" | "spectrum"; columns: TypedColumns; batch: number };

export type ApiCheckResult = { valid: true; output: CheckOutput } | { valid: false; errors: InputError[] };

export type CheckerResult<T extends CheckerTask["kind"]> = T extends "api-check"
  ? ApiCheckResult
  : T extends "round-check"
    ? ReturnType<typeof checkPreparedRound>
    : ReturnType<typeof analyseColumns>;

export type WireError = { name: string; message: string; errors?: InputError[]; claimIndex?: number; inner?: WireError };

/** What the thread answers: a result, or the task's own error as plain data. */
export type TaskReply<T = unknown> = { ok: true; value: T } | { ok: false; error: WireError };

export function toWire(e: unknown): WireError {
  if (e instanceof CheckInputError) return { name: e.name, message: e.message, errors: e.errors };
  if (e instanceof ClaimCheckError) return { name: e.name, message: e.message, claimIndex: e.claimIndex, inner: toWire(e.inner) };
  if (e instanceof Error) return { name: e.name, message: e.message };
  return { name: "Error", message: String(e) };
}

/** The error as the checker threw it: CheckInputError and ClaimCheckError keep their class. */
export function fromWire(w: WireError): Error {
  if (w.name === "CheckInputError" && w.errors) return new CheckInputError(w.errors);
  if (w.name === "ClaimCheckError" && w.claimIndex !== undefined) return new ClaimCheckError(w.claimIndex, w.inner ? fromWire(w.inner) : new Error(w.message));
  const error = new Error(w.message);
  error.name = w.name;
  return error;
}

function apiCheck(body: unknown): ApiCheckResult {
  const parsed = parseCheckInput(body);
  if (!parsed.ok) return { valid: false, errors: parsed.errors };
  try {
    // The same call the route made inline before: `check` validates once more and checks.
    return { valid: true, output: check(parsed.value) };
  } catch (e) {
    if (e instanceof CheckInputError) return { valid: false, errors: e.errors };
    throw e;
  }
}

/** Runs one task; never throws for the task's own errors (they come back as `{ ok: false }`). */
export function runCheckerTask(task: CheckerTask): TaskReply {
  try {
    switch (task.kind) {
      case "api-check":
        return { ok: true, value: apiCheck(task.body) };
      case "round-check":
        return { ok: true, value: checkPreparedRound(task.input) };
      case "analyse-file":
        return { ok: true, value: analyseColumns(task.fileKind, task.columns, task.batch) };
    }
  } catch (e) {
    return { ok: false, error: toWire(e) };
  }
  return { ok: false, error: { name: "Error", message: `unknown checker task ${(task as { kind?: unknown }).kind}` } };
}
