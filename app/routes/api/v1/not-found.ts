import { apiError } from "~/api/errors.server";

/** Any other address under /api/v1/: the API's JSON error, not the site's HTML page. */
const notFound = ({ request }: { request: Request }) =>
  apiError(404, "not_found", `No endpoint ${request.method} ${new URL(request.url).pathname}; see /api/v1/openapi.json for the list.`);

export const loader = notFound;
export const action = notFound;
