/**
 * The calling side of the bridge: turns a BridgeReply back into a value or a thrown
 * BridgeCallError. Used by electron/preload.ts (and later by the browser client of
 * `keepclear serve`).
 *
 * Errors that cross Electron's contextBridge keep only their message, so the code is also the
 * message's first word ("NOT_FOUND: events.get: no event \"R1-9\""); bridgeErrorCode() reads it
 * back on the renderer side.
 */
import {
  BRIDGE_ERROR_CODES,
  type BridgeErrorCode,
  type BridgeFailure,
  type Channel,
  type Res,
} from './contract.js';

export class BridgeCallError extends Error {
  readonly code: BridgeErrorCode;
  constructor(failure: BridgeFailure) {
    super(`${failure.code}: ${failure.message}`);
    this.name = 'BridgeCallError';
    this.code = failure.code;
  }
}

const isCode = (v: unknown): v is BridgeErrorCode =>
  typeof v === 'string' && (BRIDGE_ERROR_CODES as readonly string[]).includes(v);

/** Value of a reply, or throws BridgeCallError. A malformed reply is an INTERNAL error. */
export function unwrapReply<C extends Channel>(reply: unknown): Res<C> {
  if (typeof reply === 'object' && reply !== null) {
    const r = reply as { ok?: unknown; value?: unknown; error?: unknown };
    if (r.ok === true && 'value' in r) return r.value as Res<C>;
    if (r.ok === false && typeof r.error === 'object' && r.error !== null) {
      const e = r.error as { code?: unknown; message?: unknown };
      if (isCode(e.code) && typeof e.message === 'string') throw new BridgeCallError({ code: e.code, message: e.message });
    }
  }
  throw new BridgeCallError({ code: 'INTERNAL', message: 'bridge: malformed reply from the host' });
}

/** The bridge error code carried by an error's message, or null for other errors. */
export function bridgeErrorCode(err: unknown): BridgeErrorCode | null {
  const message = err instanceof Error ? err.message : typeof err === 'string' ? err : '';
  const first = /^([A-Z_]+):/.exec(message)?.[1];
  return isCode(first) ? first : null;
}
