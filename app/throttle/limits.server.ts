import { createHash } from "node:crypto";
import { RateLimiterDrizzle, RateLimiterRes } from "rate-limiter-flexible";
import type { Database } from "~db/client";
import { rateLimitCounter } from "~db/schema";

/**
 * Rate limits whose counters live in PostgreSQL (table rate_limit_counter), so every server process
 * counts against the same numbers. Keys never hold an e-mail address in clear: it is hashed.
 */
export type LimitRule = { name: string; points: number; seconds: number };

/**
 * The limits (common practice, after the OWASP Authentication and Forgot Password cheat sheets:
 * throttle guesses per account and per address, limit reset mails per address).
 */
export const RULES = {
  signInPerAccount: { name: "sign-in:account", points: 10, seconds: 15 * 60 },
  signInPerAddress: { name: "sign-in:address", points: 30, seconds: 15 * 60 },
  resetMailPerAccount: { name: "reset-mail:account", points: 3, seconds: 60 * 60 },
  /** Password-reset, confirmation and sign-up mails asked for from one address. */
  accountMailPerAddress: { name: "account-mail:address", points: 10, seconds: 60 * 60 },
  invitationMailPerAddress: { name: "invitation-mail:address", points: 20, seconds: 60 * 60 },
  /** "Send the digest now" for one submission: a few times an hour, whoever asks (the authors' inboxes are what it protects). */
  digestNowPerSubmission: { name: "digest-now:submission", points: 3, seconds: 60 * 60 },
} as const satisfies Record<string, LimitRule>;

const limiters = new Map<string, RateLimiterDrizzle>();

function limiterFor(db: Database, rule: LimitRule): RateLimiterDrizzle {
  const id = `${rule.name}/${rule.points}/${rule.seconds}`;
  let limiter = limiters.get(id);
  if (!limiter) {
    limiter = new RateLimiterDrizzle({
      storeClient: db,
      schema: rateLimitCounter,
      keyPrefix: rule.name,
      points: rule.points,
      duration: rule.seconds,
    });
    limiters.set(id, limiter);
  }
  return limiter;
}

/** An e-mail address (or any personal value) as a key: lower-cased and hashed. */
export function personKey(value: string): string {
  return createHash("sha256").update(value.trim().toLowerCase()).digest("hex").slice(0, 32);
}

/**
 * Counts one attempt against every rule given; returns null when all allow it, else the seconds to
 * wait before the next attempt is allowed (the longest of the refusing rules).
 */
export async function takeAttempt(db: Database, checks: { rule: LimitRule; key: string }[]): Promise<number | null> {
  let wait: number | null = null;
  for (const { rule, key } of checks) {
    try {
      await limiterFor(db, rule).consume(key);
    } catch (rejected) {
      if (!(rejected instanceof RateLimiterRes)) throw rejected;
      wait = Math.max(wait ?? 0, Math.max(1, Math.ceil(rejected.msBeforeNext / 1000)));
    }
  }
  return wait;
}

/** Forgets the attempts counted under one key (e.g. after a successful sign-in). */
export async function forgetAttempts(db: Database, rule: LimitRule, key: string): Promise<void> {
  await limiterFor(db, rule).delete(key);
}

/** "15 minutes", "1 minute", "40 seconds": a wait in words. */
export function waitInWords(seconds: number): string {
  if (seconds >= 90) {
    const minutes = Math.ceil(seconds / 60);
    return `${minutes} minute${minutes === 1 ? "" : "s"}`;
  }
  return `${seconds} second${seconds === 1 ? "" : "s"}`;
}
