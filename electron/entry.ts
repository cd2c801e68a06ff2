/**
 * The desktop app's entry (bundled to dist/electron/main.js): opens the database with the
 * Electron build of better-sqlite3, and starts the shell with the bridge handlers that
 * `keepclear serve` uses too (app/bridge). The database path is the CLI's default
 * (KEEPCLEAR_DB overrides it), so the CLI and the app share one file.
 */
import { app, dialog } from 'electron';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createBridgeHandlers } from '../app/bridge/handlers.js';
import { defaultDbPath, openDatabase } from '../db/index.js';
import { startDesktop } from './main.js';
import { electronNativeBinding } from './nativeBinding.js';

const appRoot = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

function fail(message: string): never {
  dialog.showErrorBox('Keepclear cannot start', message);
  app.exit(1);
  throw new Error(message);
}

const native = electronNativeBinding({ isPackaged: app.isPackaged, resourcesPath: process.resourcesPath, appRoot });
if (!native.ok) fail(native.message);
const dbPath = defaultDbPath();
let db: ReturnType<typeof openDatabase>;
try {
  db = openDatabase(dbPath, { nativeBinding: native.path });
} catch (e) {
  fail(`${dbPath}: ${e instanceof Error ? e.message : String(e)}`);
}
const host = createBridgeHandlers(db);

startDesktop({
  handlers: host.handlers,
  importFiles: async (paths) => {
    const { importFiles } = await import('../app/import/index.js');
    const summary = importFiles(db, { files: paths });
    const lines = summary.outcomes.map((o) =>
      o.ok ? `${o.file}: ${o.format}, ${o.counts.imported} new, ${o.counts.updated} updated, ${o.counts.rejected} rejected` : `${o.file}: not imported — ${o.error.message}`,
    );
    return lines.join('\n');
  },
  onQuit: () => db.close(),
});
