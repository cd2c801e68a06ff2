import { toIso, type Instant } from '../core/time/instant.js';

/** "FILE (OEM, created ISO)": how runs, JSON and the terminal name an owner ephemeris used. */
export const describeEphemeris = (e: { readonly fileName: string; readonly creationDate: Instant }): string =>
  `${e.fileName} (OEM, created ${toIso(e.creationDate)})`;
