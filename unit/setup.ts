import { afterEach, beforeEach, vi } from "vitest";

// An unexpected console.error is a bug the test should report, not noise to scroll past.
let spy: ReturnType<typeof vi.spyOn> | undefined;
beforeEach(() => {
  spy = vi.spyOn(console, "error").mockImplementation((...args: unknown[]) => {
    throw new Error(`console.error called: ${args.map(String).join(" ")}`);
  });
});
afterEach(() => {
  spy?.mockRestore();
});
