/**
 * The serving side of the bridge, shared by every transport (Electron IPC now, the loopback
 * HTTP/WebSocket host of `keepclear serve` later): validate, call the handler, turn the result
 * or the error into a BridgeReply. Nothing thrown escapes.
 */
import { KeepclearError } from '../errors.js';
import {
  validateRequest,
  type BridgeFailure,
  type BridgeHandlers,
  type BridgeReply,
  type Channel,
  type Req,
  type Res,
} from './contract.js';

function failureOf(err: unknown, channel: Channel): BridgeFailure {
  if (err instanceof KeepclearError) {
    const code = err.code === 'NOT_FOUND' ? 'NOT_FOUND' : err.code === 'BAD_ARGUMENT' ? 'BAD_REQUEST' : 'INTERNAL';
    return { code, message: `${channel}: ${err.toLine()}` };
  }
  const message = err instanceof Error ? err.message : String(err);
  return { code: 'INTERNAL', message: `${channel}: ${message}` };
}

function call<C extends Channel>(handlers: BridgeHandlers, channel: C, req: Req<C>): Promise<Res<C>> | Res<C> {
  // The mapped type pairs each channel with its handler; TS cannot follow that through a union.
  const handler = handlers[channel] as (r: Req<C>) => Promise<Res<C>> | Res<C>;
  return handler(req);
}

/** Validates `channel` and `req` (both untrusted) and runs the matching handler. */
export async function dispatch(handlers: BridgeHandlers, channel: unknown, req: unknown): Promise<BridgeReply> {
  const checked = validateRequest(channel, req);
  if (!checked.ok) return { ok: false, error: checked.error };
  try {
    const value = await call(handlers, checked.channel, checked.req);
    return { ok: true, value };
  } catch (err) {
    return { ok: false, error: failureOf(err, checked.channel) };
  }
}
