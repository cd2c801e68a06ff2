/**
 * Bad input: every case names the file and the 1-based line, says what is wrong, and the good
 * records around the bad one still import (fixtures and their provenance in
 * test/fixtures/malformed/README.md). Line numbers are read off the fixture files.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseElementFile } from '../core/formats/detect.js';
import { rejectionLine } from '../core/errors.js';

const DIR = new URL('./fixtures/malformed/', import.meta.url);
const load = (f: string) => parseElementFile(readFileSync(new URL(f, DIR)), f);

interface Case {
  file: string;
  format: string;
  code: string;
  line: number;
  reason: RegExp;
  good: string[];
}

const TLE_GOOD = ['6251', '28057'];
const OMM_GOOD = ['90001', '90003'];

const CASES: Case[] = [
  { file: 'bad-checksum.tle', format: 'TLE', code: 'TLE_CHECKSUM', line: 5,
    reason: /^line 1 checksum is 3 but columns 1-68 give 0 .*re-download/, good: TLE_GOOD },
  { file: 'shifted-columns.tle', format: 'TLE', code: 'TLE_COLUMNS', line: 6,
    reason: /^line 2 column 27-33 \(eccentricity\) is ' 000501': expected 7 digits/, good: TLE_GOOD },
  { file: 'truncated.tle', format: 'TLE', code: 'TLE_TRUNCATED', line: 6,
    reason: /^line 2 is 60 characters long, a TLE line has 69: the line is truncated/, good: TLE_GOOD },
  { file: 'non-ascii.tle', format: 'TLE', code: 'TLE_FIELD', line: 5,
    reason: /^line 1 column 15 has the non-ASCII character 'Á' \(U\+00C1\)/, good: TLE_GOOD },
  { file: 'tabs.tle', format: 'TLE', code: 'TLE_COLUMNS', line: 5,
    reason: /^line 1 has a tab at column 16: .*replace tabs with spaces/, good: TLE_GOOD },
  { file: 'mismatched-catalog.tle', format: 'TLE', code: 'TLE_FIELD', line: 6,
    reason: /^catalogue number on line 2 \(23582\) does not match line 1 \(23581\)/, good: TLE_GOOD },
  { file: 'missing-keyword.omm.kvn', format: 'OMM-KVN', code: 'OMM_MISSING_KEYWORD', line: 31,
    reason: /missing the mandatory keyword MEAN_MOTION /, good: OMM_GOOD },
  { file: 'missing-keyword.omm.xml', format: 'OMM-XML', code: 'OMM_MISSING_KEYWORD', line: 46,
    reason: /missing the mandatory keyword ECCENTRICITY /, good: OMM_GOOD },
  { file: 'missing-keyword.omm.json', format: 'OMM-JSON', code: 'OMM_MISSING_KEYWORD', line: 21,
    reason: /missing the mandatory keyword NORAD_CAT_ID /, good: OMM_GOOD },
  { file: 'eccentricity-ge-1.omm.kvn', format: 'OMM-KVN', code: 'VALUE_OUT_OF_RANGE', line: 44,
    reason: /^ECCENTRICITY is '1.0002': outside 0..1 \(exclusive\)/, good: OMM_GOOD },
  { file: 'negative-mean-motion.omm.csv', format: 'OMM-CSV', code: 'VALUE_OUT_OF_RANGE', line: 3,
    reason: /^MEAN_MOTION is '-1.00273272': mean motion must be greater than 0/, good: OMM_GOOD },
  { file: 'xml-syntax.omm.xml', format: 'OMM-XML', code: 'XML_SYNTAX', line: 69,
    reason: /^XML syntax error at line 69 .*INCLINAT/, good: OMM_GOOD },
];

describe('one bad record among good ones', () => {
  it.each(CASES)('$file → line $line, $code', (c) => {
    const r = load(c.file);
    expect(r.fatal).toBeNull();
    expect(r.format).toBe(c.format);
    expect(r.rejections).toHaveLength(1);
    const rej = r.rejections[0]!;
    expect(rej.code).toBe(c.code);
    expect(rejectionLine(rej).startsWith(`${c.file}:${c.line}: `)).toBe(true);
    expect(rej.reason).toMatch(c.reason);
    expect(r.sets.map((s) => s.objectId)).toEqual(c.good);
  });
});

describe('whole-file problems are fatal, with nothing else', () => {
  it('empty file', () => {
    const r = load('empty.tle');
    expect(r.sets).toEqual([]);
    expect(r.rejections).toEqual([]);
    expect(r.fatal?.code).toBe('FILE_EMPTY');
    expect(r.fatal?.toLine()).toMatch(/^empty\.tle:1: the file is empty/);
  });
  it('binary garbage', () => {
    const r = load('binary.bin');
    expect(r.sets).toEqual([]);
    expect(r.fatal?.code).toBe('NOT_TEXT');
    expect(r.fatal?.toLine()).toMatch(/^binary\.bin:1: the file is binary, not text \(a NUL byte at byte offset 5\)/);
  });
  it('invalid UTF-8 without NUL bytes', () => {
    const r = parseElementFile(new Uint8Array([0x31, 0x20, 0x0a, 0x41, 0xff, 0x42]), 'latin.tle');
    expect(r.fatal?.code).toBe('NOT_TEXT');
    expect(r.fatal?.toLine()).toMatch(/^latin\.tle:2: the file is not UTF-8 text \(invalid byte 0xff at byte offset 4\)/);
  });
});

describe('resynchronising after damaged structure', () => {
  const good = readFileSync(new URL('../formats/goes9.tle', DIR), 'utf8').split('\n');
  it('a lone line 1, a lone line 2 and a stray text line each get a rejection; the good set still imports', () => {
    const text = [good[2], good[1], 'junk', 'GOES 9', good[1], good[2]].join('\n');
    const r = parseElementFile(new TextEncoder().encode(text), 'r.tle');
    expect(r.format).toBe('TLE');
    expect(r.rejections.map((x) => [x.line, x.code])).toEqual([
      [1, 'TLE_LINE_ORDER'],
      [2, 'TLE_LINE_ORDER'],
      [3, 'TLE_LINE_ORDER'],
    ]);
    expect(r.sets.map((s) => [s.objectId, s.name, s.source.line])).toEqual([['23581', 'GOES 9', 4]]);
  });
});

describe('OMM values and JSON structure', () => {
  const kvn = readFileSync(new URL('../formats/goes9.omm.kvn', DIR), 'utf8');
  const enc = (s: string): Uint8Array => new TextEncoder().encode(s);
  it('a non-numeric value is rejected at its line', () => {
    const r = parseElementFile(enc(kvn.replace('INCLINATION = 3.0539', 'INCLINATION = 3,0539')), 'n.kvn');
    expect(r.sets).toEqual([]);
    expect(rejectionLine(r.rejections[0]!)).toMatch(/^n\.kvn:15: INCLINATION is '3,0539': expected a number/);
  });
  it('a JSON syntax error inside one object rejects that object only', () => {
    const obj = JSON.parse(readFileSync(new URL('../formats/goes9.omm.json', DIR), 'utf8'))[0];
    const one = (id: number): string => JSON.stringify({ ...obj, NORAD_CAT_ID: id });
    // Lines: 1 '[', 2..4 objects; the object on line 3 lost a comma between two members.
    const broken = one(90002).replace(',"OBJECT_ID"', ' "OBJECT_ID"');
    const json = ['[', one(90001) + ',', broken + ',', one(90003), ']'].join('\n');
    const r = parseElementFile(enc(json), 'j.json');
    expect(r.rejections.map((x) => [x.line, x.code])).toEqual([[3, 'JSON_SYNTAX']]);
    expect(r.rejections[0]?.reason).toMatch(/^JSON syntax error in the object starting here: /);
    expect(r.sets.map((s) => s.objectId)).toEqual(['90001', '90003']);
  });
});
