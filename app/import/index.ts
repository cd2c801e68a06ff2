/** The file-import service shared by the CLI, `keepclear serve` and the desktop app. */
export { importFiles, type ImportRequest } from './files.js';
export { importFile } from './file.js';
export { importMessageFile, isMessageFormat, type MessageFormat } from './messages.js';
export { importCdmFile, type CdmImportOutcome } from './cdm.js';
export { readInputFile, MAX_INPUT_BYTES } from './readInput.js';
export type { FileOutcome, FileImported, FileNotImported, ImportSummary } from './outcome.js';
