// Preloaded with `node --import` by test/cli-help.test.ts: records the URL of every module the
// process loads (ESM resolution, which also covers CommonJS packages imported from ESM) into the
// file named by KEEPCLEAR_LOAD_LOG.
import { register } from 'node:module';

register('./recordLoadsHooks.mjs', import.meta.url);
