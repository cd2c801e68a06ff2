/**
 * The chosen burn of a manoeuvre plan as the `plan` JSON of DESIGN.md writes it (m/s, km, kg;
 * burnTime ISO 8601 UTC). Shared by the event report and the app's plan panel, which both show
 * a stored plan document.
 */
export interface PlanProposalJson {
  readonly burnTime: string;
  readonly leadTimeS: number;
  readonly direction: string;
  readonly deltaVMs: number;
  readonly deltaVRtnMs: readonly [number, number, number];
  readonly achievedMissKm: number;
  readonly achievedPc: number | null;
  readonly propellantKg: number | null;
}
