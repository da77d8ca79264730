import { apiError } from "~/api/errors.server";
import { readJsonBody } from "~/api/json-body.server";
import { check, parseCheckInput } from "~/checker";
import type { Route } from "./+types/check";

export const CHECK_BODY_LIMIT = 2 * 1024 * 1024;

/** Stateless: the same input and output as the command-line checker. Nothing is stored. */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return apiError(405, "method_not_allowed", "Use POST.");
  let body: unknown;
  try {
    body = await readJsonBody(request, CHECK_BODY_LIMIT);
  } catch (response) {
    if (response instanceof Response) return response;
    throw response;
  }
  const parsed = parseCheckInput(body);
  if (!parsed.ok) {
    return apiError(400, "invalid_input", "The input does not follow runproof.run/1 or runproof.claim/1.", parsed.errors);
  }
  return Response.json(check(parsed.value));
}

export function loader() {
  return apiError(405, "method_not_allowed", "POST a JSON object { runs: [...], claim?, policy? } to this address.");
}
