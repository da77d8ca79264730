import type { RequestHandler } from "express";
import pLimit from "p-limit";

export type RenderGateOptions = {
  /** Page and data reads (GET, HEAD) rendered at once; the rest wait their turn in arrival order. */
  concurrency: number;
  /** Reads allowed to wait; one more is answered 503 at once with Retry-After. */
  queue: number;
  /**
   * The longest a read keeps its turn: past it the next read goes in even if this answer is still
   * being sent (a client reading slowly must not hold the door). Default 10 s.
   */
  maxHoldMs?: number;
  /** Answers a read refused because the queue is full. */
  refuse: RequestHandler;
};

/**
 * Admission for page and data reads. On a saturated server every read in flight has work ready at
 * once, and the event loop runs them back to back: health probes, uploads streaming in and every
 * timer then wait behind all of them. Holding reads at the door to a few at a time keeps that wait
 * short (each read costs the same CPU either way; the queueing moves from the loop to this line).
 * Writes, uploads and the API are not held here: an upload occupies its request for seconds.
 */
export function renderGate(options: RenderGateOptions): RequestHandler & { inFlight(): number; waiting(): number } {
  const limit = pLimit(options.concurrency);
  const gate: RequestHandler = (req, res, next) => {
    if (limit.pendingCount >= options.queue) return options.refuse(req, res, next);
    void limit(
      () =>
        new Promise<void>((done) => {
          // The turn ends when the answer is sent, the client goes away or the hold runs out, whichever comes first.
          const timer = setTimeout(done, options.maxHoldMs ?? 10_000);
          timer.unref();
          const end = () => {
            clearTimeout(timer);
            done();
          };
          res.once("finish", end);
          res.once("close", end);
          if (res.destroyed) return end();
          next();
        }),
    );
  };
  return Object.assign(gate, { inFlight: () => limit.activeCount, waiting: () => limit.pendingCount });
}
