/** A 3×3 matrix, row-major (covariances in m²). */
export type Matrix3 = readonly [readonly [number, number, number], readonly [number, number, number], readonly [number, number, number]];
/** A symmetric 2×2 matrix, row-major (encounter-plane covariance in m²). */
export type Matrix2 = readonly [readonly [number, number], readonly [number, number]];

/**
 * The numbers behind a Pc, kept with the event so that plots, exports and series linking do not
 * have to recompute them (and cannot drift from what the Pc used).
 */
export interface RiskDetail {
  /** each object's position covariance at TCA in its own RTN frame (m²); null when none was usable */
  readonly primaryCovRtnM2: Matrix3 | null;
  readonly secondaryCovRtnM2: Matrix3 | null;
  /**
   * Encounter plane at TCA (perpendicular to the relative velocity): x̂ along the miss,
   * ŷ = ẑ × x̂, ẑ along the relative velocity. The secondary's position relative to the primary (m).
   */
  readonly planeMissM: readonly [number, number];
  /** combined position covariance projected on the plane (m²); null without both covariances */
  readonly planeCovM2: Matrix2 | null;
  /** combined position σ along the relative velocity (m); null without both covariances */
  readonly sigmaAlongVelocityM: number | null;
}

/** Risk assessment of one encounter. */
export interface RiskAssessment {
  /** probability of collision; null where none could be computed */
  readonly pc: number | null;
  readonly pcMethod: string;
  readonly covarianceSource: string;
  readonly hardBodyRadiusM: number;
  readonly tier: string;
  readonly warnings: readonly string[];
  /** absent on events stored before the detail was kept */
  readonly detail?: RiskDetail;
}
