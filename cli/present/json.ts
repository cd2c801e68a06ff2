import { closeSync, openSync, writeFileSync, writeSync } from 'node:fs';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';

/**
 * Writes a JSON document that carries Pc or tiers, with the decision-aid note as its top-level
 * `caution` (DESIGN.md), to a file or to stdout for "-" (and nothing else goes to stdout then).
 */
export function writeJsonWithCaution(target: string, doc: Record<string, unknown>): void {
  const text = `${JSON.stringify({ caution: DECISION_AID_NOTE, ...doc }, null, 2)}\n`;
  if (target === '-') process.stdout.write(text);
  else writeFileSync(target, text);
}

/** What JSON.stringify({ e: [item] }, null, 2) puts around the item's text. */
const ITEM_OPEN = '{\n  "e": [\n';
const ITEM_CLOSE = '\n  ]\n}';
/** Bytes gathered before each write of a streamed document. */
const STREAM_CHUNK_CHARS = 1 << 20;

/**
 * writeJsonWithCaution of `{ ...head, [listKey]: items.map(toJson) }`, byte for byte, with the
 * list written item by item to a file: an all-vs-all run's 10⁵ events never exist at once as
 * JSON objects or as one string (hundreds of MB). To stdout ("-") it writes the whole text as
 * writeJsonWithCaution does.
 */
export function writeJsonListWithCaution<T>(
  target: string,
  head: Record<string, unknown>,
  listKey: string,
  items: readonly T[],
  toJson: (item: T) => unknown,
): void {
  if (target === '-') {
    writeJsonWithCaution(target, { ...head, [listKey]: items.map(toJson) });
    return;
  }
  // The document without the list, opened after its last member: "{\n  …\n}" less the "\n}".
  const opening = JSON.stringify({ caution: DECISION_AID_NOTE, ...head }, null, 2);
  const fd = openSync(target, 'w');
  try {
    let buf = `${opening.slice(0, -2)},\n  ${JSON.stringify(listKey)}: [`;
    if (items.length === 0) buf += ']';
    for (let n = 0; n < items.length; n++) {
      // An item at depth 2, indented by JSON.stringify itself: the only element of a list in a
      // one-key object, cut out of "{\n  "e": [\n" … "\n  ]\n}".
      const text = JSON.stringify({ e: [toJson(items[n]!)] }, null, 2);
      buf += `${n === 0 ? '' : ','}\n${text.slice(ITEM_OPEN.length, text.length - ITEM_CLOSE.length)}`;
      if (buf.length >= STREAM_CHUNK_CHARS) {
        writeSync(fd, buf);
        buf = '';
      }
    }
    if (items.length > 0) buf += '\n  ]';
    writeSync(fd, `${buf}\n}\n`);
  } finally {
    closeSync(fd);
  }
}
