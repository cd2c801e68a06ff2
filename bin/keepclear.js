#!/usr/bin/env node
// Entry of the `keepclear` command. The sources are TypeScript; tsx compiles them on load so
// `npx keepclear` works right after `npm ci` without a build step.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
