import { eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { auditLog, rounds, venueMembers } from "~db/schema";
import { releaseDecision } from "~/review/decisions.server";
import { StateConflict } from "~/workspace/types";
import { makeSentRound } from "../../e2e/support/make-sent-round";
import { testDatabase } from "../support/test-db";
import { dropQueuedMail } from "./outbox-cleanup";

const { db, sql } = testDatabase();
const title = `Concurrency ${Date.now()}`;
afterAll(async () => {
  await dropQueuedMail(db, title);
  await sql.end({ timeout: 5 });
});

const letter = (text: string) => ({ type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text }] }] });

describe("releasing a decision", () => {
  it("lets exactly one of two simultaneous releases through; the other gets a clear conflict", async () => {
    const fx = await makeSentRound(db, title);
    const [round] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
    const [editor] = await db.select({ userId: venueMembers.userId }).from(venueMembers).where(eq(venueMembers.venueId, fx.venueId));
    const attempt = (decision: "accept" | "reject") =>
      releaseDecision(db, { roundId: fx.roundId, decision, letter: letter(`Decision ${decision}`), expectedVersion: round!.version, editorId: editor!.userId });
    const results = await Promise.allSettled([attempt("accept"), attempt("reject")]);
    const ok = results.filter((r) => r.status === "fulfilled");
    const failed = results.filter((r): r is PromiseRejectedResult => r.status === "rejected");
    expect(ok).toHaveLength(1);
    expect(failed).toHaveLength(1);
    expect(failed[0]!.reason).toBeInstanceOf(StateConflict);
    expect((failed[0]!.reason as StateConflict).status).toBe(409);
    expect(String(failed[0]!.reason.message)).toMatch(/Another editor/);
    const [after] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
    expect(after!.state).toBe("decided");
    expect(after!.version).toBe(round!.version + 1);
    const released = await db.select().from(auditLog).where(eq(auditLog.submissionId, fx.submissionId));
    expect(released.filter((a) => a.action === "decision.released")).toHaveLength(1);
  });
});
