/**
 * Registers one `ipcMain.handle` per bridge channel. Each call is checked (sender, then the
 * request through the contract's validator) before the injected handler runs.
 * The Electron types it needs are restated structurally below, so this file type-checks and is
 * testable on machines where the optional Electron package is not installed.
 */
import { CHANNELS, ipcChannelName, type BridgeHandlers, type BridgeReply } from '../core/bridge/contract.js';
import { dispatch } from '../core/bridge/dispatch.js';

/** The part of Electron's IpcMainInvokeEvent the sender check reads. */
export interface InvokeEventLike {
  readonly sender: unknown;
  readonly senderFrame: unknown;
}

/** The part of Electron's ipcMain used here. */
export interface IpcLike {
  handle(channel: string, listener: (event: InvokeEventLike, ...args: unknown[]) => Promise<unknown>): void;
  removeHandler(channel: string): void;
}

/** Decides whether an IPC call comes from our own renderer page. */
export type SenderCheck = (event: InvokeEventLike) => boolean;

/** Registers the handlers; returns a function that removes them again. */
export function registerBridgeIpc(
  ipc: IpcLike,
  handlers: BridgeHandlers,
  isTrustedSender: SenderCheck,
): () => void {
  for (const channel of CHANNELS) {
    ipc.handle(ipcChannelName(channel), async (event: InvokeEventLike, ...args: unknown[]): Promise<BridgeReply> => {
      if (!isTrustedSender(event)) {
        return { ok: false, error: { code: 'BAD_REQUEST', message: `bridge: ${channel}: call from an untrusted frame refused` } };
      }
      // The preload sends exactly one request object; anything else did not come through it.
      if (args.length !== 1) {
        return { ok: false, error: { code: 'BAD_REQUEST', message: `bridge: ${channel}: expected one request, got ${args.length} arguments` } };
      }
      return dispatch(handlers, channel, args[0]);
    });
  }
  return () => {
    for (const channel of CHANNELS) ipc.removeHandler(ipcChannelName(channel));
  };
}
