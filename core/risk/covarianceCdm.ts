import { KeepclearError } from '../errors.js';
import { zeros, type Matrix } from '../math/linalg.js';

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
