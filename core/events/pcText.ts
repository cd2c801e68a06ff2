/**
 * Pc as people read it. THE one formatter for human output (terminal, reports, the desktop app
 * through the bridge); JSON keeps the number as computed.
 */

/**
 * Below this a Pc reads "< 1e-10". Our choice: three decades under the lowest default tier
 * threshold (1e-7, NASA/SP-20205011318 common practice), where the digits say more about the
 * covariance assumptions and the integrator than about the encounter; "3.1e-87" would suggest a
 * precision that is not there.
 */
export const PC_DISPLAY_FLOOR = 1e-10;

/** "1.23e-5"; "< 1e-10" below PC_DISPLAY_FLOOR (0 included); "—" where no Pc was computed. */
export function formatPc(pc: number | null | undefined): string {
  if (pc === null || pc === undefined || !Number.isFinite(pc)) return '—';
  if (pc < PC_DISPLAY_FLOOR) return `< ${PC_DISPLAY_FLOOR.toExponential(0)}`;
  return pc.toExponential(2);
}
