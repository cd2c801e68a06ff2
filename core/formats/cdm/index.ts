/**
 * CCSDS Conjunction Data Message (508.0-B-1), KVN and XML: `parseCdmFile` reads either syntax,
 * `formatCdmKvn` writes KVN. Import CDM things from here, not from the files inside.
 */
export { parseCdmFile } from './read.js';
export { buildCdm, type CdmParseResult, type CdmReadOptions } from './build.js';
export { parseCdmKvn } from './kvn.js';
export { parseCdmXml } from './xml.js';
export { formatCdmKvn } from './write.js';
export { hardBodyRadiusFromAreaPc } from './model.js';
export type * from './model.js';
