/**
 * SGP4 initialisation for near-Earth orbits into a fixed-shape record, allocating nothing.
 *
 * A port of satellite.js 7.1.0's `sgp4init` and `initl` (node_modules/satellite.js/dist/
 * propagation/sgp4init.js, initl.js; MIT License, Copyright (C) 2013 Shashwat Kandadai, UCSC
 * Jack Baskin School of Engineering — full notice in sgp4Kernel.ts), restricted to the case
 * satellite.js gives method 'n' (period < 225 min after initl's un-Kozai'd mean motion). The
 * arithmetic is the same, in the same order, so every record field is the same double
 * (test/sgp4-init-kernel.test.ts). satellite.js grows each record by ~100 property additions on
 * a plain object and allocates initl's options and result; profiles of screening showed that
 * plus the garbage it makes as the largest per-object cost. Here one class declares every field
 * in one order (one hidden class) and initl's results stay locals. Deep-space orbits are handed
 * to satellite.js's sgp4init unchanged (the decision is taken exactly where satellite.js takes it,
 * on the same values, before anything is written), and its record is copied into the class.
 */
import { constants, gstime, type SatRec } from 'satellite.js';
import type { SatRecInit } from '../../node_modules/satellite.js/dist/propagation/SatRec.js';
// Not exported by the package; a file path bypasses the export map (as in sgp4.ts).
import { sgp4init } from '../../node_modules/satellite.js/dist/propagation/sgp4init.js';
import { sgp4Into } from './sgp4Kernel.js';

const { earthRadius, j2, j3oj2, j4, pi, tumin, twoPi, x2o3, xke } = constants;

/** Every field satellite.js's makeSatrec + sgp4init + sgp4 put on a record, in that order. */
export class Sgp4Record implements SatRec {
  error = 0;
  satnum = '';
  epochyr = 0;
  epochdays = 0;
  ndot = 0;
  nddot = 0;
  bstar = 0;
  inclo = 0;
  nodeo = 0;
  ecco = 0;
  argpo = 0;
  mo = 0;
  no = 0;
  jdsatepoch = 0;
  isimp = 0;
  method: 'n' | 'd' = 'n';
  aycof = 0; con41 = 0; cc1 = 0; cc4 = 0; cc5 = 0; d2 = 0; d3 = 0; d4 = 0; delmo = 0; eta = 0;
  argpdot = 0; omgcof = 0; sinmao = 0; t = 0; t2cof = 0; t3cof = 0; t4cof = 0; t5cof = 0;
  x1mth2 = 0; x7thm1 = 0; mdot = 0; nodedot = 0; xlcof = 0; xmcof = 0; nodecf = 0;
  irez = 0;
  d2201 = 0; d2211 = 0; d3210 = 0; d3222 = 0; d4410 = 0; d4422 = 0; d5220 = 0; d5232 = 0;
  d5421 = 0; d5433 = 0; dedt = 0; del1 = 0; del2 = 0; del3 = 0; didt = 0; dmdt = 0; dnodt = 0;
  domdt = 0; e3 = 0; ee2 = 0; peo = 0; pgho = 0; pho = 0; pinco = 0; plo = 0; se2 = 0; se3 = 0;
  sgh2 = 0; sgh3 = 0; sgh4 = 0; sh2 = 0; sh3 = 0; si2 = 0; si3 = 0; sl2 = 0; sl3 = 0; sl4 = 0;
  gsto = 0; xfact = 0; xgh2 = 0; xgh3 = 0; xgh4 = 0; xh2 = 0; xh3 = 0; xi2 = 0; xi3 = 0;
  xl2 = 0; xl3 = 0; xl4 = 0; xlamo = 0; zmol = 0; zmos = 0; atime = 0; xli = 0; xni = 0;
  nokozai = 0;
  operationmode: 'a' | 'i' = 'i';
  init: 'y' | 'n' = 'y';
  a = 0;
  alta = 0;
  altp = 0;
  tempa = 0;
  /** In satellite.js's SatRec type, set only by its TLE reader; never read by SGP4. */
  epochtynumrev = 0;
}

/** Scratch for the closing sgp4 call at t = 0 (satellite.js discards that state too). */
const scratch = new Float64Array(6);

/**
 * Initialises `rec`, whose input fields (satnum .. jdsatepoch, as satellite.js's SatRecInit) are
 * set, for SGP4 — sgp4init(rec, {opsmode, epoch, x* = rec's fields}), and returns it. A
 * near-Earth orbit is initialised here; a deep-space one in a plain record built from the same
 * inputs by satellite.js's own sgp4init, then copied into `rec`. `epoch`: days from 1949 Dec 31 0h.
 * Error codes are satellite.js's: sgp4init itself sets none (its code 5 check is commented
 * out), the closing sgp4 at t = 0 may.
 */
export function sgp4InitRecord(rec: Sgp4Record, opsmode: 'a' | 'i', epoch: number): SatRec {
  const ecco = rec.ecco, inclo = rec.inclo, argpo = rec.argpo, mo = rec.mo, bstar = rec.bstar;
  const xno = rec.no;
  // ------------------------------ initl ------------------------------
  const eccsq = ecco * ecco;
  const omeosq = 1.0 - eccsq;
  const rteosq = Math.sqrt(omeosq);
  const cosio = Math.cos(inclo);
  const cosio2 = cosio * cosio;
  const ak = (xke / xno) ** x2o3;
  const d1 = (0.75 * j2 * (3.0 * cosio2 - 1.0)) / (rteosq * omeosq);
  let delPrime = d1 / (ak * ak);
  const adel = ak * (1.0 - delPrime * delPrime - delPrime * (1.0 / 3.0 + (134.0 * delPrime * delPrime) / 81.0));
  delPrime = d1 / (adel * adel);
  const no = xno / (1.0 + delPrime);
  // satellite.js's test, on the same value, moved ahead of the near-Earth terms (which do not
  // depend on it): deep space goes to satellite.js whole.
  if ((omeosq >= 0.0 || no >= 0.0) && (2 * pi) / no >= 225.0) return deepSpace(rec, opsmode, epoch);
  const ao = (xke / no) ** x2o3;
  const sinio = Math.sin(inclo);
  const po = ao * omeosq;
  const con42 = 1.0 - 5.0 * cosio2;
  const con41 = -con42 - cosio2 - cosio2;
  const posq = po * po;
  const rp = ao * (1.0 - ecco);
  let gsto: number;
  if (opsmode === 'a') {
    const ts70 = epoch - 7305.0;
    const ds70 = Math.floor(ts70 + 1.0e-8);
    const tfrac = ts70 - ds70;
    const c1 = 1.72027916940703639e-2;
    const thgr70 = 1.7321343856509374;
    const fk5r = 5.07551419432269442e-15;
    const c1p2p = c1 + twoPi;
    gsto = (thgr70 + c1 * ds70 + c1p2p * tfrac + ts70 * ts70 * fk5r) % twoPi;
    if (gsto < 0.0) gsto += twoPi;
  } else {
    gsto = gstime(epoch + 2433281.5);
  }
  // ---------------------------- sgp4init -----------------------------
  const temp4 = 1.5e-12;
  rec.isimp = 0;
  rec.method = 'n';
  rec.aycof = 0.0; rec.con41 = 0.0; rec.cc1 = 0.0; rec.cc4 = 0.0; rec.cc5 = 0.0; rec.d2 = 0.0;
  rec.d3 = 0.0; rec.d4 = 0.0; rec.delmo = 0.0; rec.eta = 0.0; rec.argpdot = 0.0; rec.omgcof = 0.0;
  rec.sinmao = 0.0; rec.t = 0.0; rec.t2cof = 0.0; rec.t3cof = 0.0; rec.t4cof = 0.0; rec.t5cof = 0.0;
  rec.x1mth2 = 0.0; rec.x7thm1 = 0.0; rec.mdot = 0.0; rec.nodedot = 0.0; rec.xlcof = 0.0;
  rec.xmcof = 0.0; rec.nodecf = 0.0;
  // Deep-space fields stay at the constructor's zeros (satellite.js zeroes them too).
  rec.nokozai = xno;
  rec.operationmode = opsmode;
  const ss = 78.0 / earthRadius + 1.0;
  const qzms2ttemp = (120.0 - 78.0) / earthRadius;
  const qzms2t = qzms2ttemp * qzms2ttemp * qzms2ttemp * qzms2ttemp;
  rec.init = 'y';
  rec.no = no;
  rec.con41 = con41;
  rec.gsto = gsto;
  rec.a = (no * tumin) ** (-2.0 / 3.0);
  rec.alta = rec.a * (1.0 + ecco) - 1.0;
  rec.altp = rec.a * (1.0 - ecco) - 1.0;
  rec.error = 0;
  if (omeosq >= 0.0 || no >= 0.0) {
    let isimp = 0;
    if (rp < 220.0 / earthRadius + 1.0) isimp = 1;
    rec.isimp = isimp;
    let sfour = ss;
    let qzms24 = qzms2t;
    const perige = (rp - 1.0) * earthRadius;
    if (perige < 156.0) {
      sfour = perige - 78.0;
      if (perige < 98.0) sfour = 20.0;
      const qzms24temp = (120.0 - sfour) / earthRadius;
      qzms24 = qzms24temp * qzms24temp * qzms24temp * qzms24temp;
      sfour = sfour / earthRadius + 1.0;
    }
    const pinvsq = 1.0 / posq;
    const tsi = 1.0 / (ao - sfour);
    const eta = ao * ecco * tsi;
    rec.eta = eta;
    const etasq = eta * eta;
    const eeta = ecco * eta;
    const psisq = Math.abs(1.0 - etasq);
    const coef = qzms24 * tsi ** 4.0;
    const coef1 = coef / psisq ** 3.5;
    const cc2 =
      coef1 * no * (ao * (1.0 + 1.5 * etasq + eeta * (4.0 + etasq)) +
        ((0.375 * j2 * tsi) / psisq) * con41 * (8.0 + 3.0 * etasq * (8.0 + etasq)));
    const cc1 = bstar * cc2;
    rec.cc1 = cc1;
    let cc3 = 0.0;
    if (ecco > 1.0e-4) cc3 = (-2.0 * coef * tsi * j3oj2 * no * sinio) / ecco;
    const x1mth2 = 1.0 - cosio2;
    rec.x1mth2 = x1mth2;
    rec.cc4 =
      2.0 * no * coef1 * ao * omeosq *
      (eta * (2.0 + 0.5 * etasq) +
        ecco * (0.5 + 2.0 * etasq) -
        ((j2 * tsi) / (ao * psisq)) *
          (-3.0 * con41 * (1.0 - 2.0 * eeta + etasq * (1.5 - 0.5 * eeta)) +
            0.75 * x1mth2 * (2.0 * etasq - eeta * (1.0 + etasq)) * Math.cos(2.0 * argpo)));
    rec.cc5 = 2.0 * coef1 * ao * omeosq * (1.0 + 2.75 * (etasq + eeta) + eeta * etasq);
    const cosio4 = cosio2 * cosio2;
    const temp1 = 1.5 * j2 * pinvsq * no;
    const temp2 = 0.5 * temp1 * j2 * pinvsq;
    const temp3 = -0.46875 * j4 * pinvsq * pinvsq * no;
    rec.mdot =
      no + 0.5 * temp1 * rteosq * con41 + 0.0625 * temp2 * rteosq * (13.0 - 78.0 * cosio2 + 137.0 * cosio4);
    rec.argpdot =
      -0.5 * temp1 * con42 +
      0.0625 * temp2 * (7.0 - 114.0 * cosio2 + 395.0 * cosio4) +
      temp3 * (3.0 - 36.0 * cosio2 + 49.0 * cosio4);
    const xhdot1 = -temp1 * cosio;
    rec.nodedot = xhdot1 + (0.5 * temp2 * (4.0 - 19.0 * cosio2) + 2.0 * temp3 * (3.0 - 7.0 * cosio2)) * cosio;
    rec.omgcof = bstar * cc3 * Math.cos(argpo);
    rec.xmcof = 0.0;
    if (ecco > 1.0e-4) rec.xmcof = (-x2o3 * coef * bstar) / eeta;
    rec.nodecf = 3.5 * omeosq * xhdot1 * cc1;
    rec.t2cof = 1.5 * cc1;
    if (Math.abs(cosio + 1.0) > 1.5e-12) {
      rec.xlcof = (-0.25 * j3oj2 * sinio * (3.0 + 5.0 * cosio)) / (1.0 + cosio);
    } else {
      rec.xlcof = (-0.25 * j3oj2 * sinio * (3.0 + 5.0 * cosio)) / temp4;
    }
    rec.aycof = -0.5 * j3oj2 * sinio;
    const delmotemp = 1.0 + eta * Math.cos(mo);
    rec.delmo = delmotemp * delmotemp * delmotemp;
    rec.sinmao = Math.sin(mo);
    rec.x7thm1 = 7.0 * cosio2 - 1.0;
    if (isimp !== 1) {
      const cc1sq = cc1 * cc1;
      const d2 = 4.0 * ao * tsi * cc1sq;
      const temp = (d2 * tsi * cc1) / 3.0;
      const d3 = (17.0 * ao + sfour) * temp;
      const d4 = 0.5 * temp * ao * tsi * (221.0 * ao + 31.0 * sfour) * cc1;
      rec.d2 = d2;
      rec.d3 = d3;
      rec.d4 = d4;
      rec.t3cof = d2 + 2.0 * cc1sq;
      rec.t4cof = 0.25 * (3.0 * d3 + cc1 * (12.0 * d2 + 10.0 * cc1sq));
      rec.t5cof = 0.2 * (3.0 * d4 + 12.0 * cc1 * d3 + 6.0 * d2 * d2 + 15.0 * cc1sq * (2.0 * d2 + cc1sq));
    }
  }
  // satellite.js: sgp4(satrec, 0) (sets t, error, tempa); the kernel is bit-identical to it.
  sgp4Into(rec, 0, scratch, 0);
  rec.init = 'n';
  return rec;
}

/** satellite.js's path as makeSatrec took it before this kernel: a plain record, its sgp4init; then copied into `rec`. */
function deepSpace(rec: Sgp4Record, opsmode: 'a' | 'i', epoch: number): SatRec {
  const plain: SatRecInit = {
    error: 0,
    satnum: rec.satnum,
    epochyr: rec.epochyr,
    epochdays: rec.epochdays,
    ndot: rec.ndot,
    nddot: rec.nddot,
    bstar: rec.bstar,
    inclo: rec.inclo,
    nodeo: rec.nodeo,
    ecco: rec.ecco,
    argpo: rec.argpo,
    mo: rec.mo,
    no: rec.no,
    jdsatepoch: rec.jdsatepoch,
  };
  sgp4init(plain, {
    opsmode,
    satn: plain.satnum,
    epoch,
    xbstar: plain.bstar,
    xecco: plain.ecco,
    xargpo: plain.argpo,
    xinclo: plain.inclo,
    xmo: plain.mo,
    xno: plain.no,
    xnodeo: plain.nodeo,
  });
  // Copied back into `rec`, so that every record sgp4Into reads has the one hidden class and its
  // reads of the record stay monomorphic (satellite.js's plain records are shaped by their own
  // property additions). The values are the same doubles, and every field of the plain record
  // is one the class declares (test/sgp4-init-kernel.test.ts). Its own effect on speed was not
  // told apart from the noise; it went in with the unboxed deep-space outputs of sgp4Kernel.ts.
  Object.assign(rec, plain);
  return rec;
}
