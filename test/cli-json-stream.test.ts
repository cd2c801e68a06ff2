/**
 * The streamed list writer (cli/present/json.ts) must write exactly what JSON.stringify(doc,
 * null, 2) writes (the reference: the JavaScript engine's own JSON.stringify), for empty and
 * non-empty lists, nested values and strings holding newlines, quotes and non-ASCII text.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { writeJsonListWithCaution, writeJsonWithCaution } from '../cli/present/json.js';

const dir = mkdtempSync(join(tmpdir(), 'keepclear-json-stream-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const item = (n: number) => ({
  id: `R1-${n}`,
  missKm: n / 3,
  rtnKm: [n, -n / 7, 1e-300],
  note: n % 2 ? 'line one\nline "two"\tµ ü' : null,
  nested: { empty: [], emptyObj: {}, deep: { list: [{ a: 1 }, [2, [3]]] } },
  skipped: undefined,
});

function both(items: ReturnType<typeof item>[], head: Record<string, unknown>): [string, string] {
  const a = join(dir, 'whole.json'), b = join(dir, 'streamed.json');
  writeJsonWithCaution(a, { ...head, events: items.map((x) => ({ ...x, extra: x.id })) });
  writeJsonListWithCaution(b, head, 'events', items, (x) => ({ ...x, extra: x.id }));
  return [readFileSync(a, 'utf8'), readFileSync(b, 'utf8')];
}

describe('writeJsonListWithCaution', () => {
  it('writes byte for byte what JSON.stringify writes', () => {
    const head = { run: { id: 'R1', flagged: [], settings: { days: 1, note: 'a\nb' } } };
    for (const n of [0, 1, 2, 5000]) {
      const [whole, streamed] = both(Array.from({ length: n }, (_, k) => item(k)), head);
      expect(streamed).toBe(whole);
    }
  });

  it('holds when the head is empty', () => {
    const [whole, streamed] = both([item(1), item(2)], {});
    expect(streamed).toBe(whole);
  });
});
