import { runJsonSchema } from "~/checker/json-schema";

export function loader() {
  return Response.json(runJsonSchema(), {
    headers: { "content-type": "application/schema+json", "cache-control": "public, max-age=3600" },
  });
}
