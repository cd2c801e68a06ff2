/**
 * Hard-body radius (HBR): the radius of a sphere enclosing an object. The 2-D Pc uses the sum of
 * both objects' radii (a sphere around the primary that the secondary's centre must enter).
 */

/** Per-object radius when nothing is known: our choice, in line with common practice for small
 * satellites and debris (a conservative few metres). */
export const DEFAULT_HBR_PER_OBJECT_M = 5;

/** Radius of the disk with the CDM's AREA_PC (m²): √(A/π). */
export const hbrFromAreaM = (areaM2: number): number => Math.sqrt(areaM2 / Math.PI);

export interface CombinedHbr {
  readonly radiusM: number;
  /** which radii were defaults, for the report */
  readonly note: string | null;
}

const valid = (x: number | null | undefined): x is number => typeof x === 'number' && Number.isFinite(x) && x > 0;

export function combinedHbr(primaryM?: number | null, secondaryM?: number | null): CombinedHbr {
  const p = valid(primaryM) ? primaryM : DEFAULT_HBR_PER_OBJECT_M;
  const s = valid(secondaryM) ? secondaryM : DEFAULT_HBR_PER_OBJECT_M;
  const defaulted = [!valid(primaryM) && 'primary', !valid(secondaryM) && 'secondary'].filter(Boolean);
  return {
    radiusM: p + s,
    note: defaulted.length ? `hard-body radius default ${DEFAULT_HBR_PER_OBJECT_M} m used for ${defaulted.join(' and ')}` : null,
  };
}
