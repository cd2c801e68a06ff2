import { appendFileSync } from 'node:fs';

export async function resolve(specifier, context, nextResolve) {
  const result = await nextResolve(specifier, context);
  const log = process.env.KEEPCLEAR_LOAD_LOG;
  if (log) appendFileSync(log, `${result.url}\n`);
  return result;
}
