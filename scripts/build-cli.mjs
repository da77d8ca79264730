/**
 * Bundles the command-line checker (scripts/check.ts with the checker and its readers of CSV,
 * column, HDF5 and NetCDF files) into one self-contained ES module for Node 20+, which the help
 * pages offer for download: `node runproof-check.mjs run.json …` works without this repository.
 * Run by the production build (vite.config.ts) and on its own: `node scripts/build-cli.mjs [out]`.
 */
import { build } from "esbuild";
import { fileURLToPath } from "node:url";

export const CLI_BUNDLE = "build/downloads/runproof-check.mjs";

export async function buildCli(outfile = CLI_BUNDLE) {
  const root = fileURLToPath(new URL("..", import.meta.url));
  await build({
    absWorkingDir: root,
    entryPoints: ["scripts/check.ts"],
    outfile,
    bundle: true,
    platform: "node",
    target: "node20",
    format: "esm",
    minify: true,
    legalComments: "eof",
    logLevel: "warning",
    alias: { "~": "./app", "~db": "./database" },
    // Bundled CommonJS code may call require(); give the module one.
    banner: {
      js: [
        "#!/usr/bin/env node",
        "// Runproof checker, command-line edition (runproof.run/1, runproof.claim/1). Usage: node runproof-check.mjs --help",
        'import { createRequire as __runproofRequire } from "node:module"; const require = __runproofRequire(import.meta.url);',
      ].join("\n"),
    },
  });
  return outfile;
}

export const CHECKER_THREAD_BUNDLE = "build/server/checker-thread.mjs";

/**
 * Bundles the checker threads' entry (app/threads/checker-thread.ts: the checker and the series
 * analysis, no I/O) for the production server and worker, which load it into worker threads
 * (app/threads/checker-pool.server.ts). It cannot live inside the server bundle: a worker
 * thread starts from a file of its own. Not minified, so a stack trace names real functions.
 */
export async function buildCheckerThread(outfile = CHECKER_THREAD_BUNDLE) {
  const root = fileURLToPath(new URL("..", import.meta.url));
  await build({
    absWorkingDir: root,
    entryPoints: ["app/threads/checker-thread.ts"],
    outfile,
    bundle: true,
    platform: "node",
    target: "node20",
    format: "esm",
    logLevel: "warning",
    alias: { "~": "./app", "~db": "./database" },
    banner: { js: 'import { createRequire as __runproofRequire } from "node:module"; const require = __runproofRequire(import.meta.url);' },
  });
  return outfile;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const out = await buildCli(process.argv[2]);
  console.log(`checker CLI bundled: ${out}`);
}
