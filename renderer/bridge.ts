/**
 * The bridge as the page sees it: `window.keepclear` where the desktop app's preload put it,
 * else the loopback HTTP host of `keepclear serve` (token from the URL the command printed).
 * Job updates come pushed over server-sent events from serve; elsewhere they are polled.
 */
import { unwrapReply, BridgeCallError } from '../core/bridge/client.js';
import { validateRequest, type BridgeApi, type Channel, type JobStatus, type Req, type Res } from '../core/bridge/contract.js';

export interface PageBridge extends BridgeApi {
  /** calls `listener` with every job change; returns an unsubscribe function */
  onJob(listener: (s: JobStatus) => void): () => void;
  /** where the data comes from, for the header */
  readonly host: 'desktop' | 'serve';
}

const TOKEN_KEY = 'keepclear.token';
/** How often job status is read where nothing is pushed (desktop). */
const JOB_POLL_MS = 400;

/** The token from `?token=`, kept for this tab only and taken out of the address bar (so it is not bookmarked or shared by accident). */
function takeToken(): string | null {
  const url = new URL(window.location.href);
  const fromUrl = url.searchParams.get('token');
  if (fromUrl) {
    sessionStorage.setItem(TOKEN_KEY, fromUrl);
    url.searchParams.delete('token');
    history.replaceState(history.state, '', url.pathname + url.search + url.hash);
    return fromUrl;
  }
  return sessionStorage.getItem(TOKEN_KEY);
}

function httpBridge(token: string): PageBridge {
  const listeners = new Set<(s: JobStatus) => void>();
  let source: EventSource | null = null;
  const connect = (): void => {
    if (source) return;
    source = new EventSource(`./api/jobs/events?token=${encodeURIComponent(token)}`);
    source.addEventListener('job', (ev) => {
      const status = JSON.parse((ev as MessageEvent<string>).data) as JobStatus;
      for (const l of listeners) l(status);
    });
  };
  return {
    host: 'serve',
    async invoke<C extends Channel>(channel: C, req: Req<C>): Promise<Res<C>> {
      const checked = validateRequest(channel, req);
      if (!checked.ok) throw new BridgeCallError(checked.error);
      const res = await fetch('./api/bridge', {
        method: 'POST',
        headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
        body: JSON.stringify({ channel, request: req }),
        cache: 'no-store',
      });
      if (res.status === 401 || res.status === 403) {
        throw new BridgeCallError({ code: 'BAD_REQUEST', message: 'the server refused this page: open the URL that keepclear serve printed (with its token)' });
      }
      return unwrapReply<C>(await res.json());
    },
    onJob(listener) {
      listeners.add(listener);
      connect();
      return () => void listeners.delete(listener);
    },
  };
}

function desktopBridge(api: BridgeApi): PageBridge {
  const listeners = new Set<(s: JobStatus) => void>();
  const last = new Map<string, string>();
  let timer: ReturnType<typeof setInterval> | null = null;
  const poll = async (): Promise<void> => {
    const { jobs } = await api.invoke('jobs.list', {});
    for (const j of jobs) {
      const key = JSON.stringify([j.state, j.progress]);
      if (last.get(j.id) === key) continue;
      last.set(j.id, key);
      for (const l of listeners) l(j);
    }
  };
  return {
    host: 'desktop',
    invoke: (channel, req) => api.invoke(channel, req),
    onJob(listener) {
      listeners.add(listener);
      timer ??= setInterval(() => void poll().catch(() => undefined), JOB_POLL_MS);
      return () => void listeners.delete(listener);
    },
  };
}

export function pageBridge(): PageBridge | null {
  if (window.keepclear) return desktopBridge(window.keepclear);
  const token = takeToken();
  return token ? httpBridge(token) : null;
}
