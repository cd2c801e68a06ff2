/**
 * Electron main process: one window, the application menu, dialogs, and the typed bridge over
 * IPC. Nothing else lives here: the bridge handlers and the import come in through
 * `startDesktop()` (the lead wires them to db/ and core/), so this file holds no data of its own.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu } from 'electron';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BridgeHandlers } from '../core/bridge/contract.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { registerBridgeIpc, type InvokeEventLike } from './ipc.js';
import { buildAppMenu } from './menu.js';

export interface DesktopOptions {
  /** answers the bridge channels (core/bridge/contract.ts) */
  readonly handlers: BridgeHandlers;
  /** imports the chosen files and returns a short summary for the user; absent: Import… disabled */
  readonly importFiles?: (paths: readonly string[]) => Promise<string>;
  /** dev: a Vite dev server URL for the renderer; default: the built renderer next to this build */
  readonly rendererUrl?: string;
}

/** Build layout (electron/vite.config.ts, renderer/vite.config.ts): dist/electron, dist/renderer. */
const here = dirname(fileURLToPath(import.meta.url));
const PRELOAD = join(here, 'preload.cjs');
const RENDERER_INDEX = join(here, '..', 'renderer', 'index.html');

const IMPORT_FILTERS: Electron.FileFilter[] = [
  { name: 'Orbit and conjunction data (TLE, OMM, OEM, CDM)', extensions: ['tle', 'txt', '3le', 'omm', 'oem', 'cdm', 'kvn', 'xml', 'json', 'csv'] },
  { name: 'All files', extensions: ['*'] },
];

function createWindow(options: DesktopOptions): BrowserWindow {
  const win = new BrowserWindow({
    width: 1200,
    height: 780,
    minWidth: 720,
    minHeight: 480,
    title: 'Keepclear',
    backgroundColor: '#f4f3ef',
    show: false,
    webPreferences: {
      preload: PRELOAD,
      contextIsolation: true,
      nodeIntegration: false,
      sandbox: true,
      webSecurity: true,
    },
  });
  win.once('ready-to-show', () => win.show());
  // The window shows our page only: no navigation away, no new windows.
  win.webContents.on('will-navigate', (e) => e.preventDefault());
  win.webContents.setWindowOpenHandler(() => ({ action: 'deny' }));
  void (options.rendererUrl ? win.loadURL(options.rendererUrl) : win.loadFile(RENDERER_INDEX));
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

/** Starts the desktop app once Electron is ready. Call from the entry module. */
export function startDesktop(options: DesktopOptions): void {
  let win: BrowserWindow | undefined;
  const isTrustedSender = (event: InvokeEventLike): boolean =>
    win !== undefined && event.sender === win.webContents && event.senderFrame === win.webContents.mainFrame;

  const open = (): void => {
    win = createWindow(options);
    win.on('closed', () => (win = undefined));
  };

  void app.whenReady().then(() => {
    registerBridgeIpc(ipcMain, options.handlers, isTrustedSender);
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
}
