import { createContext, data, type MiddlewareFunction } from "react-router";
import { apiError, databaseUnavailableApiError } from "~/api/errors.server";
import { DATABASE_RETRY_AFTER_SECONDS, DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from "~/lib/database-unavailable";
import { badParam, findBadText } from "~/lib/edge-input";
import { db, dbContext } from "./db.server";

/**
 * Set for a request during which the database could not be reached. `handleError` in
 * entry.server.tsx sets it (React Router passes it every error a loader, action or middleware
 * threw, with this request's context), `databaseOutageMiddleware` turns it into the 503.
 */
export const databaseOutageContext = createContext<boolean>(false);

/** Records that this request met an unreachable database, when `error` says so. */
export function noteDatabaseOutage(error: unknown, context: { set: (key: typeof databaseOutageContext, value: boolean) => void }) {
  if (!isDatabaseUnavailable(error)) return false;
  context.set(databaseOutageContext, true);
  return true;
}

/** The 503 while PostgreSQL cannot be reached: the API's JSON error shape, or the text the error page shows. */
export function databaseUnavailableResponse(request: Request) {
  if (new URL(request.url).pathname.startsWith("/api/")) return databaseUnavailableApiError();
  return new Response(DATABASE_UNAVAILABLE_MESSAGE, {
    status: 503,
    headers: { "content-type": "text/plain; charset=utf-8", "retry-after": String(DATABASE_RETRY_AFTER_SECONDS) },
  });
}

/**
 * The first root middleware: a request that met an unreachable database (PostgreSQL down or
 * restarting) answers 503 with Retry-After instead of 500, wherever the error was thrown. A
 * loader's or action's error never reaches `next()` (React Router renders the error boundary
 * and returns that response), so `handleError` marks the request and this middleware throws
 * the 503 afterwards: pages render the one error view with it, resource routes answer it.
 */
export const databaseOutageMiddleware: MiddlewareFunction<Response> = async ({ request, context }, next) => {
  let response: Response;
  try {
    response = await next();
  } catch (error) {
    if (!noteDatabaseOutage(error, context)) throw error;
    throw databaseUnavailableResponse(request);
  }
  if (context.get(databaseOutageContext)) throw databaseUnavailableResponse(request);
  return response;
};

/** Hands the one database pool to every loader and action through the router context. */
export const dbMiddleware: MiddlewareFunction<Response> = async ({ context }, next) => {
  context.set(dbContext, db);
  return next();
};

/** Form bodies up to this size are read once more here to check their text; larger ones are uploads. */
const FORM_TEXT_CHECK_BYTES = 1024 * 1024;

/**
 * The edge check of every request: a malformed id or round number names nothing (404), and text
 * with NUL, control characters or lone surrogates in the query or a form is refused (400) with the
 * field named, before any loader or action runs and before anything is stored.
 */
export const edgeInputMiddleware: MiddlewareFunction<Response> = async ({ request, params }, next) => {
  const url = new URL(request.url);
  const api = url.pathname.startsWith("/api/v1/");
  const problem = badParam(params);
  if (problem) {
    if (api) throw apiError(404, "not_found", `Nothing is found at this address: ${problem}.`);
    throw data("Not found", { status: 404 });
  }
  const bad = findBadText(Object.fromEntries(url.searchParams)) ?? (await badFormText(request));
  if (bad) {
    if (api) throw apiError(400, "invalid_text", bad.message, [bad]);
    throw data(`The field ${bad.message}. Nothing was saved.`, { status: 400 });
  }
  return next();
};

async function badFormText(request: Request) {
  if (request.method === "GET" || request.method === "HEAD") return null;
  const type = (request.headers.get("content-type") ?? "").toLowerCase();
  const length = Number(request.headers.get("content-length") ?? NaN);
  const form = type.startsWith("application/x-www-form-urlencoded") || (type.startsWith("multipart/form-data") && length <= FORM_TEXT_CHECK_BYTES);
  if (!form) return null;
  try {
    for (const [name, value] of await request.clone().formData()) {
      const text = typeof value === "string" ? value : value.name;
      const problem = findBadText({ [name]: text });
      if (problem) return problem;
    }
  } catch {
    throw data("The form could not be read: it is not a well-formed form submission.", { status: 400 });
  }
  return null;
}
