import { KeepclearError } from '../errors.js';
import { zeros, type Matrix } from '../math/linalg.js';
import type { StateArray } from '../events/index.js';
import { rtnBasis, rtnToInertialCov } from './frames.js';

/**
 * CDM covariance (CCSDS 508.0-B-1): 21 lower-triangle values, row by row, of the 6×6 RTN
 * covariance in the order R, T, N, Ṙ, Ṫ, Ṅ (CR_R; CT_R, CT_T; CN_R, CN_T, CN_N; CRDOT_R …
 * CNDOT_NDOT), units m², m²/s, m²/s².
 */
export function cdmRtnFromLowerTriangle(values: readonly number[]): Matrix {
  if (values.length !== 21)
    throw new KeepclearError('CDM_COVARIANCE', `CDM covariance needs 21 values, got ${values.length}`);
  const c = zeros(6);
  let k = 0;
  for (let i = 0; i < 6; i++)
    for (let j = 0; j <= i; j++) {
      c[i]![j] = c[j]![i] = values[k++]!;
    }
  return c;
}

export interface CdmCovariance {
  /** position covariance, inertial (TEME axes), m² */
  readonly inertialM2: Matrix;
  readonly rtnM2: Matrix;
  readonly source: 'cdm';
}

/**
 * Position part of a CDM RTN covariance rotated to inertial axes with the object's RTN frame at
 * TCA. The RTN frame is built from our TEME state rather than the CDM's EME2000 state: the two
 * frames differ by precession–nutation (< 0.5° here), which turns the RTN axes negligibly for a
 * 2-D Pc, and using our state keeps one frame for both objects.
 */
export function covarianceFromCdm(rtn6M2: Matrix, stateTeme: StateArray): CdmCovariance {
  if (rtn6M2.length !== 6 && rtn6M2.length !== 3)
    throw new KeepclearError('CDM_COVARIANCE', 'CDM covariance must be 6×6 (or its 3×3 position block)');
  const rtn3 = rtn6M2.slice(0, 3).map((row) => row.slice(0, 3));
  const basis = rtnBasis([stateTeme[0], stateTeme[1], stateTeme[2]], [stateTeme[3], stateTeme[4], stateTeme[5]]);
  return { inertialM2: rtnToInertialCov(rtn3, basis), rtnM2: rtn3, source: 'cdm' };
}
