import { RateLimiterMemory, RateLimiterRes } from "rate-limiter-flexible";
import { env } from "~/config/env.server";

/**
 * Calls per token (or per signed-in person, for the app's own fetches) per minute. The counters
 * live in this process's memory: with several server instances each one counts on its own, so
 * the effective limit is the configured one times the number of instances (see docs/api.md).
 */
const limiter = new RateLimiterMemory({ points: env.API_RATE_LIMIT_PER_MINUTE, duration: 60 });

export const RATE_LIMIT_PER_MINUTE = env.API_RATE_LIMIT_PER_MINUTE;

/** Counts one call; returns null when allowed, else the seconds until the next call is allowed. */
export async function consumeRateLimit(key: string): Promise<number | null> {
  try {
    await limiter.consume(key);
    return null;
  } catch (rejected) {
    if (rejected instanceof RateLimiterRes) return Math.max(1, Math.ceil(rejected.msBeforeNext / 1000));
    throw rejected;
  }
}
