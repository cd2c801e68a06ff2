/**
 * The desktop shell's security settings (issue 9 item 3; Electron's security checklist). Electron
 * cannot run here, so electron/main.ts and electron/preload.ts are imported with the `electron`
 * module replaced by a recording stand-in: the test starts the app and reads what it asked
 * Electron for — the window's web preferences, the page it loads, the CSP on every response of our
 * scheme, navigation, new windows, webviews, permissions — and calls the IPC handlers as a
 * trusted page, a foreign page, a sub-frame and with malformed requests. Also: the Electron build
 * of better-sqlite3 is found and loaded through `nativeBinding`, and `npm start` explains itself
 * where Electron's runtime is missing.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { dirname, isAbsolute, join } from 'node:path';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { CHANNELS, ipcChannelName, type BridgeHandlers } from '../core/bridge/contract.js';
import { openDatabase } from '../db/index.js';
import { electronNativeBinding } from '../electron/nativeBinding.js';
import { APP_ENTRY_URL, CONTENT_SECURITY_POLICY, WEB_PREFERENCES } from '../electron/security.js';
import { ROOT } from './support/cli.js';

const require = createRequire(import.meta.url);

// ─────────────────────────── the recording stand-in for `electron` ───────────────────────────

type Listener = (...args: unknown[]) => unknown;
const rec = vi.hoisted(() => ({
  windows: [] as { options: Record<string, unknown>; urls: string[]; webContents: Record<string, unknown> }[],
  appListeners: new Map<string, ((...a: unknown[]) => unknown)[]>(),
  privileged: [] as unknown[],
  protocolHandlers: new Map<string, (req: { url: string }) => Promise<Response>>(),
  ipc: new Map<string, (...a: unknown[]) => Promise<unknown>>(),
  permissionRequest: null as null | ((wc: unknown, permission: string, cb: (ok: boolean) => void) => void),
  permissionCheck: null as null | ((wc: unknown, permission: string) => boolean),
  exposed: [] as { name: string; api: Record<string, unknown> }[],
  rendererInvokes: [] as unknown[][],
  ready: null as null | (() => void),
}));

function fakeWebContents(url: string) {
  const on = new Map<string, ((...a: unknown[]) => unknown)[]>();
  const wc: Record<string, unknown> = {
    on: (name: string, fn: (...a: unknown[]) => unknown) => void (on.get(name) ?? on.set(name, []).get(name)!).push(fn),
    listeners: on,
    setWindowOpenHandler: (fn: unknown) => (wc['windowOpenHandler'] = fn),
    mainFrame: { url },
  };
  return wc;
}

vi.mock('electron', () => {
  const readyPromise = new Promise<void>((r) => (rec.ready = r));
  class BrowserWindow {
    readonly webContents = fakeWebContents(APP_ENTRY_URL_FOR_MOCK);
    private readonly entry: (typeof rec.windows)[number];
    constructor(options: Record<string, unknown>) {
      this.entry = { options, urls: [], webContents: this.webContents };
      rec.windows.push(this.entry);
      // Electron fires web-contents-created for the window's contents.
      for (const fn of rec.appListeners.get('web-contents-created') ?? []) fn({}, this.webContents);
    }
    once() {}
    on() {}
    show() {}
    loadURL(url: string) {
      this.entry.urls.push(url);
      return Promise.resolve();
    }
  }
  return {
    app: {
      whenReady: () => readyPromise,
      on: (name: string, fn: (...a: unknown[]) => unknown) => void (rec.appListeners.get(name) ?? rec.appListeners.set(name, []).get(name)!).push(fn),
      getVersion: () => '0.0.0-test',
      quit() {},
      isPackaged: false,
    },
    BrowserWindow,
    dialog: { showOpenDialog: async () => ({ canceled: true, filePaths: [] }), showMessageBox: async () => ({}), showErrorBox() {} },
    ipcMain: {
      handle: (ch: string, fn: (...a: unknown[]) => Promise<unknown>) => void rec.ipc.set(ch, fn),
      removeHandler: (ch: string) => void rec.ipc.delete(ch),
    },
    ipcRenderer: { invoke: async (...args: unknown[]) => (rec.rendererInvokes.push(args), { ok: true, value: { objectCount: 0, latestEpoch: null } }) },
    contextBridge: { exposeInMainWorld: (name: string, api: Record<string, unknown>) => void rec.exposed.push({ name, api }) },
    Menu: { setApplicationMenu() {}, buildFromTemplate: (t: unknown) => t },
    protocol: {
      registerSchemesAsPrivileged: (s: unknown[]) => void rec.privileged.push(...s),
      handle: (scheme: string, fn: (req: { url: string }) => Promise<Response>) => void rec.protocolHandlers.set(scheme, fn),
    },
    session: {
      defaultSession: {
        setPermissionRequestHandler: (fn: typeof rec.permissionRequest) => void (rec.permissionRequest = fn),
        setPermissionCheckHandler: (fn: typeof rec.permissionCheck) => void (rec.permissionCheck = fn),
      },
    },
  };
});
// The mock factory is hoisted above the imports, so it cannot read the imported constant.
const APP_ENTRY_URL_FOR_MOCK = 'keepclear://app/index.html';

// ─────────────────────────── the app under the stand-in ───────────────────────────

const calls: { channel: string; req: unknown }[] = [];
const handlers = Object.fromEntries(
  CHANNELS.map((c) => [c, (req: unknown) => (calls.push({ channel: c, req }), { answered: c })]),
) as unknown as BridgeHandlers;

let rendererDir: string;
let win: (typeof rec.windows)[number];

beforeAll(async () => {
  rendererDir = mkdtempSync(join(tmpdir(), 'keepclear-electron-'));
  writeFileSync(join(rendererDir, 'index.html'), '<!doctype html><title>t</title>');
  mkdirSync(join(rendererDir, 'assets'));
  writeFileSync(join(rendererDir, 'assets', 'app.js'), 'console.log(1)');
  writeFileSync(join(tmpdir(), 'keepclear-electron-secret.txt'), 'secret');
  const { startDesktop } = await import('../electron/main.js');
  startDesktop({ handlers, rendererDir });
  rec.ready!();
  await new Promise((r) => setTimeout(r, 0));
  expect(rec.windows).toHaveLength(1);
  win = rec.windows[0]!;
});

describe('the window (Electron security checklist: isolation, sandbox, no Node in the page)', () => {
  it('is created with contextIsolation, sandbox, no nodeIntegration, web security, no webview tag', () => {
    const prefs = win.options['webPreferences'] as Record<string, unknown>;
    expect(prefs['contextIsolation']).toBe(true);
    expect(prefs['sandbox']).toBe(true);
    expect(prefs['nodeIntegration']).toBe(false);
    expect(prefs['nodeIntegrationInWorker']).toBe(false);
    expect(prefs['nodeIntegrationInSubFrames']).toBe(false);
    expect(prefs['webSecurity']).toBe(true);
    expect(prefs['allowRunningInsecureContent']).toBe(false);
    expect(prefs['webviewTag']).toBe(false);
    // nothing beyond the spelled-out settings and the preload
    expect(Object.keys(prefs).sort()).toEqual([...Object.keys(WEB_PREFERENCES), 'preload'].sort());
    expect(isAbsolute(prefs['preload'] as string)).toBe(true);
    expect(prefs['preload']).toMatch(/preload\.cjs$/);
  });

  it('loads our page from our own scheme, never file://', () => {
    expect(win.urls).toEqual([APP_ENTRY_URL]);
    expect(rec.privileged).toEqual([
      { scheme: 'keepclear', privileges: expect.objectContaining({ standard: true, secure: true, bypassCSP: false, corsEnabled: false }) },
    ]);
  });

  it('refuses navigation (anywhere, even to our own page), redirects, new windows and webviews', () => {
    const listeners = win.webContents['listeners'] as Map<string, Listener[]>;
    for (const name of ['will-navigate', 'will-redirect']) {
      for (const url of ['https://example.org/', 'file:///etc/passwd', APP_ENTRY_URL]) {
        const e = { preventDefault: vi.fn() };
        for (const fn of listeners.get(name) ?? []) fn(e, url);
        expect(e.preventDefault, `${name} ${url}`).toHaveBeenCalled();
      }
    }
    const attach = { preventDefault: vi.fn() };
    for (const fn of listeners.get('will-attach-webview') ?? []) fn(attach);
    expect(attach.preventDefault).toHaveBeenCalled();
    const open = win.webContents['windowOpenHandler'] as (d: { url: string }) => unknown;
    expect(open({ url: 'https://example.org/' })).toEqual({ action: 'deny' });
    expect(open({ url: APP_ENTRY_URL })).toEqual({ action: 'deny' });
  });

  it('grants no permission (camera, microphone, notifications, geolocation, …)', () => {
    for (const p of ['media', 'notifications', 'geolocation', 'clipboard-read', 'openExternal']) {
      let answer: boolean | undefined;
      rec.permissionRequest!({}, p, (ok) => (answer = ok));
      expect(answer, p).toBe(false);
      expect(rec.permissionCheck!({}, p), p).toBe(false);
    }
  });
});

describe('content security policy (every response of keepclear://app carries it)', () => {
  it('is strict: no eval, no inline script or style, nothing from elsewhere, no plugins, never framed', () => {
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/unsafe-eval|unsafe-inline|\*|https?:/);
    for (const d of ["default-src 'self'", "script-src 'self'", "style-src 'self'", "object-src 'none'", "base-uri 'none'", "frame-ancestors 'none'"]) {
      expect(CONTENT_SECURITY_POLICY).toContain(d);
    }
    // The renderer page's own meta policy is as strict.
    const meta = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(readFileSync(join(ROOT, 'renderer/index.html'), 'utf8'))?.[1];
    expect(meta).toBeDefined();
    expect(meta).not.toMatch(/unsafe-eval|unsafe-inline/);
  });

  it('serves the built renderer with the CSP header; refuses other hosts and paths outside its folder', async () => {
    const serve = rec.protocolHandlers.get('keepclear')!;
    const page = await serve({ url: APP_ENTRY_URL });
    expect(page.status).toBe(200);
    expect(page.headers.get('content-security-policy')).toBe(CONTENT_SECURITY_POLICY);
    expect(page.headers.get('x-content-type-options')).toBe('nosniff');
    expect(await page.text()).toContain('<title>t</title>');
    const js = await serve({ url: 'keepclear://app/assets/app.js' });
    expect([js.status, js.headers.get('content-type')]).toEqual([200, 'text/javascript; charset=utf-8']);
    for (const url of [
      'keepclear://app/../keepclear-electron-secret.txt',
      'keepclear://app/%2e%2e/keepclear-electron-secret.txt',
      'keepclear://app/..%2fkeepclear-electron-secret.txt',
      'keepclear://other/index.html',
      'keepclear://app/index.txt',
      'keepclear://app/missing.js',
    ]) {
      const r = await serve({ url });
      expect(r.status, url).toBeGreaterThanOrEqual(403);
      expect(await r.text(), url).not.toBe('secret');
    }
  });
});

describe('IPC: every message checked for sender and shape (core/bridge validators)', () => {
  const trusted = () => ({ sender: win.webContents, senderFrame: win.webContents['mainFrame'] });

  it('registers one handler per bridge channel', () => {
    expect([...rec.ipc.keys()].sort()).toEqual(CHANNELS.map(ipcChannelName).sort());
  });

  it('answers our page, and passes only validated requests to the handlers', async () => {
    calls.length = 0;
    const ok = await rec.ipc.get(ipcChannelName('runs.events'))!(trusted(), { runId: 'R1' });
    expect(ok).toEqual({ ok: true, value: { answered: 'runs.events' } });
    expect(calls).toEqual([{ channel: 'runs.events', req: { runId: 'R1' } }]);
  });

  it('refuses other senders, sub-frames, pages of other origins, bad shapes and extra arguments', async () => {
    calls.length = 0;
    const h = rec.ipc.get(ipcChannelName('runs.events'))!;
    const other = fakeWebContents(APP_ENTRY_URL);
    const cases: [string, unknown, unknown[], RegExp][] = [
      ['another web contents', { sender: other, senderFrame: other['mainFrame'] }, [{ runId: 'R1' }], /untrusted/],
      ['a sub-frame of our window', { sender: win.webContents, senderFrame: { url: APP_ENTRY_URL } }, [{ runId: 'R1' }], /untrusted/],
      ['our frame showing another page', { sender: win.webContents, senderFrame: null }, [{ runId: 'R1' }], /untrusted/],
      ['a number for the id', trusted(), [{ runId: 12 }], /"runId" must be a string id, got the number 12/],
      ['an unknown field', trusted(), [{ runId: 'R1', sql: 'drop' }], /unknown field "sql"/],
      ['no request', trusted(), [], /expected one request, got 0/],
      ['two arguments', trusted(), [{ runId: 'R1' }, { more: 1 }], /expected one request, got 2/],
    ];
    for (const [what, event, args, message] of cases) {
      const reply = (await h(event, ...args)) as { ok: boolean; error?: { code: string; message: string } };
      expect(reply.ok, what).toBe(false);
      expect(reply.error!.code, what).toBe('BAD_REQUEST');
      expect(reply.error!.message, what).toMatch(message);
    }
    // a frame whose URL is another origin, even in our window
    const mainFrame = win.webContents['mainFrame'] as { url: string };
    const saved = mainFrame.url;
    mainFrame.url = 'https://example.org/';
    const foreign = (await h(trusted(), { runId: 'R1' })) as { ok: boolean };
    mainFrame.url = saved;
    expect(foreign.ok).toBe(false);
    expect(calls).toEqual([]);
  });

  it('the preload exposes one function, `keepclear.invoke`, and checks requests before sending', async () => {
    await import('../electron/preload.js');
    expect(rec.exposed.map((e) => e.name)).toEqual(['keepclear']);
    const api = rec.exposed[0]!.api as { invoke: (c: string, r: unknown) => Promise<unknown> };
    expect(Object.keys(api)).toEqual(['invoke']);
    await expect(api.invoke('runs.events', { runId: 7 })).rejects.toThrow(/"runId" must be a string id/);
    await expect(api.invoke('fs.read', {})).rejects.toThrow(/unknown channel/);
    expect(rec.rendererInvokes).toEqual([]);
    await api.invoke('catalog.summary', {});
    expect(rec.rendererInvokes).toEqual([[ipcChannelName('catalog.summary'), {}]]);
  });
});

describe('better-sqlite3 under Electron (a second build for its ABI, loaded through nativeBinding)', () => {
  const nodeBuild = join(dirname(require.resolve('better-sqlite3/package.json')), 'build', 'Release', 'better_sqlite3.node');

  it('the packaged app looks in resources/native, development in build/electron-native', () => {
    const packaged = electronNativeBinding({ isPackaged: true, resourcesPath: '/opt/Keepclear/resources', appRoot: '/x' }, () => true);
    expect(packaged).toEqual({ ok: true, path: join('/opt/Keepclear/resources', 'native', 'better_sqlite3.node') });
    const dev = electronNativeBinding({ isPackaged: false, resourcesPath: '/r', appRoot: '/repo' }, () => false);
    expect(dev.ok).toBe(false);
    expect(!dev.ok && dev.message).toMatch(/build\/electron-native\/better_sqlite3\.node.*npm run electron:native/);
  });

  it('openDatabase passes nativeBinding to better-sqlite3 (this Node build loads; a missing file is an error naming it)', () => {
    expect(existsSync(nodeBuild)).toBe(true);
    const db = openDatabase(':memory:', { nativeBinding: nodeBuild });
    db.close();
    expect(() => openDatabase(':memory:', { nativeBinding: '/nonexistent/better_sqlite3.node' })).toThrow(/nonexistent\/better_sqlite3\.node/);
  });

  it('packaging ships that build and does not rebuild node_modules in place (electron-builder.yml)', () => {
    const yml = readFileSync(join(ROOT, 'electron-builder.yml'), 'utf8');
    expect(yml).toMatch(/^npmRebuild: false$/m);
    expect(yml).toMatch(/- from: build\/electron-native\/better_sqlite3\.node\n\s+to: native\/better_sqlite3\.node/);
    for (const target of ['AppImage', 'deb', 'dmg', 'nsis']) expect(yml).toMatch(new RegExp(`^\\s*(- |target: )${target}$`, 'm'));
  });
});

describe('setup and npm start', () => {
  const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as Record<string, Record<string, string>>;

  it('electron is an optional dependency only, pinned; the README setup needs no environment variable', () => {
    expect(pkg['optionalDependencies']!['electron']).toMatch(/^\d+\.\d+\.\d+$/);
    expect(pkg['dependencies']!['electron']).toBeUndefined();
    expect(pkg['devDependencies']!['electron']).toBeUndefined();
    for (const doc of ['README.md', 'DEVELOPERS.md']) expect(readFileSync(join(ROOT, doc), 'utf8'), doc).not.toMatch(/ELECTRON_SKIP_BINARY_DOWNLOAD/);
    expect(pkg['scripts']!['start']).toBe('node scripts/start-electron.mjs');
  });

  it('npm start says clearly what to do where Electron is not installed, and starts where it is', () => {
    const r = spawnSync(process.execPath, [join(ROOT, 'scripts/start-electron.mjs'), '--check'], { encoding: 'utf8' });
    let runtime: string | null = null;
    try {
      runtime = require(join(ROOT, 'node_modules', 'electron')) as string;
    } catch {
      runtime = null;
    }
    if (runtime && existsSync(runtime)) {
      expect(r.status).toBe(0);
      expect(r.stdout).toContain('Electron found');
    } else {
      expect(r.status).toBe(1);
      expect(r.stderr).toMatch(/cannot start the desktop app here: .*\n.*npm install --no-save electron@\d+\.\d+\.\d+/);
      expect(r.stderr).toContain('keepclear serve');
    }
  });
});
