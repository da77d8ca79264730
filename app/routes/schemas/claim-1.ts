import { claimJsonSchema } from "~/checker/json-schema";

export function loader() {
  return Response.json(claimJsonSchema(), {
    headers: { "content-type": "application/schema+json", "cache-control": "public, max-age=3600" },
  });
}
