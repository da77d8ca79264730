import { randomBytes, randomUUID } from "node:crypto";
import compression from "compression";
import express, { type ErrorRequestHandler, type Request, type RequestHandler, type Response } from "express";
import helmet from "helmet";
import type { Logger } from "pino";
import { pinoHttp } from "pino-http";
import type { Registry } from "prom-client";
import { CLIENT_ADDRESS_HEADER } from "../app/lib/client-address";
import { DATABASE_RETRY_AFTER_SECONDS, DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from "../app/lib/database-unavailable";
import {
  SAFE_METHODS,
  acceptsRawBody,
  bodyLimitFor,
  isExemptFromOriginCheck,
  isFileDownload,
  isFormBody,
  originAllowed,
  pagePath,
  takesUploads,
} from "./request-rules";
import { renderGate } from "./render-gate";

export type HttpAppOptions = {
  /** The public address (APP_URL): its origin is ours, and https there turns on HSTS and Secure cookies. */
  appUrl: string;
  /** Express "trust proxy" value; unset, X-Forwarded-For is ignored. */
  trustProxy?: string;
  formBodyLimitBytes: number;
  uploadBodyLimitBytes: number;
  /** Opens /metrics to non-loopback callers that send it as a bearer token. */
  metricsToken?: string;
  /** Built browser files (build/client); absent in tests. */
  staticDir?: string;
  logger: Logger;
  readiness: () => Promise<{ ok: boolean; checks: Record<string, { ok: boolean; message?: string }> }>;
  metrics: { registry: Registry; observe(kind: string, method: string, status: number, seconds: number): void };
  /** The React Router request handler; gets the nonce in `res.locals.nonce`. */
  handler: RequestHandler;
  /** Page and data reads let through at once, and how many may wait (unset: no limit). */
  renderLimit?: { concurrency: number; queue: number };
};

/** How the public API and the pages answer a refused request: JSON for the API, text for pages. */
function refuse(req: Request, res: Response, status: number, code: string, message: string) {
  res.status(status);
  // The body was not read: the connection cannot carry another request, so say it closes.
  if (!SAFE_METHODS.has(req.method)) res.set("connection", "close");
  if (req.path.startsWith("/api/")) res.json({ error: { code, message, details: [] } });
  else res.type("text/plain; charset=utf-8").send(message);
}

/** Parses the TRUST_PROXY setting the way Express reads "trust proxy": a hop count, or names/subnets. */
function trustProxySetting(value: string | undefined): boolean | number | string | string[] {
  if (!value) return false;
  if (/^\d+$/.test(value)) return Number(value);
  if (value === "true") return true;
  return value.split(",").map((s) => s.trim()).filter(Boolean);
}

function kindOf(path: string): string {
  if (path.startsWith("/assets/")) return "asset";
  if (path.startsWith("/api/v1")) return "api";
  if (path.startsWith("/api/auth")) return "auth";
  if (path.endsWith(".data")) return "data";
  return "page";
}

const isLoopback = (address: string | undefined) =>
  !!address && (address === "::1" || address.startsWith("127.") || address.startsWith("::ffff:127."));

/**
 * The HTTP server in front of React Router: security headers with a per-request CSP nonce, request
 * logs with an id, client address, body limits and the same-origin check before any route reads a
 * byte, health, readiness and metrics.
 */
export function createHttpApp(options: HttpAppOptions) {
  const app = express();
  const appOrigin = new URL(options.appUrl).origin.toLowerCase();
  const https = appOrigin.startsWith("https:");
  app.disable("x-powered-by");
  app.set("trust proxy", trustProxySetting(options.trustProxy));

  // Latency of every answer, labelled by kind of request (never by raw path: unbounded labels).
  app.use((req, res, next) => {
    const start = process.hrtime.bigint();
    res.on("finish", () => {
      options.metrics.observe(kindOf(req.path), req.method, res.statusCode, Number(process.hrtime.bigint() - start) / 1e9);
    });
    next();
  });

  app.use(
    pinoHttp({
      logger: options.logger,
      genReqId(req, res) {
        const incoming = req.headers["x-request-id"];
        const id = typeof incoming === "string" && /^[\w.-]{1,64}$/.test(incoming) ? incoming : randomUUID();
        res.setHeader("x-request-id", id);
        return id;
      },
      // Path without query and no headers: cookies, tokens and links with tokens never reach the log.
      serializers: {
        req: (req: { id: string; method: string; url: string; raw?: Request }) => ({
          id: req.id,
          method: req.method,
          path: req.url.split("?")[0]!.replace(/\/invitations\/[^/]+/, "/invitations/…"),
          address: req.raw?.headers[CLIENT_ADDRESS_HEADER],
        }),
        res: (res: { statusCode: number }) => ({ status: res.statusCode }),
      },
      customLogLevel(_req, res, error) {
        // 503 is a handled "come back shortly" (database restarting, checker threads busy, storage
        // away), logged as a warning; what caused it is logged where it happened.
        if (res.statusCode === 503) return "warn";
        if (error || res.statusCode >= 500) return "error";
        return res.statusCode >= 400 ? "warn" : "info";
      },
      autoLogging: { ignore: (req) => req.url === "/healthz" || (req.url ?? "").startsWith("/assets/") },
    }),
  );

  // The one client address every later step uses; whatever a client sent in its place is dropped.
  app.use((req, res, next) => {
    req.headers[CLIENT_ADDRESS_HEADER] = req.ip ?? req.socket.remoteAddress ?? "unknown";
    res.locals.nonce = randomBytes(16).toString("base64");
    next();
  });

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          "default-src": ["'self'"],
          "script-src": ["'self'", (_req, res) => `'nonce-${(res as Response).locals.nonce}'`],
          "style-src": ["'self'", "'unsafe-inline'"],
          "img-src": ["'self'", "data:", "blob:"],
          "font-src": ["'self'", "data:"],
          "connect-src": ["'self'"],
          "object-src": ["'none'"],
          "base-uri": ["'self'"],
          "form-action": ["'self'"],
          "frame-ancestors": ["'none'"],
          ...(https ? { "upgrade-insecure-requests": [] } : {}),
        },
      },
      strictTransportSecurity: https ? { maxAge: 31_536_000, includeSubDomains: true } : false,
      referrerPolicy: { policy: "strict-origin-when-cross-origin" },
      xFrameOptions: { action: "deny" },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use(compression());

  app.get("/healthz", (_req, res) => {
    res.set("cache-control", "no-store").json({ ok: true });
  });
  app.get("/readyz", async (_req, res) => {
    const readiness = await options.readiness();
    res.set("cache-control", "no-store").status(readiness.ok ? 200 : 503).json(readiness);
  });
  app.get("/metrics", async (req, res) => {
    const auth = req.headers.authorization ?? "";
    const byToken = !!options.metricsToken && auth === `Bearer ${options.metricsToken}`;
    // The socket's address, not req.ip: a forwarded request came through a proxy and is not local.
    const local = isLoopback(req.socket.remoteAddress) && !req.headers["x-forwarded-for"];
    if (!byToken && !local) {
      res.status(404).type("text/plain").send("Not found");
      return;
    }
    res.set("content-type", options.metrics.registry.contentType).send(await options.metrics.registry.metrics());
  });

  if (options.staticDir) {
    app.use("/assets", express.static(`${options.staticDir}/assets`, { immutable: true, maxAge: "1y", index: false }));
    app.use(express.static(options.staticDir, { maxAge: "1h", index: false }));
  }

  // Writes only from our own pages: a missing or foreign Origin is refused before any action runs.
  app.use((req, res, next) => {
    if (SAFE_METHODS.has(req.method) || isExemptFromOriginCheck(pagePath(req.path))) return next();
    const own = `${req.protocol}://${req.get("host") ?? ""}`.toLowerCase();
    const allowed = [appOrigin, appOrigin.replace("://127.0.0.1", "://localhost"), own];
    if (!originAllowed(req.headers.origin, allowed)) {
      return refuse(req, res, 403, "foreign_origin", "This request did not come from a Runproof page (its Origin header is missing or another site's); nothing was changed.");
    }
    next();
  });

  // Bodies: a size limit from the route's kind, checked on the declared length before a byte is read.
  app.use((req, res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const limit = bodyLimitFor(req.path, { formBytes: options.formBodyLimitBytes, uploadBytes: options.uploadBodyLimitBytes });
    const declared = req.headers["content-length"];
    const chunked = req.headers["transfer-encoding"] !== undefined;
    if (declared === undefined && chunked && !acceptsRawBody(req.path)) {
      return refuse(req, res, 411, "length_required", "Send the request with a Content-Length header.");
    }
    const length = declared === undefined ? 0 : Number(declared);
    if (!Number.isSafeInteger(length) || length < 0) {
      return refuse(req, res, 400, "bad_length", "The Content-Length header is not a number of bytes.");
    }
    if (length > limit) {
      const size = takesUploads(req.path) ? `${Math.round(limit / 1024 / 1024)} MB` : `${Math.round(limit / 1024)} KB`;
      return refuse(req, res, 413, "body_too_large", `The request body is larger than the limit of ${size} for this address; nothing was stored.`);
    }
    if ((length > 0 || chunked) && !acceptsRawBody(req.path) && !isFormBody(req.headers["content-type"])) {
      return refuse(req, res, 415, "unsupported_media_type", "This address accepts HTML form submissions only (application/x-www-form-urlencoded or multipart/form-data).");
    }
    next();
  });

  // Page and data reads a few at a time, so probes, uploads and timers never wait behind a crowd of renders.
  if (options.renderLimit) {
    const gate = renderGate({
      ...options.renderLimit,
      refuse: (req, res) => {
        res.set("retry-after", "2");
        refuse(req, res, 503, "server_busy", "The server has more pages to prepare than it can queue; try again in a few seconds.");
      },
    });
    // Files are not held: a slow client reading a large PDF would keep a turn for the whole download.
    app.use((req, res, next) => (SAFE_METHODS.has(req.method) && !req.path.startsWith("/api/") && !isFileDownload(req.path) ? gate(req, res, next) : next()));
  }

  app.use(options.handler);

  const onError: ErrorRequestHandler = (error, req, res, _next) => {
    // Normally the router's middleware answers an unreachable database; this is the last net.
    if (isDatabaseUnavailable(error)) {
      req.log?.warn({ err: { message: (error as Error).message } }, "database unavailable");
      if (res.headersSent) return res.end();
      res.set("retry-after", String(DATABASE_RETRY_AFTER_SECONDS));
      return refuse(req, res, 503, "database_unavailable", DATABASE_UNAVAILABLE_MESSAGE);
    }
    req.log?.error({ err: error }, "request failed");
    if (res.headersSent) return res.end();
    refuse(req, res, 500, "internal", "Something went wrong on our side; the error was logged.");
  };
  app.use(onError);
  return app;
}
