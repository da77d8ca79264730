// Preloaded into the benchmarked server (`node --import`): event-loop delay and peak RSS.
// SIGUSR2 writes the figures (and the CPU time the process used) since the last signal to $LOOP_STATS_FILE and starts afresh.
import { renameSync, writeFileSync } from "node:fs";
import { monitorEventLoopDelay } from "node:perf_hooks";

const file = process.env.LOOP_STATS_FILE;
if (file) {
  const h = monitorEventLoopDelay({ resolution: 10 });
  h.enable();
  let peakRss = process.memoryUsage.rss();
  let cpu = process.cpuUsage();
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage.rss())), 50);
  sampler.unref();
  process.on("SIGUSR2", () => {
    peakRss = Math.max(peakRss, process.memoryUsage.rss());
    const used = process.cpuUsage(cpu);
    // Written aside and renamed, so the reader never sees a half-written file.
    writeFileSync(`${file}.part`, JSON.stringify({ p99Ms: h.percentile(99) / 1e6, maxMs: h.max / 1e6, peakRssMb: peakRss / 1048576, cpuMs: (used.user + used.system) / 1000, at: Date.now() }));
    renameSync(`${file}.part`, file);
    cpu = process.cpuUsage();
    h.reset();
    peakRss = process.memoryUsage.rss();
  });
}
