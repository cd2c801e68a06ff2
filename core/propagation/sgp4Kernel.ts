/**
 * SGP4/SDP4 propagation step that writes into caller-provided arrays and allocates nothing.
 *
 * A port of the `sgp4`, `dspace` and `dpper` functions of satellite.js 7.1.0
 * (node_modules/satellite.js/dist/propagation/sgp4.js, dspace.js, dpper.js), which are a
 * JavaScript translation of the reference code of Vallado, Crawford, Hujsak and Kelso,
 * "Revisiting Spacetrack Report #3", AIAA 2006-6753 (2006). The arithmetic is the same, in the
 * same order, so the results are the same doubles (test/sgp4-kernel.test.ts holds it to
 * satellite.js's own sgp4 over a synthetic catalogue and the 33 published verification sets).
 * Only the plumbing differs: satellite.js builds a 36-field options object for dspace, a
 * parameter and a result object for dpper and three result objects per call, which made SGP4
 * plus garbage collection the largest cost of screening; here the locals stay locals and the
 * results go into typed arrays. Initialisation: sgp4InitKernel.ts (near-Earth), satellite.js (deep space).
 *
 * satellite.js is distributed under the MIT License:
 *
 *   Copyright (C) 2013 Shashwat Kandadai, UCSC Jack Baskin School of Engineering
 *
 *   Permission is hereby granted, free of charge, to any person obtaining a copy
 *   of this software and associated documentation files (the "Software"), to deal
 *   in the Software without restriction, including without limitation the rights
 *   to use, copy, modify, merge, publish, distribute, sublicense, and/or sell
 *   copies of the Software, and to permit persons to whom the Software is
 *   furnished to do so, subject to the following conditions:
 *
 *   The above copyright notice and this permission notice shall be included in all
 *   copies or substantial portions of the Software.
 *
 *   THE SOFTWARE IS PROVIDED "AS IS", WITHOUT WARRANTY OF ANY KIND, EXPRESS OR
 *   IMPLIED, INCLUDING BUT NOT LIMITED TO THE WARRANTIES OF MERCHANTABILITY,
 *   FITNESS FOR A PARTICULAR PURPOSE AND NONINFRINGEMENT. IN NO EVENT SHALL THE
 *   AUTHORS OR COPYRIGHT HOLDERS BE LIABLE FOR ANY CLAIM, DAMAGES OR OTHER
 *   LIABILITY, WHETHER IN AN ACTION OF CONTRACT, TORT OR OTHERWISE, ARISING FROM,
 *   OUT OF OR IN CONNECTION WITH THE SOFTWARE OR THE USE OR OTHER DEALINGS IN THE
 *   SOFTWARE.
 *
 * State written back into the record: as satellite.js 7.1.0, `t`, `error`, `tempa`, and for
 * deep-space orbits `aycof`, `xlcof`, `con41`, `x1mth2`, `x7thm1`. One deliberate difference:
 * the resonance integrator's `atime`, `xli`, `xni`. satellite.js does not store them after a
 * call (its sgp4 keeps only em, argpm, inclm, mm, nodem, nm from dspace's result), so `atime`
 * stays 0 from sgp4init and every call integrates again from epoch in 720-min steps (at ten
 * days, 20 steps of 6 to 20 sines and cosines each: a half-day-resonant orbit then cost ~10
 * near-Earth calls). The C++ reference of Vallado et al. stores them, as done here, and
 * continues from the stored step when the next instant lies further from epoch on the same
 * side (it restarts otherwise, by the same test satellite.js applies). This changes no result:
 * each step is a function of the previous step's (xli, xni, atime) alone and atime advances by
 * exact multiples of 720, so continuing from step k gives the same doubles as marching again
 * from epoch through step k. test/sgp4-kernel.test.ts holds the outputs bit-identical to
 * satellite.js with instants in scrambled order (forward and backward jumps), which is what
 * would expose a difference. A record the kernel has used may also be given to satellite.js's
 * sgp4: it continues from the stored step by the same argument.
 */
import { constants, type SatRec } from 'satellite.js';

const { earthRadius, j2, j3oj2, pi, twoPi, vkmpersec, x2o3, xke } = constants;

/** Index of each mean element in the optional `mean` output (satellite.js meanElements names). */
export const MEAN_AM = 0; // semi-major axis, Earth radii
export const MEAN_EM = 1; // eccentricity
export const MEAN_IM = 2; // inclination, rad
export const MEAN_OM_NODE = 3; // right ascension of the ascending node (Om), rad
export const MEAN_OM_ARGP = 4; // argument of perigee (om), rad
export const MEAN_MM = 5; // mean anomaly, rad
export const MEAN_NM = 6; // mean motion, rad/min
/** Length of the mean-element output. */
export const MEAN_ELEMENT_COUNT = 7;

// satellite.js SatRecError values (sgp4.js return codes, Vallado et al. 2006).
const ERR_NONE = 0;
const ERR_MEAN_ECC = 1;
const ERR_MEAN_MOTION = 2;
const ERR_PERT_ECC = 3;
const ERR_SEMI_LATUS = 4;
const ERR_DECAYED = 6;

// dspace constants (dspace.js)
const fasx2 = 0.13130908;
const fasx4 = 2.8843198;
const fasx6 = 0.37448087;
const g22 = 5.7686396;
const g32 = 0.95240898;
const g44 = 1.8014998;
const g52 = 1.050833;
const g54 = 4.4108898;
const rptim = 4.37526908801129966e-3; // equates to 7.29211514668855e-5 rad/sec
const stepp = 720.0;
const stepn = -720.0;
const step2 = 259200.0;

// dpper constants (dpper.js)
const zns = 1.19459e-5;
const zes = 0.01675;
const znl = 1.5835218e-4;
const zel = 0.0549;

// Outputs of dspace and dpper: module-level scratch instead of result objects. Workers are
// single-threaded and neither function re-enters, so one set serves every call. Float64Arrays,
// not module-level `let`s: those hold boxed numbers, and merging them with sgp4Into's unboxed
// doubles after the deep-space branches made the optimised code box the near-Earth values too
// once a deep-space record had gone through it: ~11 heap numbers (176 bytes) per near-Earth
// call, and 0.96 µs a call instead of 0.50 µs (measured: a microbenchmark, V8's sampling heap
// profiler).
const DS = new Float64Array(6);
const DS_EM = 0, DS_ARGPM = 1, DS_INCLM = 2, DS_MM = 3, DS_NODEM = 4, DS_NM = 5;
const DP = new Float64Array(5);
const DP_EP = 0, DP_INCLP = 1, DP_NODEP = 2, DP_ARGPP = 3, DP_MP = 4;

/**
 * SGP4 of an initialised record at `tsince` minutes from epoch. On success writes position
 * (km, TEME) into pv[off..off+2], velocity (km/s, TEME) into pv[off+3..off+5], and when `mean`
 * is given the mean elements (am, em, im, Om, om, mm, nm as MEAN_* indices) into mean[0..6],
 * and returns 0. On failure returns satellite.js's error code (also left in satrec.error) and
 * writes nothing into pv or mean. Mean elements are written at the point satellite.js builds
 * its meanElements object, so they are only valid when 0 is returned.
 */
export function sgp4Into(satrec: SatRec, tsince: number, pv: Float64Array, off: number, mean?: Float64Array): number {
  let coseo1 = 0;
  let sineo1 = 0;
  let cosip: number;
  let sinip: number;
  let cosisq: number;
  let delm: number;
  let delomg: number;
  let eo1: number;
  let argpm: number;
  let argpp: number;
  let su: number;
  let t3: number;
  let t4: number;
  let tem5: number;
  let temp: number;
  let tempa: number;
  let tempe: number;
  let templ: number;
  let inclm: number;
  let mm: number;
  let nm: number;
  let nodem: number;
  let xincp: number;
  let xlm: number;
  let mp: number;
  let nodep: number;
  // sgp4fix divisor for divide by zero check on inclination (see sgp4.js)
  const temp4 = 1.5e-12;
  // --------------------- clear sgp4 error flag -----------------
  satrec.t = tsince;
  satrec.error = ERR_NONE;
  //  ------- update for secular gravity and atmospheric drag -----
  const xmdf = satrec.mo + satrec.mdot * satrec.t;
  const argpdf = satrec.argpo + satrec.argpdot * satrec.t;
  const nodedf = satrec.nodeo + satrec.nodedot * satrec.t;
  argpm = argpdf;
  mm = xmdf;
  const t2 = satrec.t * satrec.t;
  nodem = nodedf + satrec.nodecf * t2;
  tempa = 1.0 - satrec.cc1 * satrec.t;
  tempe = satrec.bstar * satrec.cc4 * satrec.t;
  templ = satrec.t2cof * t2;
  if (satrec.isimp !== 1) {
    delomg = satrec.omgcof * satrec.t;
    //  sgp4fix use mutliply for speed instead of pow
    const delmtemp = 1.0 + satrec.eta * Math.cos(xmdf);
    delm = satrec.xmcof * (delmtemp * delmtemp * delmtemp - satrec.delmo);
    temp = delomg + delm;
    mm = xmdf + temp;
    argpm = argpdf - temp;
    t3 = t2 * satrec.t;
    t4 = t3 * satrec.t;
    tempa = tempa - satrec.d2 * t2 - satrec.d3 * t3 - satrec.d4 * t4;
    tempe += satrec.bstar * satrec.cc5 * (Math.sin(mm) - satrec.sinmao);
    templ = templ + satrec.t3cof * t3 + t4 * (satrec.t4cof + satrec.t * satrec.t5cof);
  }
  satrec.tempa = tempa;
  nm = satrec.no;
  let em = satrec.ecco;
  inclm = satrec.inclo;
  const deep = satrec.method === 'd';
  if (deep) {
    dspace(satrec, satrec.t, satrec.t, em, argpm, inclm, mm, nodem, nm);
    em = DS[DS_EM]!;
    argpm = DS[DS_ARGPM]!;
    inclm = DS[DS_INCLM]!;
    mm = DS[DS_MM]!;
    nodem = DS[DS_NODEM]!;
    nm = DS[DS_NM]!;
  }
  if (nm <= 0.0) {
    satrec.error = ERR_MEAN_MOTION;
    return ERR_MEAN_MOTION;
  }
  const am = (xke / nm) ** x2o3 * tempa * tempa;
  nm = xke / am ** 1.5;
  em -= tempe;
  // fix tolerance for error recognition
  if (em >= 1.0 || em < -0.001) {
    satrec.error = ERR_MEAN_ECC;
    return ERR_MEAN_ECC;
  }
  //  sgp4fix fix tolerance to avoid a divide by zero
  if (em < 1.0e-6) {
    em = 1.0e-6;
  }
  mm += satrec.no * templ;
  xlm = mm + argpm + nodem;
  nodem %= twoPi;
  argpm %= twoPi;
  xlm %= twoPi;
  mm = (xlm - argpm - nodem) % twoPi;
  // satellite.js builds its meanElements object here; its values are final at this point.
  const meanAm = am, meanEm = em, meanIm = inclm, meanOm = nodem, meanArgp = argpm, meanMm = mm, meanNm = nm;
  // ----------------- compute extra mean quantities -------------
  const sinim = Math.sin(inclm);
  const cosim = Math.cos(inclm);
  // -------------------- add lunar-solar periodics --------------
  let ep = em;
  xincp = inclm;
  argpp = argpm;
  nodep = nodem;
  mp = mm;
  sinip = sinim;
  cosip = cosim;
  if (deep) {
    dpper(satrec, ep, xincp, nodep, argpp, mp, satrec.operationmode);
    ep = DP[DP_EP]!;
    nodep = DP[DP_NODEP]!;
    argpp = DP[DP_ARGPP]!;
    mp = DP[DP_MP]!;
    xincp = DP[DP_INCLP]!;
    if (xincp < 0.0) {
      xincp = -xincp;
      nodep += pi;
      argpp -= pi;
    }
    if (ep < 0.0 || ep > 1.0) {
      satrec.error = ERR_PERT_ECC;
      return ERR_PERT_ECC;
    }
  }
  //  -------------------- long period periodics ------------------
  if (deep) {
    sinip = Math.sin(xincp);
    cosip = Math.cos(xincp);
    satrec.aycof = -0.5 * j3oj2 * sinip;
    //  sgp4fix for divide by zero for xincp = 180 deg
    if (Math.abs(cosip + 1.0) > 1.5e-12) {
      satrec.xlcof = (-0.25 * j3oj2 * sinip * (3.0 + 5.0 * cosip)) / (1.0 + cosip);
    } else {
      satrec.xlcof = (-0.25 * j3oj2 * sinip * (3.0 + 5.0 * cosip)) / temp4;
    }
  }
  const axnl = ep * Math.cos(argpp);
  temp = 1.0 / (am * (1.0 - ep * ep));
  const aynl = ep * Math.sin(argpp) + temp * satrec.aycof;
  const xl = mp + argpp + nodep + temp * satrec.xlcof * axnl;
  // --------------------- solve kepler's equation ---------------
  const u = (xl - nodep) % twoPi;
  eo1 = u;
  tem5 = 9999.9;
  let ktr = 1;
  //    sgp4fix for kepler iteration
  while (Math.abs(tem5) >= 1.0e-12 && ktr <= 10) {
    sineo1 = Math.sin(eo1);
    coseo1 = Math.cos(eo1);
    tem5 = 1.0 - coseo1 * axnl - sineo1 * aynl;
    tem5 = (u - aynl * coseo1 + axnl * sineo1 - eo1) / tem5;
    if (Math.abs(tem5) >= 0.95) {
      if (tem5 > 0.0) {
        tem5 = 0.95;
      } else {
        tem5 = -0.95;
      }
    }
    eo1 += tem5;
    ktr += 1;
  }
  //  ------------- short period preliminary quantities -----------
  const ecose = axnl * coseo1 + aynl * sineo1;
  const esine = axnl * sineo1 - aynl * coseo1;
  const el2 = axnl * axnl + aynl * aynl;
  const pl = am * (1.0 - el2);
  if (pl < 0.0) {
    satrec.error = ERR_SEMI_LATUS;
    return ERR_SEMI_LATUS;
  }
  const rl = am * (1.0 - ecose);
  const rdotl = (Math.sqrt(am) * esine) / rl;
  const rvdotl = Math.sqrt(pl) / rl;
  const betal = Math.sqrt(1.0 - el2);
  temp = esine / (1.0 + betal);
  const sinu = (am / rl) * (sineo1 - aynl - axnl * temp);
  const cosu = (am / rl) * (coseo1 - axnl + aynl * temp);
  su = Math.atan2(sinu, cosu);
  const sin2u = (cosu + cosu) * sinu;
  const cos2u = 1.0 - 2.0 * sinu * sinu;
  temp = 1.0 / pl;
  const temp1 = 0.5 * j2 * temp;
  const temp2 = temp1 * temp;
  // -------------- update for short period periodics ------------
  if (deep) {
    cosisq = cosip * cosip;
    satrec.con41 = 3.0 * cosisq - 1.0;
    satrec.x1mth2 = 1.0 - cosisq;
    satrec.x7thm1 = 7.0 * cosisq - 1.0;
  }
  const mrt = rl * (1.0 - 1.5 * temp2 * betal * satrec.con41) + 0.5 * temp1 * satrec.x1mth2 * cos2u;
  // sgp4fix for decaying satellites
  if (mrt < 1.0) {
    satrec.error = ERR_DECAYED;
    return ERR_DECAYED;
  }
  su -= 0.25 * temp2 * satrec.x7thm1 * sin2u;
  const xnode = nodep + 1.5 * temp2 * cosip * sin2u;
  const xinc = xincp + 1.5 * temp2 * cosip * sinip * cos2u;
  const mvt = rdotl - (nm * temp1 * satrec.x1mth2 * sin2u) / xke;
  const rvdot = rvdotl + (nm * temp1 * (satrec.x1mth2 * cos2u + 1.5 * satrec.con41)) / xke;
  // --------------------- orientation vectors -------------------
  const sinsu = Math.sin(su);
  const cossu = Math.cos(su);
  const snod = Math.sin(xnode);
  const cnod = Math.cos(xnode);
  const sini = Math.sin(xinc);
  const cosi = Math.cos(xinc);
  const xmx = -snod * cosi;
  const xmy = cnod * cosi;
  const ux = xmx * sinsu + cnod * cossu;
  const uy = xmy * sinsu + snod * cossu;
  const uz = sini * sinsu;
  const vx = xmx * cossu - cnod * sinsu;
  const vy = xmy * cossu - snod * sinsu;
  const vz = sini * cossu;
  // --------- position and velocity (in km and km/sec) ----------
  pv[off] = mrt * ux * earthRadius;
  pv[off + 1] = mrt * uy * earthRadius;
  pv[off + 2] = mrt * uz * earthRadius;
  pv[off + 3] = (mvt * ux + rvdot * vx) * vkmpersec;
  pv[off + 4] = (mvt * uy + rvdot * vy) * vkmpersec;
  pv[off + 5] = (mvt * uz + rvdot * vz) * vkmpersec;
  if (mean) {
    mean[MEAN_AM] = meanAm;
    mean[MEAN_EM] = meanEm;
    mean[MEAN_IM] = meanIm;
    mean[MEAN_OM_NODE] = meanOm;
    mean[MEAN_OM_ARGP] = meanArgp;
    mean[MEAN_MM] = meanMm;
    mean[MEAN_NM] = meanNm;
  }
  return ERR_NONE;
}

/**
 * dspace.js: deep-space secular and resonance contributions to the mean elements. Inputs as
 * satellite.js's sgp4 passes them (t and tc both satrec.t); outputs into DS.
 * atime, xli, xni: the integrator's last step, read from and written back to the record.
 */
function dspace(
  satrec: SatRec,
  t: number,
  tc: number,
  emIn: number,
  argpmIn: number,
  inclmIn: number,
  mmIn: number,
  nodemIn: number,
  nmIn: number,
): void {
  const irez = satrec.irez;
  const no = satrec.no;
  let atime = satrec.atime;
  let em = emIn;
  let argpm = argpmIn;
  let inclm = inclmIn;
  let xli = satrec.xli;
  let mm = mmIn;
  let xni = satrec.xni;
  let nodem = nodemIn;
  let nm = nmIn;
  let delt: number;
  let x2li: number;
  let x2omi: number;
  let xl: number;
  let xldot = 0;
  let xnddt = 0;
  let xndt = 0;
  let xomi: number;
  let dndt = 0.0;
  let ft = 0.0;
  //  ----------- calculate deep space resonance effects -----------
  const theta = (satrec.gsto + tc * rptim) % twoPi;
  em += satrec.dedt * t;
  inclm += satrec.didt * t;
  argpm += satrec.domdt * t;
  nodem += satrec.dnodt * t;
  mm += satrec.dmdt * t;
  /* - update resonances : numerical (euler-maclaurin) integration - */
  if (irez !== 0) {
    const { del1, del2, del3, xfact, argpo, argpdot } = satrec;
    const { d2201, d2211, d3210, d3222, d4410, d4422, d5220, d5232, d5421, d5433 } = satrec;
    //  sgp4fix streamline check
    if (atime === 0.0 || t * atime <= 0.0 || Math.abs(t) < Math.abs(atime)) {
      atime = 0.0;
      xni = no;
      xli = satrec.xlamo;
    }
    // sgp4fix move check outside loop
    if (t > 0.0) {
      delt = stepp;
    } else {
      delt = stepn;
    }
    let iretn = 381; // added for do loop
    while (iretn === 381) {
      //  ------------------- dot terms calculated -------------
      //  ----------- near - synchronous resonance terms -------
      if (irez !== 2) {
        xndt =
          del1 * Math.sin(xli - fasx2) + del2 * Math.sin(2.0 * (xli - fasx4)) + del3 * Math.sin(3.0 * (xli - fasx6));
        xldot = xni + xfact;
        xnddt =
          del1 * Math.cos(xli - fasx2) +
          2.0 * del2 * Math.cos(2.0 * (xli - fasx4)) +
          3.0 * del3 * Math.cos(3.0 * (xli - fasx6));
        xnddt *= xldot;
      } else {
        // --------- near - half-day resonance terms --------
        xomi = argpo + argpdot * atime;
        x2omi = xomi + xomi;
        x2li = xli + xli;
        xndt =
          d2201 * Math.sin(x2omi + xli - g22) +
          d2211 * Math.sin(xli - g22) +
          d3210 * Math.sin(xomi + xli - g32) +
          d3222 * Math.sin(-xomi + xli - g32) +
          d4410 * Math.sin(x2omi + x2li - g44) +
          d4422 * Math.sin(x2li - g44) +
          d5220 * Math.sin(xomi + xli - g52) +
          d5232 * Math.sin(-xomi + xli - g52) +
          d5421 * Math.sin(xomi + x2li - g54) +
          d5433 * Math.sin(-xomi + x2li - g54);
        xldot = xni + xfact;
        xnddt =
          d2201 * Math.cos(x2omi + xli - g22) +
          d2211 * Math.cos(xli - g22) +
          d3210 * Math.cos(xomi + xli - g32) +
          d3222 * Math.cos(-xomi + xli - g32) +
          d5220 * Math.cos(xomi + xli - g52) +
          d5232 * Math.cos(-xomi + xli - g52) +
          2.0 *
            (d4410 * Math.cos(x2omi + x2li - g44) +
              d4422 * Math.cos(x2li - g44) +
              d5421 * Math.cos(xomi + x2li - g54) +
              d5433 * Math.cos(-xomi + x2li - g54));
        xnddt *= xldot;
      }
      //  ----------------------- integrator -------------------
      //  sgp4fix move end checks to end of routine
      if (Math.abs(t - atime) >= stepp) {
        iretn = 381;
      } else {
        ft = t - atime;
        iretn = 0;
      }
      if (iretn === 381) {
        xli += xldot * delt + xndt * step2;
        xni += xndt * delt + xnddt * step2;
        atime += delt;
      }
    }
    // Kept for the next call (the C++ reference's behaviour; see the header).
    satrec.atime = atime;
    satrec.xli = xli;
    satrec.xni = xni;
    nm = xni + xndt * ft + xnddt * ft * ft * 0.5;
    xl = xli + xldot * ft + xndt * ft * ft * 0.5;
    if (irez !== 1) {
      mm = xl - 2.0 * nodem + 2.0 * theta;
      dndt = nm - no;
    } else {
      mm = xl - nodem - argpm + theta;
      dndt = nm - no;
    }
    nm = no + dndt;
  }
  DS[DS_EM] = em;
  DS[DS_ARGPM] = argpm;
  DS[DS_INCLM] = inclm;
  DS[DS_MM] = mm;
  DS[DS_NODEM] = nodem;
  DS[DS_NM] = nm;
}

/**
 * dpper.js with init = 'n' (the only way sgp4 calls it): lunar-solar long-period periodics.
 * Inputs as satellite.js's sgp4 passes them; outputs into DP.
 */
function dpper(
  satrec: SatRec,
  epIn: number,
  inclpIn: number,
  nodepIn: number,
  argppIn: number,
  mpIn: number,
  opsmode: 'a' | 'i',
): void {
  const t = satrec.t;
  let ep = epIn;
  let inclp = inclpIn;
  let nodep = nodepIn;
  let argpp = argppIn;
  let mp = mpIn;
  let alfdp: number;
  let betdp: number;
  let cosop: number;
  let sinop: number;
  let dalf: number;
  let dbet: number;
  let dls: number;
  let f2: number;
  let f3: number;
  let pe: number;
  let pgh: number;
  let ph: number;
  let pinc: number;
  let pl: number;
  let sinzf: number;
  let xls: number;
  let xnoh: number;
  let zf: number;
  let zm: number;
  //  --------------- calculate time varying periodics -----------
  zm = satrec.zmos + zns * t;
  zf = zm + 2.0 * zes * Math.sin(zm);
  sinzf = Math.sin(zf);
  f2 = 0.5 * sinzf * sinzf - 0.25;
  f3 = -0.5 * sinzf * Math.cos(zf);
  const ses = satrec.se2 * f2 + satrec.se3 * f3;
  const sis = satrec.si2 * f2 + satrec.si3 * f3;
  const sls = satrec.sl2 * f2 + satrec.sl3 * f3 + satrec.sl4 * sinzf;
  const sghs = satrec.sgh2 * f2 + satrec.sgh3 * f3 + satrec.sgh4 * sinzf;
  const shs = satrec.sh2 * f2 + satrec.sh3 * f3;
  zm = satrec.zmol + znl * t;
  zf = zm + 2.0 * zel * Math.sin(zm);
  sinzf = Math.sin(zf);
  f2 = 0.5 * sinzf * sinzf - 0.25;
  f3 = -0.5 * sinzf * Math.cos(zf);
  const sel = satrec.ee2 * f2 + satrec.e3 * f3;
  const sil = satrec.xi2 * f2 + satrec.xi3 * f3;
  const sll = satrec.xl2 * f2 + satrec.xl3 * f3 + satrec.xl4 * sinzf;
  const sghl = satrec.xgh2 * f2 + satrec.xgh3 * f3 + satrec.xgh4 * sinzf;
  const shll = satrec.xh2 * f2 + satrec.xh3 * f3;
  pe = ses + sel;
  pinc = sis + sil;
  pl = sls + sll;
  pgh = sghs + sghl;
  ph = shs + shll;
  // init === 'n'
  pe -= satrec.peo;
  pinc -= satrec.pinco;
  pl -= satrec.plo;
  pgh -= satrec.pgho;
  ph -= satrec.pho;
  inclp += pinc;
  ep += pe;
  const sinip = Math.sin(inclp);
  const cosip = Math.cos(inclp);
  /* ----------------- apply periodics directly ------------ */
  // sgp4fix for lyddane choice: gsfc version, perturbed inclination (as satellite.js)
  if (inclp >= 0.2) {
    ph /= sinip;
    pgh -= cosip * ph;
    argpp += pgh;
    nodep += ph;
    mp += pl;
  } else {
    //  ---- apply periodics with lyddane modification ----
    sinop = Math.sin(nodep);
    cosop = Math.cos(nodep);
    alfdp = sinip * sinop;
    betdp = sinip * cosop;
    dalf = ph * cosop + pinc * cosip * sinop;
    dbet = -ph * sinop + pinc * cosip * cosop;
    alfdp += dalf;
    betdp += dbet;
    nodep %= twoPi;
    //  sgp4fix for afspc written intrinsic functions
    if (nodep < 0.0 && opsmode === 'a') {
      nodep += twoPi;
    }
    xls = mp + argpp + cosip * nodep;
    dls = pl + pgh - pinc * nodep * sinip;
    xls += dls;
    xnoh = nodep;
    nodep = Math.atan2(alfdp, betdp);
    //  sgp4fix for afspc written intrinsic functions
    if (nodep < 0.0 && opsmode === 'a') {
      nodep += twoPi;
    }
    if (Math.abs(xnoh - nodep) > pi) {
      if (nodep < xnoh) {
        nodep += twoPi;
      } else {
        nodep -= twoPi;
      }
    }
    mp += pl;
    argpp = xls - mp - cosip * nodep;
  }
  DP[DP_EP] = ep;
  DP[DP_INCLP] = inclp;
  DP[DP_NODEP] = nodep;
  DP[DP_ARGPP] = argpp;
  DP[DP_MP] = mp;
}
