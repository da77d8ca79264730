import { and, asc, eq, lte, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { outbox } from "~db/schema";
import type { MailTransport } from "./transport.server";

export const MAX_ATTEMPTS = 12;

/** Exponential back-off: 10 s, 20 s, 40 s … capped at one hour. */
export function retryDelayMs(attempts: number) {
  return Math.min(10_000 * 2 ** Math.max(0, attempts - 1), 3_600_000);
}

/**
 * Sends the messages that are due. Each message is claimed with FOR UPDATE SKIP LOCKED inside
 * its own transaction, so several app instances never send the same one, and a crash before
 * the commit leaves it queued.
 */
export async function deliverDue(
  db: Database,
  transport: MailTransport,
  from: string,
  opts: { limit?: number; now?: Date } = {},
) {
  const limit = opts.limit ?? 20;
  let sent = 0;
  let failed = 0;
  for (let i = 0; i < limit; i++) {
    const outcome = await db.transaction(async (tx) => {
      const [msg] = await tx
        .select()
        .from(outbox)
        .where(and(eq(outbox.state, "queued"), lte(outbox.nextAttemptAt, opts.now ?? new Date())))
        .orderBy(asc(outbox.nextAttemptAt))
        .limit(1)
        .for("update", { skipLocked: true });
      if (!msg) return "empty" as const;
      try {
        await transport.send({
          from,
          to: msg.toAddress,
          subject: msg.subject,
          text: msg.textBody,
          html: msg.htmlBody,
          attachments: msg.attachments.map((a) => ({
            filename: a.filename,
            contentType: a.contentType,
            content: Buffer.from(a.contentBase64, "base64"),
          })),
        });
        await tx
          .update(outbox)
          .set({ state: "sent", sentAt: new Date(), attempts: msg.attempts + 1, lastError: null })
          .where(eq(outbox.id, msg.id));
        return "sent" as const;
      } catch (error) {
        const attempts = msg.attempts + 1;
        await tx
          .update(outbox)
          .set({
            attempts,
            lastError: error instanceof Error ? error.message : String(error),
            state: attempts >= MAX_ATTEMPTS ? "gave-up" : "queued",
            nextAttemptAt: sql`now() + ${`${retryDelayMs(attempts)} milliseconds`}::interval`,
          })
          .where(eq(outbox.id, msg.id));
        return "failed" as const;
      }
    });
    if (outcome === "empty") break;
    if (outcome === "sent") sent++;
    else failed++;
  }
  return { sent, failed };
}
