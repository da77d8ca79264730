import { afterAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { Registry } from "prom-client";
import { sqlStatementsSent } from "~db/client";
import { createServerMetrics } from "~/ops/metrics.server";
import { testDatabase } from "../support/test-db";

const { db, sql: client } = testDatabase();
afterAll(() => client.end());

describe("statements sent to PostgreSQL", () => {
  it("counts one per statement, whatever the rows", async () => {
    // A new connection first asks for the array types (one statement of the driver's own).
    await db.execute(sql`select 1`);
    const before = sqlStatementsSent();
    await db.execute(sql`select 1`);
    await db.execute(sql`select generate_series(1, 500)`);
    expect(sqlStatementsSent() - before).toBe(2);
  });

  it("is exported by /metrics as a running total", async () => {
    const metrics = createServerMetrics(null);
    await db.execute(sql`select 1`);
    const text = await metrics.registry.metrics();
    const value = Number(/^runproof_sql_statements_sent (\d+)$/m.exec(text)?.[1]);
    expect(value).toBe(sqlStatementsSent());
    expect(value).toBeGreaterThan(0);
    expect(metrics.registry).toBeInstanceOf(Registry);
  });
});
