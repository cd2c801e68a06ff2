import { randomBytes, timingSafeEqual } from 'node:crypto';

/** 256 random bits, URL-safe: the only thing between another local user's process and the data. */
export const newToken = (): string => randomBytes(32).toString('base64url');

/** Constant-time comparison, so the token cannot be guessed byte by byte from response times. */
export function sameToken(given: string, expected: string): boolean {
  const a = Buffer.from(given);
  const b = Buffer.from(expected);
  return a.length === b.length && timingSafeEqual(a, b);
}
