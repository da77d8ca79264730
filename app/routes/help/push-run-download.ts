import pushRun from "../../../examples/push-run.mjs?raw";

/**
 * GET /help/downloads/push-run.mjs — the example API client (examples/push-run.mjs), public like
 * the help pages that link to it; its text is part of the server bundle.
 */
export function loader() {
  return new Response(pushRun, {
    headers: {
      "content-type": "text/javascript; charset=utf-8",
      "content-disposition": 'attachment; filename="push-run.mjs"',
      "cache-control": "public, max-age=3600",
      "x-content-type-options": "nosniff",
    },
  });
}
