import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

/** `npm run test:faults` (scripts/test-faults.sh): stops and restarts services, so never part of `npm test`. */
export default defineConfig({
  resolve: {
    alias: {
      "~": fileURLToPath(new URL("./app", import.meta.url)),
      "~db": fileURLToPath(new URL("./database", import.meta.url)),
    },
  },
  test: {
    include: ["faults/**/*.test.ts"],
    setupFiles: ["unit/setup.ts"],
    testTimeout: 300_000,
    hookTimeout: 120_000,
    fileParallelism: false,
    // The test process only queues what it says it queues; the processes it starts do the rest.
    env: { OUTBOX_WORKER: "false", JOBS_QUEUE: "false" },
  },
});
