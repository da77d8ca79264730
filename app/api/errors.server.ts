import { isRouteErrorResponse } from "react-router";
import { DATABASE_RETRY_AFTER_SECONDS, DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from "~/lib/database-unavailable";
import { CheckerBusy, CheckerOverBudget } from "~/threads/checker-pool.server";
import { InvalidInput, PayloadTooLarge, StateConflict, StorageUnavailable } from "~/workspace/types";

/** The one error shape of the public API: `{ error: { code, message, details } }`. */
export type ApiErrorDetail = { path: string; message: string };

export function apiError(status: number, code: string, message: string, details: ApiErrorDetail[] = [], headers?: HeadersInit) {
  return Response.json({ error: { code, message, details } }, { status, headers });
}

const CODE_OF_STATUS: Record<number, string> = {
  400: "invalid_input",
  401: "unauthenticated",
  403: "forbidden",
  404: "not_found",
  405: "method_not_allowed",
  409: "conflict",
  413: "body_too_large",
  429: "rate_limited",
  503: "unavailable",
};

/** The API's answer while PostgreSQL cannot be reached (restarting, down): 503, try again shortly. */
export function databaseUnavailableApiError() {
  return apiError(503, "database_unavailable", DATABASE_UNAVAILABLE_MESSAGE, [], { "retry-after": String(DATABASE_RETRY_AFTER_SECONDS) });
}

/** How a check stopped by its thread's limits is explained: what was exceeded and what to do. */
export function overBudgetApiError(e: CheckerOverBudget) {
  return apiError(422, "too_large_to_check", `The input is too large to check here: ${e.message}. Nothing was stored.`, [
    {
      path: "",
      message:
        "Send fewer runs per call, thin long series (for example every n-th row) or attach them to a run as files, or run the command-line checker (/help/downloads/runproof-check.mjs) on your own machine.",
    },
  ]);
}

/**
 * Turns anything a handler throws into the API's error shape: the workspace's domain errors,
 * the guards' `data("Not found", 404)` responses, and ready API responses pass through.
 * A busy checker pool and an unreachable database answer 503 with Retry-After, a check stopped
 * by its thread's limits 422. Unknown errors are rethrown so the server logs them and answers 500.
 */
export async function toApiResponse(thrown: unknown): Promise<Response> {
  if (thrown instanceof InvalidInput) return apiError(400, "invalid_input", thrown.message, thrown.issues);
  if (thrown instanceof StateConflict) return apiError(409, "conflict", thrown.message);
  if (thrown instanceof PayloadTooLarge) return apiError(413, "body_too_large", thrown.message);
  if (thrown instanceof StorageUnavailable) return apiError(503, "storage_unavailable", thrown.message, [], { "retry-after": "60" });
  if (thrown instanceof CheckerBusy) {
    return apiError(503, "checker_busy", `Every checker thread is busy (${thrown.message}); send the same request again in a few seconds.`, [], { "retry-after": "5" });
  }
  if (thrown instanceof CheckerOverBudget) return overBudgetApiError(thrown);
  if (isDatabaseUnavailable(thrown)) return databaseUnavailableApiError();
  if (thrown instanceof Response) {
    if ((thrown.headers.get("content-type") ?? "").includes("application/json")) {
      const body = await thrown.clone().json().catch(() => null);
      if (body && typeof body === "object" && "error" in body) return thrown;
    }
    const text = await thrown.text().catch(() => "");
    return apiError(thrown.status, CODE_OF_STATUS[thrown.status] ?? "error", text || "Request failed.");
  }
  // `throw data("Not found", { status: 404 })` from the shared guards arrives as this object.
  if (thrown && typeof thrown === "object" && (thrown as { type?: string }).type === "DataWithResponseInit") {
    const { data: payload, init } = thrown as { data: unknown; init?: ResponseInit | null };
    const status = init?.status ?? 500;
    const message = typeof payload === "string" ? payload : "Request failed.";
    return apiError(status, CODE_OF_STATUS[status] ?? "error", message);
  }
  if (isRouteErrorResponse(thrown)) {
    const message = typeof thrown.data === "string" ? thrown.data : thrown.statusText || "Request failed.";
    return apiError(thrown.status, CODE_OF_STATUS[thrown.status] ?? "error", message);
  }
  throw thrown;
}

/** Wraps a loader or action body so that every failure leaves as the one JSON error shape. */
export async function apiHandle(fn: () => Promise<Response>): Promise<Response> {
  try {
    return await fn();
  } catch (thrown) {
    return toApiResponse(thrown);
  }
}
