/**
 * Electron main process: one window, the application menu, dialogs, and the typed bridge over
 * IPC. Nothing else lives here: the bridge handlers come in through `startDesktop()` (entry.ts
 * passes app/bridge's handlers over the database), and every security setting comes from
 * security.ts, where test/electron-security.test.ts reads it.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session, type WebContents } from 'electron';
import { readFile } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BridgeHandlers } from '../core/bridge/contract.js';
import { DECISION_AID_NOTE } from '../core/risk/decisionAid.js';
import { registerBridgeIpc } from './ipc.js';
import { buildAppMenu } from './menu.js';
import {
  allowPermission,
  APP_ENTRY_URL,
  APP_SCHEME,
  APP_SCHEME_PRIVILEGES,
  denyWindowOpen,
  isTrustedSender,
  resolveAppRequest,
  shouldBlockNavigation,
  windowOptions,
} from './security.js';

export interface DesktopOptions {
  /** answers the bridge channels (core/bridge/contract.ts) */
  readonly handlers: BridgeHandlers;
  /** imports the chosen files and returns a short summary for the user; absent: Import… disabled */
  readonly importFiles?: (paths: readonly string[]) => Promise<string>;
  /** folder of the built renderer; default: dist/renderer next to this build */
  readonly rendererDir?: string;
  /** called once when the app quits (close the database) */
  readonly onQuit?: () => void;
}

/** Build layout (electron/vite.config.ts, renderer/vite.config.ts): dist/electron, dist/renderer. */
const here = dirname(fileURLToPath(import.meta.url));
const PRELOAD = join(here, 'preload.cjs');
const RENDERER_DIR = join(here, '..', 'renderer');

const IMPORT_FILTERS: Electron.FileFilter[] = [
  { name: 'Orbit and conjunction data (TLE, OMM, OEM, CDM)', extensions: ['tle', 'txt', '3le', 'omm', 'oem', 'cdm', 'kvn', 'xml', 'json', 'csv'] },
  { name: 'All files', extensions: ['*'] },
];

/** Applied to every web contents the app ever makes (the window, and any a bug might create). */
function lockDown(contents: WebContents): void {
  contents.on('will-navigate', (e, url) => {
    if (shouldBlockNavigation(url)) e.preventDefault();
  });
  contents.on('will-redirect', (e, url) => {
    if (shouldBlockNavigation(url)) e.preventDefault();
  });
  contents.on('will-attach-webview', (e) => e.preventDefault());
  contents.setWindowOpenHandler(denyWindowOpen);
}

/** Serves the built renderer on keepclear://app/ with the CSP header on every response. */
function serveRenderer(rootDir: string): void {
  protocol.handle(APP_SCHEME, async (request) => {
    const r = resolveAppRequest(request.url, rootDir);
    if (!r.ok) return new Response(r.reason, { status: r.status, headers: { 'Content-Type': 'text/plain; charset=utf-8' } });
    try {
      return new Response(await readFile(r.file), { status: 200, headers: r.headers });
    } catch {
      return new Response('not found', { status: 404, headers: { 'Content-Type': 'text/plain; charset=utf-8' } });
    }
  });
}

function createWindow(): BrowserWindow {
  const win = new BrowserWindow(windowOptions(PRELOAD));
  win.once('ready-to-show', () => win.show());
  void win.loadURL(APP_ENTRY_URL);
  return win;
}

async function importInto(win: BrowserWindow, importFiles: (paths: readonly string[]) => Promise<string>): Promise<void> {
  const choice = await dialog.showOpenDialog(win, {
    title: 'Import into Keepclear',
    properties: ['openFile', 'multiSelections'],
    filters: IMPORT_FILTERS,
  });
  if (choice.canceled || choice.filePaths.length === 0) return;
  try {
    const summary = await importFiles(choice.filePaths);
    await dialog.showMessageBox(win, { type: 'info', title: 'Import', message: 'Import finished', detail: summary });
  } catch (err) {
    dialog.showErrorBox('Import failed', err instanceof Error ? err.message : String(err));
  }
}

function showAbout(win: BrowserWindow | undefined): void {
  const opts: Electron.MessageBoxOptions = {
    type: 'info',
    title: 'About Keepclear',
    message: `Keepclear ${app.getVersion()}`,
    detail: `Conjunction screening for small-satellite operators.\n\n${DECISION_AID_NOTE}`,
  };
  void (win ? dialog.showMessageBox(win, opts) : dialog.showMessageBox(opts));
}

/** Starts the desktop app. Call from the entry module, before Electron is ready. */
export function startDesktop(options: DesktopOptions): void {
  let win: BrowserWindow | undefined;
  // Must happen before `ready`: our scheme becomes a secure, standard origin.
  protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { ...APP_SCHEME_PRIVILEGES } }]);
  app.on('web-contents-created', (_e, contents) => lockDown(contents));

  const open = (): void => {
    win = createWindow();
    win.on('closed', () => (win = undefined));
  };

  void app.whenReady().then(() => {
    session.defaultSession.setPermissionRequestHandler((_wc, permission, callback) => callback(allowPermission(permission)));
    session.defaultSession.setPermissionCheckHandler((_wc, permission) => allowPermission(permission));
    serveRenderer(options.rendererDir ?? RENDERER_DIR);
    registerBridgeIpc(ipcMain, options.handlers, (event) => isTrustedSender(event, win));
    const { importFiles } = options;
    Menu.setApplicationMenu(
      buildAppMenu({
        importFiles: importFiles && ((): void => {
          if (win) void importInto(win, importFiles);
        }),
        about: () => showAbout(win),
      }),
    );
    open();
    app.on('activate', () => {
      if (win === undefined) open();
    });
  });
  app.on('window-all-closed', () => {
    if (process.platform !== 'darwin') app.quit();
  });
  app.on('will-quit', () => options.onQuit?.());
}
