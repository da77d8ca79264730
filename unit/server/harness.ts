import { once } from "node:events";
import type { AddressInfo } from "node:net";
import { createServer, type Server } from "node:http";
import { pino } from "pino";
import { Registry } from "prom-client";
import { CLIENT_ADDRESS_HEADER } from "~/lib/client-address";
import { createHttpApp, type HttpAppOptions } from "../../server/http-app";

export type Harness = { url: string; origin: string; reached: string[]; close(): Promise<void> };

/**
 * The production HTTP app with React Router replaced by a handler that records which requests got
 * through and echoes the nonce and client address it was given.
 */
export async function startHarness(overrides: Partial<HttpAppOptions> = {}): Promise<Harness> {
  const reached: string[] = [];
  let server: Server | undefined;
  const app = createHttpApp({
    appUrl: "http://app.runproof.test",
    formBodyLimitBytes: 64 * 1024,
    uploadBodyLimitBytes: 1024 * 1024,
    logger: pino({ level: "silent" }),
    readiness: async () => ({ ok: true, checks: { database: { ok: true } } }),
    metrics: { registry: new Registry(), observe: () => {} },
    handler: (req, res) => {
      reached.push(`${req.method} ${req.path}`);
      res.type("text/html").send(
        `<script nonce="${res.locals.nonce}"></script><p data-address="${req.headers[CLIENT_ADDRESS_HEADER]}">reached</p>`,
      );
    },
    ...overrides,
  });
  server = createServer(app).listen(0, "127.0.0.1");
  await once(server, "listening");
  const { port } = server.address() as AddressInfo;
  const url = `http://127.0.0.1:${port}`;
  return {
    url,
    origin: url,
    reached,
    close: () => new Promise<void>((resolve) => server!.close(() => resolve())),
  };
}
