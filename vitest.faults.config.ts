import { defineConfig, mergeConfig } from "vitest/config";
import base from "./vitest.config.ts";

/** `npm run test:faults` (scripts/test-faults.sh): stops and restarts services, so never part of `npm test`. */
export default mergeConfig(
  base,
  defineConfig({
    test: {
      include: ["faults/**/*.test.ts"],
      testTimeout: 300_000,
      hookTimeout: 120_000,
      // The test process only queues what it says it queues; workers it starts do the rest.
      env: { OUTBOX_WORKER: "false", JOBS_QUEUE: "false" },
    },
  }),
);
