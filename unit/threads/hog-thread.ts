/**
 * A checker thread entry for the pool's tests: the real tasks, plus tasks that misbehave on
 * purpose (run out of memory, never end). Loaded by unit/threads/checker-pool.test.ts only.
 */
import { runCheckerTask, toWire, type CheckerTask } from "~/threads/checker-tasks";

export type HogTask = { kind: "hog-memory" } | { kind: "hog-time" } | { kind: "hog-stack" };

export default function run(task: CheckerTask | HogTask) {
  if (task.kind === "hog-memory") {
    // Small live objects until the heap is full: the thread's old-generation limit must stop it.
    const kept: number[][] = [];
    for (let i = 0; ; i++) kept.push(Array.from({ length: 1000 }, (_, j) => i + j + 0.5));
  }
  if (task.kind === "hog-time") {
    let x = 0;
    for (;;) x = (x + 1) % 1e9;
  }
  if (task.kind === "hog-stack") {
    const down = (n: number): number => down(n + 1) + 1;
    try {
      return { ok: true, value: down(0) };
    } catch (e) {
      return { ok: false, error: toWire(e) };
    }
  }
  return runCheckerTask(task);
}
