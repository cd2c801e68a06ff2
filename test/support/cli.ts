import { spawnSync } from 'node:child_process';
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
