import { mkdirSync } from 'node:fs';
import { homedir } from 'node:os';
import { posix, win32 } from 'node:path';

/**
 * The database file used when no --db is given, its folder created if missing.
 * KEEPCLEAR_DB overrides everything (tests, scripted use); otherwise the platform's per-user data
 * folder, so the catalogue and run history survive between sessions without the user choosing.
 */
export function defaultDbPath(
  env: NodeJS.ProcessEnv = process.env,
  platform: NodeJS.Platform = process.platform,
  home: string = homedir(),
): string {
  const path = chooseDbPath(env, platform, home);
  mkdirSync((platform === 'win32' ? win32 : posix).dirname(path), { recursive: true });
  return path;
}

/** The path rule alone, without touching the disk (tests check every platform on any platform). */
export function chooseDbPath(env: NodeJS.ProcessEnv, platform: NodeJS.Platform, home: string): string {
  const override = env['KEEPCLEAR_DB'];
  if (override !== undefined && override !== '') return override;
  if (platform === 'win32') {
    const appData = env['APPDATA'];
    const base =
      appData !== undefined && appData !== '' ? appData : win32.join(home, 'AppData', 'Roaming');
    return win32.join(base, 'Keepclear', 'keepclear.db');
  }
  if (platform === 'darwin') {
    return posix.join(home, 'Library', 'Application Support', 'Keepclear', 'keepclear.db');
  }
  const xdg = env['XDG_DATA_HOME'];
  // XDG Base Directory spec: a relative XDG_DATA_HOME is invalid and must be ignored.
  const base = xdg !== undefined && xdg.startsWith('/') ? xdg : posix.join(home, '.local', 'share');
  return posix.join(base, 'keepclear', 'keepclear.db');
}
