// The production server: node scripts/serve.mjs (after `react-router build`).
// Listens on HOST:PORT; on SIGTERM or SIGINT it stops accepting, lets running requests finish
// (up to SHUTDOWN_GRACE_MS), then stops the job runner and closes the database pool.
import { createServer } from "node:http";
import { resolve } from "node:path";
import { pathToFileURL } from "node:url";

globalThis.__runproofServerOwnsShutdown = true;
const { app, logger, shutdown } = await import(pathToFileURL(resolve("build/server/index.js")).href);

const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? "127.0.0.1";
const grace = Number(process.env.SHUTDOWN_GRACE_MS ?? 10_000);

const server = createServer(app);
// Slow clients cannot hold a connection open forever: Node's own limits (headers within 60 s, a
// whole request within 300 s, idle keep-alive 5 s) stay in force; see docs/reliability.md.

server.listen(port, host, () => logger.info({ url: `http://${host}:${port}` }, "listening"));
server.on("error", (error) => {
  logger.error({ err: error }, "cannot listen");
  process.exit(1);
});

let stopping = false;
function stop(signal) {
  if (stopping) return;
  stopping = true;
  logger.info({ signal }, "stopping: no new connections, finishing running requests");
  const force = setTimeout(() => server.closeAllConnections(), grace);
  force.unref();
  server.close(async () => {
    clearTimeout(force);
    try {
      await shutdown();
    } catch (error) {
      logger.warn({ err: error }, "shutdown was not clean");
    }
    logger.info("stopped");
    process.exit(0);
  });
  server.closeIdleConnections();
}
process.on("SIGTERM", () => stop("SIGTERM"));
process.on("SIGINT", () => stop("SIGINT"));
