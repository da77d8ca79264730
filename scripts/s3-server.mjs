// Local S3 stand-in for development and tests (s3rver). Runs in the foreground;
// scripts/services.sh backgrounds it with a pid file and log under .data/run/.
//
// Env: S3_PORT (4569), S3_HOST (127.0.0.1), S3_DIR (.data/s3), S3_BUCKET (runproof).
// Clients: endpoint http://127.0.0.1:4569, forcePathStyle: true, region us-east-1,
// credentials S3RVER / S3RVER (s3rver checks signatures against these).
import { mkdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import S3rver from "s3rver";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const port = Number(process.env.S3_PORT || 4569);
const address = process.env.S3_HOST || "127.0.0.1";
const directory = path.resolve(process.env.S3_DIR || path.join(root, ".data", "s3"));
const bucket = process.env.S3_BUCKET || "runproof";

mkdirSync(directory, { recursive: true });

const server = new S3rver({
  port,
  address,
  directory,
  silent: true,
  // Path-style only (http://127.0.0.1:4569/runproof/key): virtual-host buckets would
  // need wildcard DNS for *.localhost, which the app's clients do not use.
  vhostBuckets: false,
  configureBuckets: [{ name: bucket }],
});

let closing = false;
async function shutdown(signal) {
  if (closing) return;
  closing = true;
  // Guard against a keep-alive client holding close() open forever.
  const timer = setTimeout(() => process.exit(0), 3000);
  timer.unref();
  try {
    await server.close();
  } catch (err) {
    if (err?.message !== "Not running") console.error(`s3-server: close failed on ${signal}:`, err);
  }
  process.exit(0);
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));

try {
  const info = await server.run();
  console.log(
    `s3-server: listening on http://${info.address}:${info.port}, bucket "${bucket}", dir ${directory}`,
  );
} catch (err) {
  console.error(`s3-server: could not start on ${address}:${port}:`, err?.message ?? err);
  process.exit(1);
}
