import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

/**
 * Runs the real `keepclear` command (bin/keepclear.js) as a user would. KEEPCLEAR_DB points
 * into `sandboxDir`, so a test that forgets --db never touches the user's own database.
 */
export function runKeepclear(args: string[], sandboxDir: string): Run {
  const r = spawnSync(process.execPath, [join(ROOT, 'bin', 'keepclear.js'), ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, KEEPCLEAR_DB: join(sandboxDir, 'never-default.db') },
    maxBuffer: 64 * 1024 * 1024,
  });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

/** One event of `screen --json` / `events --json`, as DESIGN.md names its fields. */
export interface EventJson {
  id: string;
  primary: string;
  secondary: string;
  tca: string;
  missKm: number;
  relativeSpeedKmS: number;
  rtnKm: number[];
  approachAngleDeg: number;
  pc: number | null;
  pcMethod: string;
  covarianceSource: string;
  warnings: string[];
  entry?: string | null;
  exit?: string | null;
  /** only in `events`: values of a received message, kept apart from Keepclear's */
  extra?: { reportedPc?: number | null; [k: string]: unknown };
}

export interface SpawnOptions {
  /** extra environment (KEEPCLEAR_DB still points into the sandbox unless given here) */
  readonly env?: Record<string, string>;
  /** run as this user (tests running as root use it to meet real file permissions) */
  readonly uid?: number;
  readonly gid?: number;
}

/** The real command without blocking: the child (to watch or kill) and its result. */
export function spawnKeepclear(args: string[], sandboxDir: string, opts: SpawnOptions = {}): {
  child: ChildProcess;
  done: Promise<Run & { signal: NodeJS.Signals | null }>;
} {
  const child = spawn(process.execPath, [join(ROOT, 'bin', 'keepclear.js'), ...args], {
    cwd: ROOT,
    env: { ...process.env, KEEPCLEAR_DB: join(sandboxDir, 'never-default.db'), ...opts.env },
    ...(opts.uid !== undefined ? { uid: opts.uid } : {}),
    ...(opts.gid !== undefined ? { gid: opts.gid } : {}),
  });
  let stdout = '', stderr = '';
  child.stdout!.setEncoding('utf8').on('data', (d: string) => (stdout += d));
  child.stderr!.setEncoding('utf8').on('data', (d: string) => (stderr += d));
  const done = new Promise<Run & { signal: NodeJS.Signals | null }>((resolve, reject) => {
    child.on('error', reject);
    child.on('close', (code, signal) => resolve({ code: code ?? -1, signal, stdout, stderr }));
  });
  return { child, done };
}

/** Resolves when `check` holds (polled every `everyMs`), rejects after `timeoutMs`. */
export async function waitFor(check: () => boolean, what: string, timeoutMs = 60_000, everyMs = 10): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (!check()) {
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}
