import { createRequestHandler } from "@react-router/express";
import { pino } from "pino";
import { RouterContextProvider } from "react-router";
import * as build from "virtual:react-router/server-build";
import { env } from "~/config/env.server";
import { closeDatabaseAndJobs, db } from "~/db.server";
import { nonceContext } from "~/lib/nonce";
import { createServerMetrics } from "~/ops/metrics.server";
import { readinessProbe } from "~/ops/readiness.server";
import { s3SettingsFromEnv } from "~/storage/s3";
import { closeCheckerPool } from "~/threads/checker-pool.server";
import { createHttpApp } from "./http-app";

/**
 * The production server's application (bundled by `react-router build` as build/server/index.js;
 * scripts/serve.mjs listens with it). JSON logs on stdout, one line per request.
 */
export const logger = pino({ level: process.env.LOG_LEVEL ?? "info", base: { service: "runproof" } });

export const app = createHttpApp({
  appUrl: env.APP_URL,
  trustProxy: env.TRUST_PROXY,
  formBodyLimitBytes: env.FORM_BODY_LIMIT_KB * 1024,
  uploadBodyLimitBytes: env.UPLOAD_LIMIT_MB * 1024 * 1024,
  metricsToken: env.METRICS_TOKEN,
  staticDir: "build/client",
  logger,
  readiness: readinessProbe({ db, s3: s3SettingsFromEnv(env), smtp: { host: env.SMTP_HOST, port: env.SMTP_PORT } }),
  metrics: createServerMetrics(db),
  renderLimit: { concurrency: env.RENDER_CONCURRENCY, queue: env.RENDER_QUEUE },
  handler: createRequestHandler({
    build,
    mode: process.env.NODE_ENV,
    getLoadContext(_req, res) {
      const context = new RouterContextProvider();
      context.set(nonceContext, String(res.locals.nonce ?? ""));
      return context;
    },
  }),
});

/** Stops the job runner, closes the database pool and ends the checker threads (after the server has drained its requests). */
export async function shutdown() {
  await Promise.all([closeDatabaseAndJobs(), closeCheckerPool()]);
}
