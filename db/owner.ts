import { hostname } from 'node:os';

/** The process that owns a running run: it alone may finish it. */
export interface RunOwner {
  readonly pid: number;
  readonly host: string;
}

export const currentOwner = (): RunOwner => ({ pid: process.pid, host: hostname() });

/**
 * Whether a process with this id exists on this machine. Signal 0 tests without sending
 * anything; EPERM means it exists but belongs to another user. A reused pid reads as alive,
 * which errs on the safe side: the run stays "running" until that process is gone too.
 */
export function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}
