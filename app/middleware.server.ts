import { data, type MiddlewareFunction } from "react-router";
import { apiError } from "~/api/errors.server";
import { badParam, findBadText } from "~/lib/edge-input";
import { db, dbContext } from "./db.server";

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
