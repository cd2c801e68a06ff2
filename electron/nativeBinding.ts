/**
 * Where the desktop app finds better-sqlite3's native module built for Electron's ABI.
 *
 * node_modules/better-sqlite3 stays built for Node (the CLI, `keepclear serve` and the tests use
 * it); `npm run electron:native` (scripts/electron-native.mjs) builds a second copy for Electron
 * into build/electron-native/, and electron-builder.yml ships that file as
 * resources/native/better_sqlite3.node. better-sqlite3's `nativeBinding` option loads it.
 * No Electron import: test/electron-security.test.ts checks the choice.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';

export const NATIVE_FILE = 'better_sqlite3.node';
/** relative to the repository root (development, `npm start`) */
export const DEV_NATIVE_DIR = join('build', 'electron-native');
/** relative to process.resourcesPath (packaged app) */
export const PACKAGED_NATIVE_DIR = 'native';

export interface NativeBindingPlace {
  readonly isPackaged: boolean;
  /** process.resourcesPath */
  readonly resourcesPath: string;
  /** the repository root (development) */
  readonly appRoot: string;
}

export type NativeBindingChoice = { readonly ok: true; readonly path: string } | { readonly ok: false; readonly message: string };

export function electronNativeBinding(place: NativeBindingPlace, exists: (p: string) => boolean = existsSync): NativeBindingChoice {
  const path = place.isPackaged
    ? join(place.resourcesPath, PACKAGED_NATIVE_DIR, NATIVE_FILE)
    : join(place.appRoot, DEV_NATIVE_DIR, NATIVE_FILE);
  if (exists(path)) return { ok: true, path };
  return {
    ok: false,
    message: place.isPackaged
      ? `the database module built for this app is missing (${path}); reinstall Keepclear`
      : `better-sqlite3 built for Electron is missing (${path}); run "npm run electron:native" once (needs internet), then "npm start"`,
  };
}
