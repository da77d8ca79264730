import type * as z from "zod";
import { InvalidInput } from "~/workspace/types";
import { zodIssues } from "~/workspace/zod-issues";
import { readJsonBody } from "./json-body.server";

/** JSON bodies of the API's write calls; a run record with its diagnostics fits well within this. */
export const API_JSON_LIMIT = 256 * 1024;

/** Query parameters parsed by the route's zod schema; unknown ones are refused with their name. */
export function parseQuery<S extends z.ZodType>(request: Request, schema: S): z.infer<S> {
  const params = Object.fromEntries(new URL(request.url).searchParams);
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw new InvalidInput("The query parameters are not valid.", zodIssues(parsed.error).map((i) => ({ ...i, path: `query.${i.path}` })));
  return parsed.data;
}

/** A JSON body within `limit` bytes (413 beyond), parsed by the schema with path-precise issues. */
export async function parseBody<S extends z.ZodType>(request: Request, schema: S, message: string, limit = API_JSON_LIMIT): Promise<z.infer<S>> {
  const body = await readJsonBody(request, limit);
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw new InvalidInput(message, zodIssues(parsed.error));
  return parsed.data;
}

/** `If-Match: "3"` (or W/"3") as a version number; undefined when absent. */
export function ifMatchVersion(request: Request): number | undefined {
  const header = request.headers.get("if-match");
  if (!header) return undefined;
  const match = /^(?:W\/)?"?(\d+)"?$/.exec(header.trim());
  if (!match) throw new InvalidInput("The If-Match header is not a version.", [{ path: "If-Match", message: 'Send the version you edited, e.g. If-Match: "3".' }]);
  return Number(match[1]);
}

export function methodNotAllowed(allowed: string[]) {
  return Response.json(
    { error: { code: "method_not_allowed", message: `Use ${allowed.join(" or ")} on this address.`, details: [] } },
    { status: 405, headers: { allow: allowed.join(", ") } },
  );
}
