/**
 * Small request checks shared by the contract's validators (contract.ts, jobContract.ts).
 * Each returns null when the value is acceptable, else what is wrong, in words that name the
 * field and the value received.
 */

/** null when acceptable, else what is wrong (without the channel prefix). */
export type Check = (req: unknown) => string | null;

/** ids are short ("R12", "R12-3", catalogue numbers); anything longer is not an id */
export const ID_MAX_LENGTH = 128;

export function describe(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'an array';
  if (typeof v === 'string') return `the string ${JSON.stringify(v.length > 40 ? `${v.slice(0, 40)}…` : v)}`;
  if (typeof v === 'number') return `the number ${v}`;
  return typeof v === 'object' ? 'an object' : `a ${typeof v}`;
}

export function isPlainObject(v: unknown): v is Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const proto: unknown = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
}

/** The request must be a plain object with no keys beyond `allowed` (typos are errors). */
export function objectWith(req: unknown, allowed: readonly string[]): string | null {
  if (!isPlainObject(req)) return `the request must be a plain object, got ${describe(req)}`;
  const extra = Object.keys(req).filter((k) => !allowed.includes(k));
  if (extra.length > 0) {
    const known = allowed.length > 0 ? `allowed: ${allowed.join(', ')}` : 'it takes no fields; send {}';
    return `unknown field${extra.length > 1 ? 's' : ''} ${extra.map((k) => `"${k}"`).join(', ')} (${known})`;
  }
  return null;
}

const CONTROL = /[\u0000-\u001f\u007f]/;

/** A short printable string (ids, names). */
export function idValue(v: unknown, key: string): string | null {
  if (typeof v !== 'string') return `"${key}" must be a string id, got ${describe(v)}`;
  if (v.length === 0) return `"${key}" must not be empty`;
  if (v.length > ID_MAX_LENGTH) return `"${key}" is ${v.length} characters long; ids have at most ${ID_MAX_LENGTH}`;
  if (CONTROL.test(v)) return `"${key}" contains control characters`;
  return null;
}

export function idField(req: Record<string, unknown>, key: string): string | null {
  return idValue(req[key], key);
}

export function withId(key: string): Check {
  return (req) => objectWith(req, [key]) ?? idField(req as Record<string, unknown>, key);
}

/** A finite number in [min, max] (inclusive), described by `what` in the message. */
export function numberIn(v: unknown, key: string, min: number, max: number, what: string): string | null {
  if (typeof v !== 'number' || !Number.isFinite(v) || v < min || v > max) return `"${key}" must be ${what}, got ${describe(v)}`;
  return null;
}

/** ISO 8601 UTC with `Z`, as every time on the bridge (2026-12-07T00:00:00.000Z; seconds' fraction optional). */
const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,9})?Z$/;

export function isoField(v: unknown, key: string): string | null {
  if (typeof v !== 'string' || !ISO_UTC.test(v) || !Number.isFinite(Date.parse(v))) {
    return `"${key}" must be an ISO 8601 UTC time such as 2026-12-07T00:00:00.000Z, got ${describe(v)}`;
  }
  return null;
}
