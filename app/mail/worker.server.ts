import type { Database } from "~db/client";
import { deliverDue } from "./deliver.server";
import { smtpTransport } from "./transport.server";

type WorkerOpts = { smtpHost: string; smtpPort: number; from: string; pollMs: number };

/** Polls the outbox in the server process. Started once per process; stops with it. */
export function startOutboxWorker(db: Database, opts: WorkerOpts) {
  const transport = smtpTransport(opts.smtpHost, opts.smtpPort);
  let running = false;
  const tick = async () => {
    if (running) return;
    running = true;
    try {
      await deliverDue(db, transport, opts.from);
    } catch (error) {
      // The database may be restarting; the next tick tries again.
      console.warn("outbox: delivery pass failed:", error instanceof Error ? error.message : error);
    } finally {
      running = false;
    }
  };
  const timer = setInterval(tick, opts.pollMs);
  timer.unref();
  void tick();
  return () => clearInterval(timer);
}
