import { and, eq } from "drizzle-orm";
import { data } from "react-router";
import { rounds } from "~db/schema";
import { StateConflict, type Db } from "./types";

/** The round of a submission by its number, or a 404 that reveals nothing. */
export async function roundOf(db: Db, submissionId: string, number: number) {
  const [round] = await db
    .select()
    .from(rounds)
    .where(and(eq(rounds.submissionId, submissionId), eq(rounds.number, number)));
  if (!round) throw data("Not found", { status: 404 });
  return round;
}

/** Authors may change a round only while it is a draft. */
export function assertDraft(round: { state: string; number: number }) {
  if (round.state !== "draft") {
    throw new StateConflict(`Round ${round.number} was sent to the editor and is frozen; changes go into the next round.`);
  }
}

export async function draftRoundById(db: Db, roundId: string) {
  const [round] = await db.select().from(rounds).where(eq(rounds.id, roundId));
  if (!round) throw data("Not found", { status: 404 });
  assertDraft(round);
  return round;
}
