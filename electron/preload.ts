/**
 * Preload (sandboxed, bundled to one CommonJS file): exposes `window.keepclear.invoke` and
 * nothing else. Only the contract's channels pass; requests are checked here too, so a bad call
 * fails in the renderer with a clear message before it crosses to the main process.
 */
import { contextBridge, ipcRenderer } from 'electron';
import { BridgeCallError, unwrapReply } from '../core/bridge/client.js';
import { ipcChannelName, validateRequest, type BridgeApi, type Channel, type Req, type Res } from '../core/bridge/contract.js';

const api: BridgeApi = {
  async invoke<C extends Channel>(channel: C, req: Req<C>): Promise<Res<C>> {
    const checked = validateRequest(channel, req);
    if (!checked.ok) throw new BridgeCallError(checked.error);
    const reply: unknown = await ipcRenderer.invoke(ipcChannelName(checked.channel), checked.req);
    return unwrapReply<C>(reply);
  },
};

contextBridge.exposeInMainWorld('keepclear', api);
