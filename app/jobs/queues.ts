/** Names of the pg-boss queues; one place so the scheduler and the tests agree. */
export const QUEUES = {
  outbox: "outbox-deliver",
  reminders: "review-reminders",
  digestsDaily: "digests-daily",
  digestsWeekly: "digests-weekly",
  recheck: "round-recheck",
} as const;
