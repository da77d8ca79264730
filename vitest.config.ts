import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

export default defineConfig({
  resolve: {
    alias: {
      "~": fileURLToPath(new URL("./app", import.meta.url)),
      "~db": fileURLToPath(new URL("./database", import.meta.url)),
    },
  },
  test: {
    // Playwright specs live in e2e/ and must never be collected here.
    include: ["unit/**/*.test.ts"],
    setupFiles: ["unit/setup.ts"],
    testTimeout: 20_000,
    fileParallelism: false,
    // Tests drive delivery themselves; a background job runner in the test process would race them.
    // Round checks run where a test calls them (or starts the job runner itself); nothing is queued.
    env: { OUTBOX_WORKER: "false", JOBS_QUEUE: "false" },
  },
});
