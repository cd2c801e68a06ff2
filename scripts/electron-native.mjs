#!/usr/bin/env node
// Builds better-sqlite3's native module for Electron's ABI into build/electron-native/,
// leaving node_modules/better-sqlite3 (built for Node: the CLI, `keepclear serve`, the tests)
// untouched. The desktop app loads the result through better-sqlite3's `nativeBinding` option
// (electron/nativeBinding.ts); electron-builder.yml ships it as resources/native/.
//
// How: copy the package to build/electron-native/node_modules/better-sqlite3, then inside that
// copy fetch the prebuilt binary for Electron with better-sqlite3's own installer
// (prebuild-install, already in node_modules as its dependency); when no prebuilt binary fits,
// compile it there with @electron/rebuild (needs a C++ toolchain). Needs internet.
//
//   node scripts/electron-native.mjs                                (this machine's platform/arch)
//   KEEPCLEAR_NATIVE_PLATFORM=win32 KEEPCLEAR_NATIVE_ARCH=x64 node scripts/electron-native.mjs
import { spawnSync } from 'node:child_process';
import { copyFileSync, cpSync, existsSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const require = createRequire(import.meta.url);
const pkg = require(join(ROOT, 'package.json'));
const electronVersion = pkg.optionalDependencies?.electron;
const sqliteVersion = pkg.dependencies?.['better-sqlite3'];
if (!/^\d+\.\d+\.\d+$/.test(electronVersion ?? '') || !/^\d+\.\d+\.\d+$/.test(sqliteVersion ?? '')) {
  console.error(`electron-native: package.json must pin electron and better-sqlite3 exactly (got ${electronVersion}, ${sqliteVersion})`);
  process.exit(1);
}
const platform = process.env.KEEPCLEAR_NATIVE_PLATFORM ?? process.platform;
const arch = process.env.KEEPCLEAR_NATIVE_ARCH ?? process.arch;
const OUT = join(ROOT, 'build', 'electron-native');
const copy = join(OUT, 'node_modules', 'better-sqlite3');

rmSync(OUT, { recursive: true, force: true });
mkdirSync(copy, { recursive: true });
const source = dirname(require.resolve('better-sqlite3/package.json', { paths: [ROOT] }));
// The sources and scripts of the package, not its Node build.
cpSync(source, copy, { recursive: true, filter: (p) => !p.startsWith(join(source, 'build')) });
writeFileSync(join(OUT, 'package.json'), JSON.stringify({ name: 'keepclear-electron-native', private: true, dependencies: { 'better-sqlite3': sqliteVersion } }, null, 2));

const built = join(copy, 'build', 'Release', 'better_sqlite3.node');
const prebuild = join(dirname(require.resolve('prebuild-install/package.json', { paths: [source, ROOT] })), 'bin.js');
console.log(`electron-native: better-sqlite3 ${sqliteVersion} for Electron ${electronVersion} (${platform}-${arch})`);
let r = spawnSync(process.execPath, [prebuild, '--runtime', 'electron', '--target', electronVersion, '--platform', platform, '--arch', arch, '--verbose'], { cwd: copy, stdio: 'inherit' });
if (r.status !== 0 || !existsSync(built)) {
  console.log('electron-native: no prebuilt binary; compiling with @electron/rebuild');
  r = spawnSync('npx', ['--yes', '@electron/rebuild@4.2.1', '--version', electronVersion, '--arch', arch, '--module-dir', OUT, '--only', 'better-sqlite3', '--force'], {
    cwd: OUT,
    stdio: 'inherit',
    shell: process.platform === 'win32',
  });
}
if (!existsSync(built)) {
  console.error(`electron-native: failed: ${built} was not produced`);
  process.exit(1);
}
copyFileSync(built, join(OUT, 'better_sqlite3.node'));
console.log(`electron-native: wrote ${join('build', 'electron-native', 'better_sqlite3.node')}`);
