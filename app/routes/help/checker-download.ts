import { readFile } from "node:fs/promises";
import { resolve } from "node:path";

/** Where the production build leaves the bundle (scripts/build-cli.mjs, run by vite.config.ts). */
const BUNDLE = resolve("build/downloads/runproof-check.mjs");
let cached: Promise<Buffer> | undefined;

/**
 * GET /help/downloads/runproof-check.mjs — the command-line checker as one self-contained file for
 * Node 20+ (same output as POST /api/v1/check). Built once at build time, read once, then served
 * from memory; nothing is bundled on a request.
 */
export async function loader() {
  cached ??= readFile(BUNDLE).catch((e) => {
    cached = undefined;
    throw e;
  });
  let body: Buffer;
  try {
    body = await cached;
  } catch {
    return new Response("The checker bundle has not been built on this server: run `node scripts/build-cli.mjs` (the production build does it).", {
      status: 404,
      headers: { "content-type": "text/plain; charset=utf-8" },
    });
  }
  return new Response(new Uint8Array(body), {
    headers: {
      "content-type": "text/javascript; charset=utf-8",
      "content-disposition": 'attachment; filename="runproof-check.mjs"',
      "cache-control": "public, max-age=3600",
      "x-content-type-options": "nosniff",
    },
  });
}
