/**
 * Registers one `ipcMain.handle` per bridge channel. Each call is checked (sender, then the
 * request through the contract's validator) before the injected handler runs.
 * Electron is used for types only, so this file is testable without Electron.
 */
import type { IpcMain, IpcMainInvokeEvent } from 'electron';
import { CHANNELS, ipcChannelName, type BridgeHandlers, type BridgeReply } from '../core/bridge/contract.js';
import { dispatch } from '../core/bridge/dispatch.js';

/** Decides whether an IPC call comes from our own renderer page. */
export type SenderCheck = (event: IpcMainInvokeEvent) => boolean;

/** Registers the handlers; returns a function that removes them again. */
export function registerBridgeIpc(
  ipc: Pick<IpcMain, 'handle' | 'removeHandler'>,
  handlers: BridgeHandlers,
  isTrustedSender: SenderCheck,
): () => void {
  for (const channel of CHANNELS) {
    ipc.handle(ipcChannelName(channel), async (event, req: unknown): Promise<BridgeReply> => {
      if (!isTrustedSender(event)) {
        return { ok: false, error: { code: 'BAD_REQUEST', message: `bridge: ${channel}: call from an untrusted frame refused` } };
      }
      return dispatch(handlers, channel, req);
    });
  }
  return () => {
    for (const channel of CHANNELS) ipc.removeHandler(ipcChannelName(channel));
  };
}
