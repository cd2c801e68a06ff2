/** The event list's columns: header text with unit, sort key, and the cell text of a row. */
import type { EventRow } from '../../core/bridge/contract.js';
import { formatFixed, formatPc, formatUtc, NONE } from '../format.js';
import type { SortKey } from './listModel.js';

export interface Column {
  readonly id: string;
  readonly label: string;
  readonly sort: SortKey | null;
  readonly numeric: boolean;
  readonly text: (e: EventRow) => string;
}

export const COLUMNS: readonly Column[] = [
  { id: 'tier', label: 'Tier', sort: 'tier', numeric: false, text: () => '' },
  { id: 'tca', label: 'TCA (UTC)', sort: 'tca', numeric: false, text: (e) => formatUtc(e.tca) },
  { id: 'primary', label: 'Primary', sort: 'primary', numeric: false, text: (e) => e.primary },
  { id: 'secondary', label: 'Secondary', sort: 'secondary', numeric: false, text: (e) => e.secondary },
  { id: 'miss', label: 'Miss (km)', sort: 'missKm', numeric: true, text: (e) => formatFixed(e.missKm, 3) },
  { id: 'speed', label: 'Rel. speed (km/s)', sort: 'relativeSpeedKmS', numeric: true, text: (e) => formatFixed(e.relativeSpeedKmS, 2) },
  { id: 'pc', label: 'Pc', sort: 'pc', numeric: true, text: (e) => formatPc(e.pc) },
  { id: 'series', label: 'Series', sort: null, numeric: false, text: (e) => (e.seriesId ? `${e.seriesState ?? ''} · ${e.seriesId}` : NONE) },
];

/** Fixed row height (px) of the virtualised list; CSS .vrow matches it. */
export const ROW_HEIGHT_PX = 30;
