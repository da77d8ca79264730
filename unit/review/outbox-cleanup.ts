import { and, eq, like } from "drizzle-orm";
import type { Database } from "~db/client";
import { outbox } from "~db/schema";

/**
 * Integration tests here queue real mail (invitations, decisions, reminders) in the shared test
 * database, where no worker sends it. Dropping what is still queued for this test's titles keeps
 * other tests (the outbox's own) from finding strangers' messages in the queue.
 */
export async function dropQueuedMail(db: Database, title: string) {
  await db.delete(outbox).where(and(eq(outbox.state, "queued"), like(outbox.subject, `%${title}%`)));
}
