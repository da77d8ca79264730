import type { Database } from "~db/client";
import { outbox, type OutboxAttachment } from "~db/schema";
import type { Composed } from "./compose";

/** Anything that can insert: the pool or an open transaction (so mail commits with its cause). */
type Writer = Pick<Database, "insert">;

export async function enqueueMail(
  writer: Writer,
  to: string,
  message: Composed,
  opts: { attachments?: OutboxAttachment[]; dedupeKey?: string } = {},
) {
  const [row] = await writer
    .insert(outbox)
    .values({
      toAddress: to,
      subject: message.subject,
      textBody: message.text,
      htmlBody: message.html,
      attachments: opts.attachments ?? [],
      dedupeKey: opts.dedupeKey,
    })
    .onConflictDoNothing({ target: outbox.dedupeKey })
    .returning({ id: outbox.id });
  return row?.id ?? null;
}
