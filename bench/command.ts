/**
 * Times a whole `keepclear` command as a user runs it: a new process on the compiled program
 * (`node bin/keepclear.js …`), wall time from spawn to exit, peak RSS of the process (worker
 * threads included) and, for `--json FILE`, the number of events written.
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { BENCH_DIR, CACHE_DIR } from './catalogueDb.js';

export interface CommandTiming {
  readonly wallS: number;
  readonly peakRssMiB: number;
  /** CPU time of the process, all threads (s): steadier than wall time on a shared machine */
  readonly cpuS: number;
  readonly code: number;
  readonly stderr: string;
  /** events in the JSON output, when the command wrote one */
  readonly events: number | null;
}

const ROOT = join(BENCH_DIR, '..');

export async function timeCommand(args: readonly string[], tag: string): Promise<CommandTiming> {
  const rssFile = join(CACHE_DIR, `rss-${process.pid}-${tag}.txt`);
  const jsonAt = args.indexOf('--json');
  const jsonFile = jsonAt >= 0 ? args[jsonAt + 1] : undefined;
  if (jsonFile && jsonFile !== '-') rmSync(jsonFile, { force: true });
  await quietParent();
  const t0 = performance.now();
  const { code, stderr } = await new Promise<{ code: number; stderr: string }>((resolve, reject) => {
    const child = spawn(
      process.execPath,
      ['--import', join(BENCH_DIR, 'peakRss.mjs'), join(ROOT, 'bin', 'keepclear.js'), ...args],
      { cwd: ROOT, env: { ...process.env, KEEPCLEAR_BENCH_RSS: rssFile }, stdio: ['ignore', 'ignore', 'pipe'] },
    );
    let err = '';
    child.stderr.setEncoding('utf8').on('data', (d: string) => (err += d));
    child.on('error', reject);
    child.on('close', (c) => resolve({ code: c ?? -1, stderr: err }));
  });
  const wallS = (performance.now() - t0) / 1000;
  const usage = existsSync(rssFile) ? (JSON.parse(readFileSync(rssFile, 'utf8')) as { maxRssKiB: number; cpuUs: number }) : null;
  const peakRssMiB = usage ? usage.maxRssKiB / 1024 : Number.NaN;
  const cpuS = usage ? usage.cpuUs / 1e6 : Number.NaN;
  rmSync(rssFile, { force: true });
  let events: number | null = null;
  if (jsonFile && jsonFile !== '-' && existsSync(jsonFile)) {
    events = (JSON.parse(readFileSync(jsonFile, 'utf8')) as { events: unknown[] }).events.length;
    rmSync(jsonFile, { force: true });
  }
  return { wallS, peakRssMiB, cpuS, code, stderr, events };
}

/**
 * The bench process settles before a command is timed: its own garbage from earlier cases (the
 * catalogue, 30,000 prepared objects) collected now, not by V8's background threads on the two
 * cores the command wants. Measured: 1 primary took 2.15–2.27 s after the start/load/prepare cases
 * and 1.82–1.87 s run alone (same code, same minutes). `npm run bench` passes --expose-gc.
 */
export async function quietParent(): Promise<void> {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (gc) gc();
  await new Promise((resolve) => setTimeout(resolve, 300));
}
