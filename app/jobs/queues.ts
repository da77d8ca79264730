/** Names and settings of the pg-boss queues; one place so the worker, the web and the tests agree. */
export const QUEUES = {
  outbox: "outbox-deliver",
  reminders: "review-reminders",
  digestsDaily: "digests-daily",
  digestsWeekly: "digests-weekly",
  recheck: "round-recheck",
  recheckSweep: "round-recheck-sweep",
} as const;

type QueuePolicy = "standard" | "short" | "singleton" | "stately";
export type QueueSettings = { policy: QueuePolicy; expireInSeconds: number; retryLimit: number; retryDelay?: number };

/**
 * - outbox: "short" (at most one waiting pass) re-queuing itself.
 * - recheck: "stately" per round (singleton key = round id): one waiting and one running check
 *   per round at most, whatever number of workers and edits. A check re-analyses at most the
 *   round's files from storage (about a second per 200,000-row series on this 2-core machine),
 *   so 15 minutes is ample; being idempotent, a retry after a crash redoes only what is missing.
 */
export const QUEUE_SETTINGS: Record<(typeof QUEUES)[keyof typeof QUEUES], QueueSettings> = {
  [QUEUES.outbox]: { policy: "short", expireInSeconds: 120, retryLimit: 2 },
  [QUEUES.reminders]: { policy: "singleton", expireInSeconds: 900, retryLimit: 2 },
  [QUEUES.digestsDaily]: { policy: "singleton", expireInSeconds: 900, retryLimit: 2 },
  [QUEUES.digestsWeekly]: { policy: "singleton", expireInSeconds: 900, retryLimit: 2 },
  [QUEUES.recheck]: { policy: "stately", expireInSeconds: 900, retryLimit: 2, retryDelay: 5 },
  [QUEUES.recheckSweep]: { policy: "singleton", expireInSeconds: 120, retryLimit: 0 },
};
