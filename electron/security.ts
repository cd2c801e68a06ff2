/**
 * The desktop shell's security settings, as plain values and functions with no Electron import,
 * so test/electron-security.test.ts reads exactly what main.ts uses (Electron's security
 * checklist: isolation, sandbox, no Node in the page, a strict CSP, no navigation, no new
 * windows, no webviews, no permissions, IPC only from our own page).
 *
 * The page is served from our own privileged scheme (`keepclear://app/…`) rather than file://:
 * file:// pages can read any local file, and a scheme of our own lets every response carry the
 * CSP header and confines requests to the built renderer folder.
 */
import { isAbsolute, join, normalize, relative, sep } from 'node:path';

export const APP_SCHEME = 'keepclear';
export const APP_HOST = 'app';
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
export const APP_ENTRY_URL = `${APP_ORIGIN}/index.html`;

/**
 * The renderer's policy: our own scripts and styles only (no inline script, no eval — three.js,
 * vega and our code need neither), images from our origin or data:/blob: URLs (vega's SVG/PNG
 * export), no plugins, no base or form targets, never framed. The same as `keepclear serve`'s
 * (app/serve/server.ts), where 'self' is the loopback origin instead.
 */
export const CONTENT_SECURITY_POLICY =
  "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data: blob:; connect-src 'self'; " +
  "worker-src 'self' blob:; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

/** Every web preference that matters for security, spelled out (Electron's defaults change between versions). */
export const WEB_PREFERENCES = Object.freeze({
  contextIsolation: true,
  sandbox: true,
  nodeIntegration: false,
  nodeIntegrationInWorker: false,
  nodeIntegrationInSubFrames: false,
  webSecurity: true,
  allowRunningInsecureContent: false,
  experimentalFeatures: false,
  webviewTag: false,
  navigateOnDragDrop: false,
  spellcheck: false,
  safeDialogs: true,
} as const);

export interface WindowOptionsLike {
  readonly width: number;
  readonly height: number;
  readonly minWidth: number;
  readonly minHeight: number;
  readonly title: string;
  readonly backgroundColor: string;
  readonly show: boolean;
  readonly webPreferences: typeof WEB_PREFERENCES & { readonly preload: string };
}

/** The main window's options: the preload is the only extra in webPreferences. */
export function windowOptions(preloadPath: string): WindowOptionsLike {
  if (!isAbsolute(preloadPath)) throw new Error(`preload path must be absolute, got ${preloadPath}`);
  return {
    width: 1200,
    height: 780,
    minWidth: 720,
    minHeight: 480,
    title: 'Keepclear',
    backgroundColor: '#f4f3ef',
    show: false,
    webPreferences: { ...WEB_PREFERENCES, preload: preloadPath },
  };
}

/** Is this URL our own page? (for the IPC sender check and navigation) */
export function isAppUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return u.protocol === `${APP_SCHEME}:` && u.host === APP_HOST;
  } catch {
    return false;
  }
}

/**
 * Navigation of the window to anything — even our own pages — is refused: the renderer is one
 * page that changes its view itself, so a navigation can only be a link or a script gone wrong.
 */
export const shouldBlockNavigation = (_url: string): true => true;

/** window.open / target=_blank: always denied (Electron's setWindowOpenHandler answer). */
export const denyWindowOpen = (): { action: 'deny' } => ({ action: 'deny' });

/** Camera, microphone, notifications, geolocation, …: the app needs none. */
export const allowPermission = (_permission: string): false => false;

/** The parts of an IPC event the sender check reads (Electron's IpcMainInvokeEvent). */
export interface SenderLike {
  readonly sender: unknown;
  readonly senderFrame: { readonly url: string } | null | undefined | unknown;
}

/** The parts of our window the check compares with. */
export interface TrustedWindowLike {
  readonly webContents: { readonly mainFrame: unknown };
}

/**
 * An IPC call is ours when it comes from our window's web contents, from its main frame (no
 * sub-frame), and that frame shows our page.
 */
export function isTrustedSender(event: SenderLike, win: TrustedWindowLike | undefined): boolean {
  if (!win) return false;
  const frame = event.senderFrame as { url?: unknown } | null | undefined;
  return (
    event.sender === win.webContents &&
    frame === win.webContents.mainFrame &&
    typeof frame?.url === 'string' &&
    isAppUrl(frame.url)
  );
}

export type AppRequestResult =
  | { readonly ok: true; readonly file: string; readonly headers: Readonly<Record<string, string>> }
  | { readonly ok: false; readonly status: 403 | 404; readonly reason: string };

const TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.woff2': 'font/woff2',
  '.map': 'application/json',
};

/**
 * Maps a `keepclear://app/…` request to a file of the built renderer, with the headers to send:
 * only that host, only files below `rootDir` (no `..`, no encoded escapes), known types only.
 */
export function resolveAppRequest(url: string, rootDir: string): AppRequestResult {
  let u: URL;
  try {
    u = new URL(url);
  } catch {
    return { ok: false, status: 403, reason: `not a URL: ${url}` };
  }
  if (u.protocol !== `${APP_SCHEME}:` || u.host !== APP_HOST) return { ok: false, status: 403, reason: `not our origin: ${u.origin}` };
  let path: string;
  try {
    path = decodeURIComponent(u.pathname);
  } catch {
    return { ok: false, status: 403, reason: `bad escape in ${u.pathname}` };
  }
  if (path.includes('\0')) return { ok: false, status: 403, reason: 'NUL in path' };
  const rel = normalize(path === '/' ? 'index.html' : path.replace(/^\/+/, ''));
  const file = join(rootDir, rel);
  const back = relative(rootDir, file);
  if (back.startsWith('..') || isAbsolute(back) || back.split(sep).includes('..')) {
    return { ok: false, status: 403, reason: `outside the renderer folder: ${path}` };
  }
  const dot = rel.lastIndexOf('.');
  const type = dot >= 0 ? TYPES[rel.slice(dot).toLowerCase()] : undefined;
  if (!type) return { ok: false, status: 404, reason: `no such page or asset: ${path}` };
  return {
    ok: true,
    file,
    headers: {
      'Content-Type': type,
      'Content-Security-Policy': CONTENT_SECURITY_POLICY,
      'X-Content-Type-Options': 'nosniff',
      'Cross-Origin-Opener-Policy': 'same-origin',
      'Referrer-Policy': 'no-referrer',
    },
  };
}

/** Privileges of our scheme (Electron's protocol.registerSchemesAsPrivileged): a secure, standard origin; no CORS bypass, no fetch from other origins. */
export const APP_SCHEME_PRIVILEGES = Object.freeze({
  standard: true,
  secure: true,
  supportFetchAPI: true,
  corsEnabled: false,
  bypassCSP: false,
  allowServiceWorkers: false,
  stream: false,
} as const);
