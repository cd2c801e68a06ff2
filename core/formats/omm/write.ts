/**
 * OMM writers (KVN, XML, JSON, CSV). Numbers are written with JavaScript's shortest
 * round-trip form so reading a written file gives back the same doubles; the epoch keeps
 * microseconds (see formatCcsdsEpoch).
 */
import type { ElementSet } from '../../elements/elementSet.js';
import { toIso } from '../../time/instant.js';
import { formatCcsdsEpoch } from '../ccsds-time.js';

export interface OmmHeader {
  readonly originator?: string;
  /** CREATION_DATE; defaults to now. Pass one for reproducible output. */
  readonly creationDate?: string;
}

type Row = [key: string, value: string | number, units?: string];

/** Metadata keywords this writer always states (values are what SGP4 elements are). */
const META: Row[] = [
  ['CENTER_NAME', 'EARTH'],
  ['REF_FRAME', 'TEME'],
  ['TIME_SYSTEM', 'UTC'],
  ['MEAN_ELEMENT_THEORY', 'SGP4'],
];

function bodyRows(s: ElementSet): { meanElements: Row[]; tle: Row[] } {
  return {
    meanElements: [
      ['EPOCH', formatCcsdsEpoch(s.epoch)],
      ['MEAN_MOTION', s.meanMotionRevPerDay, 'rev/day'],
      ['ECCENTRICITY', s.eccentricity],
      ['INCLINATION', s.inclinationDeg, 'deg'],
      ['RA_OF_ASC_NODE', s.raanDeg, 'deg'],
      ['ARG_OF_PERICENTER', s.argPerigeeDeg, 'deg'],
      ['MEAN_ANOMALY', s.meanAnomalyDeg, 'deg'],
    ],
    tle: [
      ['EPHEMERIS_TYPE', s.ephemerisType],
      ['CLASSIFICATION_TYPE', s.classification],
      ['NORAD_CAT_ID', Number(s.objectId)],
      ['ELEMENT_SET_NO', s.elementSetNo],
      ['REV_AT_EPOCH', s.revAtEpoch],
      ['BSTAR', s.bstar, '1/ER'],
      ['MEAN_MOTION_DOT', s.meanMotionDot, 'rev/day**2'],
      ['MEAN_MOTION_DDOT', s.meanMotionDdot, 'rev/day**3'],
    ],
  };
}

const header = (h: OmmHeader | undefined) => ({
  creationDate: h?.creationDate ?? toIso(Date.now() as never).replace('Z', ''),
  originator: h?.originator ?? 'KEEPCLEAR',
});

export function formatOmmKvn(sets: readonly ElementSet[], h?: OmmHeader): string {
  const { creationDate, originator } = header(h);
  const kv = ([k, v, u]: Row): string => `${k.padEnd(19)} = ${v}${u ? ` [${u}]` : ''}`;
  return sets
    .map((s) => {
      const b = bodyRows(s);
      return [
        kv(['CCSDS_OMM_VERS', '2.0']),
        kv(['CREATION_DATE', creationDate]),
        kv(['ORIGINATOR', originator]),
        '',
        kv(['OBJECT_NAME', s.name ?? '']),
        kv(['OBJECT_ID', s.intlDesignator ?? '']),
        ...META.map(kv),
        '',
        ...b.meanElements.map(kv),
        '',
        ...b.tle.map(kv),
        '',
      ].join('\n');
    })
    .join('\n');
}

const esc = (v: string | number): string =>
  String(v).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c] ?? c);

/** An <ndm> with one <omm> per set (NDM/XML combined instantiation, CCSDS 505.0). */
export function formatOmmXml(sets: readonly ElementSet[], h?: OmmHeader): string {
  const { creationDate, originator } = header(h);
  const el = ([k, v, u]: Row, indent: string): string =>
    `${indent}<${k}${u ? ` units="${esc(u)}"` : ''}>${esc(v)}</${k}>`;
  const omms = sets.map((s) => {
    const b = bodyRows(s);
    return [
      '  <omm id="CCSDS_OMM_VERS" version="2.0">',
      '    <header>',
      el(['CREATION_DATE', creationDate], '      '),
      el(['ORIGINATOR', originator], '      '),
      '    </header>',
      '    <body>',
      '      <segment>',
      '        <metadata>',
      el(['OBJECT_NAME', s.name ?? ''], '          '),
      el(['OBJECT_ID', s.intlDesignator ?? ''], '          '),
      ...META.map((r) => el(r, '          ')),
      '        </metadata>',
      '        <data>',
      '          <meanElements>',
      ...b.meanElements.map((r) => el(r, '            ')),
      '          </meanElements>',
      '          <tleParameters>',
      ...b.tle.map((r) => el(r, '            ')),
      '          </tleParameters>',
      '        </data>',
      '      </segment>',
      '    </body>',
      '  </omm>',
    ].join('\n');
  });
  return `<?xml version="1.0" encoding="UTF-8"?>\n<ndm>\n${omms.join('\n')}\n</ndm>\n`;
}

/** Flat keyword → value objects in the layout public providers distribute. */
function flat(s: ElementSet): Record<string, string | number> {
  const b = bodyRows(s);
  const o: Record<string, string | number> = {
    OBJECT_NAME: s.name ?? '',
    OBJECT_ID: s.intlDesignator ?? '',
  };
  for (const [k, v] of [...META, ...b.meanElements, ...b.tle]) o[k] = v;
  return o;
}

/** A JSON array, one object per line. */
export function formatOmmJson(sets: readonly ElementSet[]): string {
  return `[\n${sets.map((s) => JSON.stringify(flat(s))).join(',\n')}\n]\n`;
}

const csvCell = (v: string | number): string => {
  const t = String(v);
  return /[",\n\r]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
};

/** CSV with a header row of CCSDS keyword names (RFC 4180 quoting). */
export function formatOmmCsv(sets: readonly ElementSet[]): string {
  const rows = sets.map(flat);
  const keys = Object.keys(rows[0] ?? flat(PLACEHOLDER_KEYS));
  return [keys.join(','), ...rows.map((r) => keys.map((k) => csvCell(r[k] ?? '')).join(','))].join('\n') + '\n';
}

/** Only used for the header of an empty CSV: the key order, never the values. */
const PLACEHOLDER_KEYS: ElementSet = {
  objectId: '0', name: null, intlDesignator: null, classification: 'U', epoch: 0 as never,
  meanMotionRevPerDay: 1, eccentricity: 0, inclinationDeg: 0, raanDeg: 0, argPerigeeDeg: 0, meanAnomalyDeg: 0,
  bstar: 0, meanMotionDot: 0, meanMotionDdot: 0, elementSetNo: 0, revAtEpoch: 0, ephemerisType: 0,
  source: { file: '', line: 0, format: 'SYNTHETIC' },
};
