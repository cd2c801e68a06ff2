/**
 * The drag parameter of the force model: B = C_D·A/m (m²/kg), the inverse ballistic coefficient.
 *
 * Two sources, and the result says which one was used:
 * - the operator's spacecraft data: mass, drag area and drag coefficient (preferred);
 * - the element set's B*: SGP4 defines B* = (ρ0/2)·B with ρ0 = 2.461e-8 kg/m³ at its reference
 *   height, expressed per Earth radius (ρ0·R_E = 0.15696615 kg/m²/ER), so B = 2·B* / (ρ0·R_E)
 *   = 12.741621·B* m²/kg for B* in 1/ER (Vallado, Fundamentals of Astrodynamics and
 *   Applications, §9.7 "SGP4"; Hoots & Roehrich, Spacetrack Report #3 — from memory). B* is a
 *   fitted parameter that also soaks up other model errors, so this B is rough; a negative B*
 *   (a fit artefact, it would mean thrust) is taken as zero drag.
 */
export interface DragParameter {
  /** C_D·A/m, m²/kg; 0 switches drag off */
  readonly cdAreaOverMassM2PerKg: number;
  readonly source: 'spacecraft' | 'bstar' | 'none';
}

/** 2/(ρ0·R_E) of SGP4's B* definition, m²/kg per (1/ER). */
export const BSTAR_TO_CDA_OVER_M = 12.741621;

export function dragFromBstar(bstar: number): DragParameter {
  return { cdAreaOverMassM2PerKg: Math.max(0, bstar) * BSTAR_TO_CDA_OVER_M, source: 'bstar' };
}

export function dragFromSpacecraft(massKg: number, dragAreaM2: number, dragCoefficient: number): DragParameter {
  return { cdAreaOverMassM2PerKg: (dragCoefficient * dragAreaM2) / massKg, source: 'spacecraft' };
}

export const NO_DRAG: DragParameter = { cdAreaOverMassM2PerKg: 0, source: 'none' };
