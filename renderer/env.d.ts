import type { BridgeApi } from '../core/bridge/contract.js';

declare global {
  interface Window {
    /** Set by electron/preload.ts, or by the browser client of `keepclear serve`. */
    readonly keepclear?: BridgeApi;
  }
}

export {};
