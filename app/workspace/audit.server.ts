import { auditLog } from "~db/schema";
import type { Db } from "./types";

export type AuditAction =
  | "submission.created"
  | "round.sent"
  | "round.opened"
  | "reviewer.invited"
  | "invitation.resent"
  | "invitation.withdrawn"
  | "invitation.accepted"
  | "invitation.declined"
  | "review.submitted"
  | "decision.made"
  | "decision.released";

/** Written in the same transaction as the change it records. */
export async function audit(db: Db, submissionId: string, actorId: string | null, action: AuditAction, detail: Record<string, unknown> = {}) {
  await db.insert(auditLog).values({ submissionId, actorId, action, detail });
}
