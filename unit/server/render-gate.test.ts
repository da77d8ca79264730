import { EventEmitter } from "node:events";
import type { RequestHandler } from "express";
import { afterEach, describe, expect, it } from "vitest";
import { renderGate } from "../../server/render-gate";
import { startHarness, type Harness } from "./harness";

/** A handler that holds each read until the test lets it go, counting how many it holds at once. */
function heldHandler() {
  const held: (() => void)[] = [];
  let now = 0;
  let most = 0;
  const seen: string[] = [];
  const handler: RequestHandler = (req, res) => {
    seen.push(req.path);
    now++;
    most = Math.max(most, now);
    const finish = () => {
      now--;
      res.type("text/plain").send(`done ${req.path}`);
    };
    res.once("close", () => {
      const i = held.indexOf(finish);
      if (i >= 0) {
        held.splice(i, 1);
        now--;
      }
    });
    held.push(finish);
  };
  return { handler, held, seen, most: () => most, releaseAll: () => held.splice(0).forEach((f) => f()) };
}

const until = async (cond: () => boolean, what: string) => {
  for (let i = 0; i < 200 && !cond(); i++) await new Promise((r) => setTimeout(r, 10));
  if (!cond()) throw new Error(`timed out waiting for ${what}`);
};

describe("page and data reads are let through a few at a time", () => {
  let h: Harness | undefined;
  afterEach(() => h?.close());

  it("holds reads beyond the limit in arrival order, refuses past the queue with 503, and never holds writes, the API or probes", async () => {
    const t = heldHandler();
    h = await startHarness({ handler: t.handler, renderLimit: { concurrency: 2, queue: 3 } });
    const url = h.url;
    const reads = [1, 2, 3, 4, 5].map((n) => fetch(`${url}/page-${n}`));
    await until(() => t.held.length === 2, "two reads in flight");
    // Two in flight and three waiting: the sixth is refused at once, and says when to come back.
    const sixth = await fetch(`${url}/page-6`);
    expect(sixth.status).toBe(503);
    expect(sixth.headers.get("retry-after")).toBe("2");
    expect(await sixth.text()).toMatch(/try again in a few seconds/);
    // Probes and the API are not held behind the reads.
    expect((await fetch(`${url}/healthz`)).status).toBe(200);
    const api = fetch(`${url}/api/v1/anything`);
    await until(() => t.held.length === 3, "the API call reaching the handler");
    expect(t.held.length).toBe(3);
    // Releasing lets the waiting reads through, never more than two reads at a time.
    while (t.held.length) {
      t.releaseAll();
      await new Promise((r) => setTimeout(r, 30));
    }
    const answers = await Promise.all(reads.map(async (r) => (await r).text()));
    expect(answers).toEqual([1, 2, 3, 4, 5].map((n) => `done /page-${n}`));
    expect((await api).status).toBe(200);
    // The handler held the two reads and the API call at most (the API is outside the limit).
    expect(t.most()).toBeLessThanOrEqual(3);
  });

  it("frees a turn when a client goes away before its answer", async () => {
    const t = heldHandler();
    h = await startHarness({ handler: t.handler, renderLimit: { concurrency: 1, queue: 5 } });
    const gone = new AbortController();
    const first = fetch(`${h.url}/first`, { signal: gone.signal }).catch(() => null);
    await until(() => t.held.length === 1, "the first read in flight");
    const second = fetch(`${h.url}/second`);
    await new Promise((r) => setTimeout(r, 50));
    expect(t.held.length).toBe(1);
    gone.abort();
    await first;
    await until(() => t.seen.includes("/second"), "the second read let through");
    expect(t.most()).toBe(1);
    t.releaseAll();
    expect(await (await second).text()).toBe("done /second");
  });

  it("lets the next read in when a turn is held too long, and never holds file downloads", async () => {
    const t = heldHandler();
    h = await startHarness({ handler: t.handler, renderLimit: { concurrency: 1, queue: 5 } });
    const url = h.url;
    const page = fetch(`${url}/slow-page`);
    await until(() => t.seen.includes("/slow-page"), "the first read in flight");
    // A PDF goes past the gate although its one turn is taken.
    const pdf = fetch(`${url}/venues/v/submissions/s/rounds/1/packet.pdf`);
    await until(() => t.seen.some((p) => p.endsWith("packet.pdf")), "the download let through");
    t.releaseAll();
    expect((await page).status).toBe(200);
    expect((await pdf).status).toBe(200);

    // The gate on its own: a turn held past maxHoldMs lets the next read in.
    const gate = renderGate({ concurrency: 1, queue: 5, maxHoldMs: 100, refuse: () => {} });
    const reached: string[] = [];
    const fakeRes = () => Object.assign(new EventEmitter(), { destroyed: false }) as never;
    gate({} as never, fakeRes(), () => reached.push("first"));
    gate({} as never, fakeRes(), () => reached.push("second"));
    await new Promise((r) => setTimeout(r, 30));
    expect(reached).toEqual(["first"]);
    await until(() => reached.length === 2, "the second read after the hold ran out");
    expect(gate.inFlight()).toBe(1);
  });
});
