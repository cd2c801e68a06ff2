/** CCSDS Orbit Mean-elements Message (502.0-B-2) in KVN, XML, JSON and CSV: readers and writers. */
export { parseOmmKvn } from './kvn.js';
export { parseOmmXml } from './xml.js';
export { parseOmmJson } from './json.js';
export { parseOmmCsv } from './csv.js';
export { formatOmmKvn, formatOmmXml, formatOmmJson, formatOmmCsv, type OmmHeader } from './write.js';
