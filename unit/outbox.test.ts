import { eq, like } from "drizzle-orm";
import { MailDev } from "maildev";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { outbox } from "~db/schema";
import { compose } from "~/mail/compose";
import { deliverDue } from "~/mail/deliver.server";
import { enqueueMail } from "~/mail/outbox.server";
import { smtpTransport } from "~/mail/transport.server";
import { testDatabase } from "./support/test-db";

// A catcher of this test's own, on ports nobody else uses, so it can be stopped and started.
const SMTP = 1125;
const WEB = 1180;
const { db, sql } = testDatabase();
const transport = smtpTransport("127.0.0.1", SMTP);
const tag = `outbox-test-${Date.now()}`;
const mailDir = mkdtempSync(join(tmpdir(), "runproof-maildev-"));

async function caughtSubjects() {
  const res = await fetch(`http://127.0.0.1:${WEB}/api/email`);
  const mails = (await res.json()) as { subject: string }[];
  return mails.map((m) => m.subject).filter((s) => s.includes(tag));
}

beforeAll(async () => {
  // The test database's queue may hold mail left by other suites; this test counts deliveries,
  // so it starts from an empty queue (testDatabase() only ever opens a *_test database).
  await db.delete(outbox).where(eq(outbox.state, "queued"));
  await db.delete(outbox).where(like(outbox.subject, "%outbox-test-%"));
});
afterAll(async () => {
  await db.delete(outbox).where(like(outbox.subject, `%${tag}%`));
  await sql.end({ timeout: 5 });
  rmSync(mailDir, { recursive: true, force: true });
});

describe("outbox delivery", () => {
  it("keeps a message queued while the mail server is down and delivers it exactly once when it is back", async () => {
    const id = await enqueueMail(db, "co-author@demo.runproof.example", compose({
      subject: `Digest ${tag}`,
      greeting: "Hello,",
      paragraphs: ["Two new flags."],
    }));
    expect(id).toBeTruthy();

    // Catcher stopped: the attempt fails, the message stays queued with the error recorded.
    const down = await deliverDue(db, transport, "Runproof <no-reply@runproof.example>", { limit: 5 });
    expect(down.sent).toBe(0);
    const [afterFailure] = await db.select().from(outbox).where(eq(outbox.id, id!));
    expect(afterFailure?.state).toBe("queued");
    expect(afterFailure?.attempts).toBe(1);
    expect(afterFailure?.lastError).toBeTruthy();

    // Not due yet: the back-off holds it.
    expect((await deliverDue(db, transport, "x@runproof.example")).sent).toBe(0);

    const catcher = new MailDev({ smtp: SMTP, web: WEB, ip: "127.0.0.1", webIp: "127.0.0.1", silent: true, mailDirectory: mailDir });
    await catcher.start();
    try {
      const later = new Date(Date.now() + 60 * 60 * 1000);
      // Two workers at once (two app instances): SKIP LOCKED lets only one of them take it.
      const [a, b] = await Promise.all([
        deliverDue(db, transport, "Runproof <no-reply@runproof.example>", { now: later }),
        deliverDue(db, transport, "Runproof <no-reply@runproof.example>", { now: later }),
      ]);
      expect(a.sent + b.sent).toBe(1);
      const again = await deliverDue(db, transport, "Runproof <no-reply@runproof.example>", { now: later });
      expect(again.sent).toBe(0);

      const [row] = await db.select().from(outbox).where(eq(outbox.id, id!));
      expect(row?.state).toBe("sent");
      expect(row?.attempts).toBe(2);
      expect(await caughtSubjects()).toEqual([`Digest ${tag}`]);
    } finally {
      await catcher.stop();
    }
  });

  it("ignores a second message with the same de-duplication key", async () => {
    const msg = compose({ subject: `Reminder ${tag}`, greeting: "Hello,", paragraphs: ["Due soon."] });
    const first = await enqueueMail(db, "r@demo.runproof.example", msg, { dedupeKey: `${tag}-reminder` });
    const second = await enqueueMail(db, "r@demo.runproof.example", msg, { dedupeKey: `${tag}-reminder` });
    expect(first).toBeTruthy();
    expect(second).toBeNull();
  });
});
