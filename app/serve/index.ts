/** `keepclear serve`: the renderer and the bridge over loopback HTTP (server.ts). */
export { startServe, SERVE_HOST, CONTENT_SECURITY_POLICY, MAX_BODY_BYTES, type ServeOptions, type RunningServer } from './server.js';
export { rendererDir } from './rendererDir.js';
