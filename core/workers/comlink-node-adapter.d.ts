// comlink ships its Node adapter's types as node-adapter.d.ts next to node-adapter.mjs, which
// TypeScript's NodeNext resolution does not pair up; this re-declares them for that path.
declare module 'comlink/dist/esm/node-adapter.mjs' {
  import type { Endpoint } from 'comlink';
  export interface NodeEndpoint {
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    postMessage(message: any, transfer?: any[]): void;
    // Node's MessagePort and Worker take listeners of their own event types.
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    on(type: string, listener: (...args: any[]) => void): unknown;
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    off(type: string, listener: (...args: any[]) => void): unknown;
    start?: () => void;
  }
  export default function nodeEndpoint(nep: NodeEndpoint): Endpoint;
}
