/**
 * CPU time (process.cpuUsage) of SGP4 initialisation for the 30,000-set bench catalogue:
 * the fixed-shape kernel (sgp4InitRecord, as makeSatrec calls it) against satellite.js's
 * sgp4init on a plain record (makeSatrec before the kernel), alternating in one process, same
 * inputs (epoch handling done once beforehand; it is the same in both). Usage:
 *   flock /tmp/keepclear-bench.lock npx tsx bench/sgp4InitCpu.ts
 */
import type { SatRec } from 'satellite.js';
import type { SatRecInit } from '../node_modules/satellite.js/dist/propagation/SatRec.js';
import { sgp4init } from '../node_modules/satellite.js/dist/propagation/sgp4init.js';
import { makeSatrec } from '../core/propagation/sgp4.js';
import { Sgp4Record, sgp4InitRecord } from '../core/propagation/sgp4InitKernel.js';
import { generateCatalog } from '../core/synthetic/catalog.js';
import { BENCH_SEED, BENCH_START } from './catalogueDb.js';

const JD_1950 = 2433281.5;
const inputs: SatRec[] = generateCatalog({ size: 30_000, seed: BENCH_SEED, epoch: BENCH_START }).map(makeSatrec);

function kernel(): number {
  let n = 0;
  for (const k of inputs) {
    const rec = new Sgp4Record();
    rec.satnum = k.satnum; rec.epochyr = k.epochyr; rec.epochdays = k.epochdays; rec.ndot = k.ndot; rec.nddot = k.nddot;
    rec.bstar = k.bstar; rec.inclo = k.inclo; rec.nodeo = k.nodeo; rec.ecco = k.ecco; rec.argpo = k.argpo; rec.mo = k.mo;
    rec.no = k.nokozai; rec.jdsatepoch = k.jdsatepoch;
    n += sgp4InitRecord(rec, 'i', k.jdsatepoch - JD_1950).error;
  }
  return n;
}
function satelliteJs(): number {
  let n = 0;
  for (const k of inputs) {
    const rec: SatRecInit = {
      error: 0, satnum: k.satnum, epochyr: k.epochyr, epochdays: k.epochdays, ndot: k.ndot, nddot: k.nddot, bstar: k.bstar,
      inclo: k.inclo, nodeo: k.nodeo, ecco: k.ecco, argpo: k.argpo, mo: k.mo, no: k.nokozai, jdsatepoch: k.jdsatepoch,
    };
    sgp4init(rec, { opsmode: 'i', satn: rec.satnum, epoch: rec.jdsatepoch - JD_1950, xbstar: rec.bstar, xecco: rec.ecco,
      xargpo: rec.argpo, xinclo: rec.inclo, xmo: rec.mo, xno: rec.no, xnodeo: rec.nodeo });
    n += rec.error;
  }
  return n;
}
const cpuMs = (f: () => number): number => { const c = process.cpuUsage(); f(); const d = process.cpuUsage(c); return (d.user + d.system) / 1000; };
for (let r = 0; r < 5; r++) {
  const a = cpuMs(kernel), b = cpuMs(satelliteJs);
  console.log(`round ${r}: kernel ${a.toFixed(1)} ms CPU, satellite.js sgp4init ${b.toFixed(1)} ms CPU (${inputs.length} sets)`);
}
