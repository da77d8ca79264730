/** The check job stores each claim's stated values beside what they were compared with; pages only read it. */
import { eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { claims } from "~db/schema";
import { makeSentRound } from "../../e2e/support/make-sent-round";
import { testDatabase } from "../support/test-db";

const { db, sql } = testDatabase();
afterAll(() => sql.end({ timeout: 5 }));

describe("stored stated results", () => {
  it("holds, for the example claim, every stated row per run with its interval, recomputed value and outcome", async () => {
    const fx = await makeSentRound(db, `Stated results ${Date.now()}`);
    const [claim] = await db.select().from(claims).where(eq(claims.roundId, fx.roundId));
    const rows = claim!.statedResults!;
    // examples/claims/layer-zonal-flow.json: E "1 × 10^-4" for both runs, then four rows for one run each.
    expect(rows.filter((r) => r.row === 0).map((r) => r.run).sort()).toEqual(["ref-A", "strat-B"]);
    const e = rows.find((r) => r.row === 0 && r.run === "ref-A")!;
    // "1 × 10^-4": half a unit in the last stated digit, [0.5e-4, 1.5e-4) (checker contract, family B).
    expect(e.interval.lo).toBeCloseTo(0.5e-4, 12);
    expect(e.interval.hi).toBeCloseTo(1.5e-4, 12);
    expect(e.interval.hiInclusive).toBe(false);
    expect(e.against?.source).toBe("record");
    expect(e.outcome).toBe("agrees");
    // "≥ 1.5": an open upper end, stored as null (JSON has no infinity).
    const len = rows.find((r) => r.quantity === "runLength.magnetic")!;
    expect(len.interval.hi).toBeNull();
    expect(["agrees", "differs"]).toContain(len.outcome);
  });
});
