/** Two-line element sets: the reader, the writer and the field encodings they share. */
export { parseTle, type TleOptions } from './read.js';
export { formatTle, formatTleRecord, formatTleFile } from './write.js';
export { ALPHA5_MAX, decodeCatalogNumber, encodeCatalogNumber } from './fields.js';
