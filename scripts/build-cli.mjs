/**
 * Bundles the command-line checker (scripts/check.ts with the checker and its readers of CSV,
 * column, HDF5 and NetCDF files) into one self-contained ES module for Node 20+, which the help
 * pages offer for download: `node runproof-check.mjs run.json …` works without this repository.
 * Run by the production build (vite.config.ts) and on its own: `node scripts/build-cli.mjs [out]`.
 */
import { build } from "esbuild";
import { fileURLToPath } from "node:url";

export const CLI_BUNDLE = "build/downloads/runproof-check.mjs";

// Bundled CommonJS code may call require(); give the module one.
const REQUIRE_SHIM = 'import { createRequire as __runproofRequire } from "node:module"; const require = __runproofRequire(import.meta.url);';

/** One self-contained ES module for Node 20+ from one entry, with the app's path aliases. */
async function bundleForNode(entry, outfile, options = {}) {
  await build({
    absWorkingDir: fileURLToPath(new URL("..", import.meta.url)),
    entryPoints: [entry],
    outfile,
    bundle: true,
    platform: "node",
    target: "node20",
    format: "esm",
    logLevel: "warning",
    alias: { "~": "./app", "~db": "./database" },
    banner: { js: REQUIRE_SHIM },
    ...options,
  });
  return outfile;
}

export function buildCli(outfile = CLI_BUNDLE) {
  return bundleForNode("scripts/check.ts", outfile, {
    minify: true,
    legalComments: "eof",
    banner: {
      js: [
        "#!/usr/bin/env node",
        "// Runproof checker, command-line edition (runproof.run/1, runproof.claim/1). Usage: node runproof-check.mjs --help",
        REQUIRE_SHIM,
      ].join("\n"),
    },
  });
}

export const CHECKER_THREAD_BUNDLE = "build/server/checker-thread.mjs";

/**
 * Bundles the checker threads' entry (app/threads/checker-thread.ts: the checker and the series
 * analysis, no I/O) for the production server and worker, which load it into worker threads
 * (app/threads/checker-pool.server.ts). It cannot live inside the server bundle: a worker
 * thread starts from a file of its own. Not minified, so a stack trace names real functions.
 */
export function buildCheckerThread(outfile = CHECKER_THREAD_BUNDLE) {
  return bundleForNode("app/threads/checker-thread.ts", outfile);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const out = await buildCli(process.argv[2]);
  console.log(`checker CLI bundled: ${out}`);
}
