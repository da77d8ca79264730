import { data } from "react-router";
import { InvalidInput, PayloadTooLarge, StateConflict, StorageUnavailable, TooManyRequests } from "./types";

export type ServiceError = { error: { message: string; issues: { path: string; message: string }[] } };

/**
 * Turns the services' typed errors into a 400/409/413/429/503 reply an action can return (so the form
 * shows what, where and how to fix); anything else is a bug and propagates.
 */
export function serviceError(e: unknown, extra: Record<string, unknown> = {}) {
  if (e instanceof InvalidInput) return data({ ...extra, error: { message: e.message, issues: e.issues } }, { status: 400 });
  if (e instanceof StateConflict) return data({ ...extra, error: { message: e.message, issues: [] } }, { status: 409 });
  if (e instanceof PayloadTooLarge) return data({ ...extra, error: { message: e.message, issues: [] } }, { status: 413 });
  if (e instanceof TooManyRequests) return data({ ...extra, error: { message: e.message, issues: [] } }, { status: 429 });
  if (e instanceof StorageUnavailable) return data({ ...extra, error: { message: e.message, issues: [] } }, { status: 503 });
  throw e;
}

/** The same mapping for the review pages' fetchers, which read `{ ok, error, issues }`. */
export function asActionError(e: unknown) {
  const reply = serviceError(e);
  return data({ ok: false as const, error: reply.data.error.message, issues: reply.data.error.issues }, reply.init ?? undefined);
}
