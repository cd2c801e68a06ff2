/**
 * formatCdmKvn writes what the readers read: parse → write → parse gives the same model (source
 * lines aside), for the CCSDS 508.0-B-1 examples (test/authorities/ccsds-508) and our fixtures.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { formatCdmKvn, parseCdmFile, parseCdmKvn, type Cdm } from '../core/formats/cdm/index.js';

const files = [
  new URL('./authorities/ccsds-508/cdm-obligatory.kvn', import.meta.url),
  new URL('./authorities/ccsds-508/cdm-full.kvn', import.meta.url),
  new URL('./fixtures/cdm/valid-6x6.kvn', import.meta.url),
  new URL('./fixtures/cdm/cov-9x9.kvn', import.meta.url),
  new URL('./fixtures/cdm/slightly-not-psd.kvn', import.meta.url),
];

/** The model without source line numbers, which a rewrite changes by design. */
const withoutLines = (cdm: Cdm): unknown =>
  JSON.parse(JSON.stringify(cdm, (k, v: unknown) => (k === 'lines' || k === 'line' ? undefined : v)));

describe('KVN round trip', () => {
  for (const url of files) {
    const name = url.pathname.split('/').at(-1)!;
    it(name, () => {
      const first = parseCdmFile(readFileSync(url), name, { badCovariance: 'flag' });
      expect(first.errors).toEqual([]);
      const text = formatCdmKvn(first.cdm!);
      const second = parseCdmKvn(text, 'rewritten.kvn', { badCovariance: 'flag' });
      expect(second.errors).toEqual([]);
      expect(withoutLines(second.cdm!)).toEqual(withoutLines(first.cdm!));
      expect(formatCdmKvn(second.cdm!)).toBe(text);
    });
  }

  it('writes units in brackets and the version line first', () => {
    const cdm = parseCdmFile(readFileSync(files[1]!), 'cdm-full.kvn', { badCovariance: 'flag' }).cdm!;
    const lines = formatCdmKvn(cdm).split('\n');
    expect(lines[0]).toMatch(/^CCSDS_CDM_VERS\s+= 1\.0$/);
    expect(lines).toContain('MISS_DISTANCE                = 715 [m]');
    expect(lines).toContain('CDRG_DRG                     = 3.483E-6 [m**4/kg**2]');
    expect(lines).toContain('CN_T                         = -758.88 [m**2]');
  });

  it('XML example rewritten as KVN keeps every value', () => {
    const url = new URL('./authorities/ccsds-508/cdm-example.xml', import.meta.url);
    const xml = parseCdmFile(readFileSync(url), 'cdm-example.xml', { badCovariance: 'flag' }).cdm!;
    const kvn = parseCdmKvn(formatCdmKvn(xml), 'from-xml.kvn', { badCovariance: 'flag' }).cdm!;
    // XML keeps <data> comments apart; KVN cannot tell them from the OD parameters' comments.
    for (const o of [xml.object1, xml.object2]) {
      o.od.comments = [...o.dataComments, ...o.od.comments];
      o.dataComments = [];
    }
    expect(withoutLines(kvn)).toEqual(withoutLines(xml));
  });
});
