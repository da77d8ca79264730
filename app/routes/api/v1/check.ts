import { apiError, apiHandle } from "~/api/errors.server";
import { readJsonBody } from "~/api/json-body.server";
import { runChecker } from "~/threads/checker-pool.server";
import type { Route } from "./+types/check";

export const CHECK_BODY_LIMIT = 2 * 1024 * 1024;

/**
 * Stateless: the same input and output as the command-line checker. Nothing is stored. The
 * input is validated and checked in a checker thread (app/threads/checker-pool.server.ts): a busy
 * pool answers 503, an input that needs more time or memory than one check may use 422.
 */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return apiError(405, "method_not_allowed", "Use POST.");
  return apiHandle(async () => {
    const body = await readJsonBody(request, CHECK_BODY_LIMIT);
    const result = await runChecker({ kind: "api-check", body });
    if (!result.valid) {
      return apiError(400, "invalid_input", "The input does not follow runproof.run/1 or runproof.claim/1.", result.errors);
    }
    return Response.json(result.output);
  });
}

export function loader() {
  return apiError(405, "method_not_allowed", "POST a JSON object { runs: [...], claim?, policy? } to this address.");
}
