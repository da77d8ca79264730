import { openApiDocument } from "~/api/openapi";

/** GET /api/v1/openapi.json — public, so tools can read it before anyone has a token. */
export function loader() {
  return Response.json(openApiDocument(), { headers: { "cache-control": "public, max-age=300" } });
}
