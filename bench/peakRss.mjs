// Preloaded into a command under test (`node --import bench/peakRss.mjs bin/keepclear.js …`):
// writes the process's peak resident set (KiB) and CPU time (µs, user + system), worker threads
// included (they share the process), as JSON to the file named by KEEPCLEAR_BENCH_RSS at exit.
import { writeFileSync } from 'node:fs';

const file = process.env.KEEPCLEAR_BENCH_RSS;
if (file) process.on('exit', () => {
    const u = process.resourceUsage();
    writeFileSync(file, JSON.stringify({ maxRssKiB: u.maxRSS, cpuUs: u.userCPUTime + u.systemCPUTime }));
  });
