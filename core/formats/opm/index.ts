/** CCSDS OPM (502.0-B-2) in KVN: reader, writer and the message model. */
export { parseOpmKvn } from './opmRead.js';
export { formatOpmKvn } from './opmWrite.js';
export type { OpmManoeuvre, OpmMessage, OpmSpacecraft } from './opmModel.js';
