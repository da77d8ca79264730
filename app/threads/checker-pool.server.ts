/**
 * Checker work off the event loop: a small pool of worker threads (piscina) with V8 resource
 * limits, a bounded queue and a time budget per task, so one request or job can neither stall
 * nor crash the others. A thread that hits its memory limit or runs past its budget is ended
 * and replaced; the pool keeps serving. Used by POST /api/v1/check (web process) and by the
 * round check (worker process): the caller keeps every database and storage call, the thread
 * gets plain data (typed columns transferred, not copied). Figures in docs/reliability.md.
 */
import { existsSync } from "node:fs";
import { createRequire } from "node:module";
import { availableParallelism } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { Piscina } from "piscina";
import type { TypedColumns } from "~/checker/csv";
import { fromWire, type CheckerResult, type CheckerTask, type TaskReply } from "./checker-tasks";

/** V8 limits of each checker thread (its own heap, apart from the process's). */
export const CHECKER_THREAD_LIMITS = { maxOldGenerationSizeMb: 256, maxYoungGenerationSizeMb: 32, stackSizeMb: 4 } as const;

/**
 * Time a task may run, counted from the moment a thread takes it (waiting is counted apart):
 * an API check answers a person who waits, typically in well under a second; a file analysis
 * (a 200,000-row series takes about a second here) and a round's evaluation run in the worker,
 * whose job may take 15 minutes in all (app/jobs/queues.ts).
 */
export const CHECKER_BUDGET_MS: Record<CheckerTask["kind"], number> = { "api-check": 10_000, "analyse-file": 60_000, "round-check": 60_000 };

/** How long a task may wait for a free thread before it is refused as busy. */
export const CHECKER_MAX_WAIT_MS: Record<CheckerTask["kind"], number> = { "api-check": 5_000, "analyse-file": 600_000, "round-check": 600_000 };

/** Threads per process: one core is left to the event loop (1 on the 2-core machine, at most 2). */
export const CHECKER_THREADS = Math.max(1, Math.min(2, availableParallelism() - 1));

/** Tasks that may wait for a thread; one more is refused at once (the API answers 503). */
export const CHECKER_MAX_QUEUE = 8;

/** The pool is full: every thread busy and the queue at its limit, or the wait ran out. */
export class CheckerBusy extends Error {
  constructor(message: string) {
    super(message);
    this.name = "CheckerBusy";
  }
}

/** A task was stopped: it ran past its time budget, or needed more memory or stack than a thread has. */
export class CheckerOverBudget extends Error {
  constructor(
    readonly limit: "time" | "memory" | "stack",
    /** The limit in words: "10 s", "256 MB". */
    readonly allowance: string,
  ) {
    super(`the check was stopped: it needed more ${limit === "time" ? "time" : limit === "memory" ? "memory" : "stack"} than the ${allowance} one check may use`);
    this.name = "CheckerOverBudget";
  }
}

const BUNDLED_ENTRY = "checker-thread.mjs";

/**
 * Where the thread's code is: beside this module's source under tsx, vite's dev server and
 * vitest (run with tsx's loader in the thread), or the bundle the production build writes to
 * build/server/ (found from the server bundle's own address, then from the working directory).
 */
export function checkerThreadEntry(filename?: string): { filename: string; execArgv: string[] } {
  const here = fileURLToPath(import.meta.url);
  const source = /\.[cm]?tsx?$/;
  const file = filename ?? (source.test(here) ? join(dirname(here), "checker-thread.ts") : undefined);
  if (file) {
    if (!source.test(file)) return { filename: file, execArgv: [] };
    const tsx = pathToFileURL(createRequire(import.meta.url).resolve("tsx")).href;
    return { filename: file, execArgv: ["--import", tsx] };
  }
  const candidates = [join(dirname(here), BUNDLED_ENTRY), join(dirname(dirname(here)), BUNDLED_ENTRY), resolve("build/server", BUNDLED_ENTRY)];
  const found = candidates.find((c) => existsSync(c));
  if (!found) throw new Error(`The checker thread's code is missing (looked for ${candidates.join(", ")}); build the app again with \`npm run build\`.`);
  return { filename: found, execArgv: [] };
}

/** The buffers behind typed columns, each once: moved to the thread instead of copied. */
export function transferablesOf(columns: TypedColumns): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  for (const c of Object.values(columns)) if (c.buffer instanceof ArrayBuffer) buffers.add(c.buffer);
  return [...buffers];
}

export type CheckerPoolOptions = {
  /** The thread's entry (tests give one of their own); default: `checkerThreadEntry()`. */
  filename?: string;
  threads?: number;
  maxQueue?: number;
  limits?: { maxOldGenerationSizeMb: number; maxYoungGenerationSizeMb: number; stackSizeMb: number };
};

export type RunOptions = { budgetMs?: number; maxWaitMs?: number; transferList?: ArrayBuffer[] };

/**
 * A piscina pool behind our own bounded queue. piscina's `maxQueue` does not count tasks given an
 * AbortSignal (piscina 5.3.2 keeps them in a side queue; see runTask in dist/index.js), and every
 * task here has one (its budget), so the queue is kept here: at most `threads` tasks are handed
 * to piscina, at most `maxQueue` wait. That also starts a task's time budget when it runs.
 */
export class CheckerPool {
  readonly piscina: Piscina;
  readonly threads: number;
  readonly maxQueue: number;
  readonly limits: NonNullable<CheckerPoolOptions["limits"]>;
  private running = 0;
  private readonly waiting: { start: () => void; timer: ReturnType<typeof setTimeout> }[] = [];

  constructor(options: CheckerPoolOptions = {}) {
    const entry = checkerThreadEntry(options.filename);
    this.threads = options.threads ?? CHECKER_THREADS;
    this.maxQueue = options.maxQueue ?? CHECKER_MAX_QUEUE;
    this.limits = options.limits ?? CHECKER_THREAD_LIMITS;
    this.piscina = new Piscina({
      filename: entry.filename,
      execArgv: entry.execArgv,
      name: "default",
      minThreads: 1,
      maxThreads: this.threads,
      idleTimeout: 60_000,
      resourceLimits: { ...this.limits },
    });
    // A thread that fails while idle must not take the process down (an 'error' event unheard throws).
    this.piscina.on("error", (error: unknown) => console.warn("checker threads:", error instanceof Error ? error.message : error));
  }

  /** Tasks running and waiting (for the metrics and the tests). */
  get load() {
    return { running: this.running, waiting: this.waiting.length };
  }

  async run<K extends CheckerTask["kind"]>(task: Extract<CheckerTask, { kind: K }>, options: RunOptions = {}): Promise<CheckerResult<K>> {
    const budgetMs = options.budgetMs ?? CHECKER_BUDGET_MS[task.kind];
    await this.slot(options.maxWaitMs ?? CHECKER_MAX_WAIT_MS[task.kind]);
    let reply: TaskReply;
    try {
      reply = await this.piscina.run(task, { signal: AbortSignal.timeout(budgetMs), transferList: options.transferList ?? [] });
    } catch (error) {
      throw this.explain(error, budgetMs);
    } finally {
      this.release();
    }
    if (reply.ok) return reply.value as CheckerResult<K>;
    if (reply.error.name === "RangeError" && /call stack/i.test(reply.error.message)) throw new CheckerOverBudget("stack", `${this.limits.stackSizeMb} MB stack`);
    throw fromWire(reply.error);
  }

  async destroy() {
    for (const w of this.waiting.splice(0)) clearTimeout(w.timer);
    await this.piscina.destroy();
  }

  private explain(error: unknown, budgetMs: number): unknown {
    const e = error as { name?: string; code?: string; cause?: { name?: string } };
    if (e?.name === "AbortError") return new CheckerOverBudget("time", `${budgetMs / 1000} s`);
    if (e?.code === "ERR_WORKER_OUT_OF_MEMORY") return new CheckerOverBudget("memory", `${this.limits.maxOldGenerationSizeMb} MB`);
    return error;
  }

  private slot(maxWaitMs: number): Promise<void> {
    if (this.running < this.threads) {
      this.running++;
      return Promise.resolve();
    }
    if (this.waiting.length >= this.maxQueue) {
      return Promise.reject(new CheckerBusy(`every checker thread is busy and ${this.maxQueue} checks are waiting`));
    }
    return new Promise((resolve, reject) => {
      const entry = {
        start: () => {
          clearTimeout(entry.timer);
          this.running++;
          resolve();
        },
        timer: setTimeout(() => {
          this.waiting.splice(this.waiting.indexOf(entry), 1);
          reject(new CheckerBusy(`no checker thread was free within ${maxWaitMs / 1000} s`));
        }, maxWaitMs),
      };
      this.waiting.push(entry);
    });
  }

  private release() {
    this.running--;
    this.waiting.shift()?.start();
  }
}

// One pool per process, kept on globalThis: the dev server reloads modules, and the server
// entry and the app may each hold a copy of this module.
const g = globalThis as { __runproofCheckerPool?: CheckerPool };

/** The process's checker pool, made on first use. */
export function checkerPool(): CheckerPool {
  g.__runproofCheckerPool ??= new CheckerPool();
  return g.__runproofCheckerPool;
}

/** Runs one task in the process's pool: see CheckerPool.run. */
export function runChecker<K extends CheckerTask["kind"]>(task: Extract<CheckerTask, { kind: K }>, options?: RunOptions) {
  return checkerPool().run(task, options);
}

/** Ends the threads (graceful shutdown of the server and the worker). */
export async function closeCheckerPool() {
  const pool = g.__runproofCheckerPool;
  g.__runproofCheckerPool = undefined;
  await pool?.destroy();
}
