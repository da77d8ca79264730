import { env } from "~/config/env.server";
import { db } from "~/db.server";
import { takeAttempt } from "~/throttle/limits.server";

/**
 * Calls per token (or per signed-in person, for the app's own fetches) per minute. The counters
 * live in PostgreSQL, so every server process counts against the same limit.
 */
export const RATE_LIMIT_PER_MINUTE = env.API_RATE_LIMIT_PER_MINUTE;
const rule = { name: "api", points: RATE_LIMIT_PER_MINUTE, seconds: 60 };

/** Counts one call; returns null when allowed, else the seconds until the next call is allowed. */
export async function consumeRateLimit(key: string): Promise<number | null> {
  return takeAttempt(db, [{ rule, key }]);
}
