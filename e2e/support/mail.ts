import { expect } from "@playwright/test";

const CATCHER = process.env.MAIL_CATCHER_URL ?? "http://127.0.0.1:1080";

export type CaughtMail = {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string }[];
  attachments?: { fileName?: string; generatedFileName?: string; contentType: string }[];
};

/** Waits for a message to `to` whose subject contains `subject`, read through maildev's HTTP API. */
export async function waitForMail(to: string, subject: string, timeoutMs = 20_000): Promise<CaughtMail> {
  let found: CaughtMail | undefined;
  await expect
    .poll(
      async () => {
        const res = await fetch(`${CATCHER}/api/email?to.address=${encodeURIComponent(to)}`);
        const mails = (await res.json()) as CaughtMail[];
        found = mails.reverse().find((m) => m.subject.includes(subject));
        return Boolean(found);
      },
      { timeout: timeoutMs, message: `no mail to ${to} with subject containing "${subject}"` },
    )
    .toBe(true);
  return found!;
}

export async function mailsTo(to: string): Promise<CaughtMail[]> {
  const res = await fetch(`${CATCHER}/api/email?to.address=${encodeURIComponent(to)}`);
  return (await res.json()) as CaughtMail[];
}

/** The first link in the text part that starts with `prefix` (an absolute URL of the app). */
export function linkIn(mail: CaughtMail, prefix: string): string {
  const match = mail.text.match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}\\S+`));
  if (!match) throw new Error(`no link starting with ${prefix} in mail "${mail.subject}":\n${mail.text}`);
  return match[0];
}
