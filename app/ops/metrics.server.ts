import { sql } from "drizzle-orm";
import { collectDefaultMetrics, Gauge, Histogram, Registry } from "prom-client";
import { sqlStatementsSent, type Database } from "~db/client";

export type ServerMetrics = {
  registry: Registry;
  /** Records one answered request; `kind` keeps the label set small (never the raw path). */
  observe(kind: string, method: string, status: number, seconds: number): void;
};

/** Request latency, the process's own figures, and the backlogs that show work piling up. */
export function createServerMetrics(db: Database | null): ServerMetrics {
  const registry = new Registry();
  collectDefaultMetrics({ register: registry, prefix: "runproof_" });
  const latency = new Histogram({
    name: "runproof_http_request_duration_seconds",
    help: "Time to answer an HTTP request",
    labelNames: ["kind", "method", "status"] as const,
    buckets: [0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10],
    registers: [registry],
  });
  const count = async (query: ReturnType<typeof sql>) => {
    if (!db) return 0;
    try {
      const rows = (await db.execute(query)) as unknown as { n: number | string }[];
      return Number(rows[0]?.n ?? 0);
    } catch {
      return Number.NaN; // table absent (jobs never started) or database down: shown as NaN, not a lie
    }
  };
  new Gauge({
    name: "runproof_outbox_backlog",
    help: "Messages queued in the outbox and not yet delivered",
    registers: [registry],
    async collect() {
      this.set(await count(sql`select count(*)::int as n from outbox where state = 'queued'`));
    },
  });
  new Gauge({
    name: "runproof_job_queue_depth",
    help: "Jobs waiting to run (created or waiting for a retry)",
    registers: [registry],
    async collect() {
      this.set(await count(sql`select count(*)::int as n from pgboss.job where state in ('created', 'retry')`));
    },
  });
  new Gauge({
    name: "runproof_sql_statements_sent",
    help: "Statements this process has sent to PostgreSQL since it started (a running total)",
    registers: [registry],
    collect() {
      this.set(sqlStatementsSent());
    },
  });
  return {
    registry,
    observe(kind, method, status, seconds) {
      latency.labels(kind, method, String(status)).observe(seconds);
    },
  };
}
