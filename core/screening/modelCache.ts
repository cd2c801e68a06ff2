import type { Instant } from '../time/instant.js';
import type { FailureReason } from '../propagation/trajectory.js';
import { buildSgp4Model, exactModel, type OrbitModel } from './orbitModel.js';
import type { ScreeningObject, WindowSettings } from './screeningObject.js';
import { MODEL_MARGIN_MS, type Flags, type ValidityProbe } from './validity.js';

/**
 * Spacing of the sampled mean elements of the filter model (min). Near-Earth SGP4's mean
 * elements are polynomials in time (secular J2 rates, drag to t⁵): cubic interpolation over a
 * day stays far inside ε, and half the nodes halve the cost of a model. Deep-space mean
 * elements carry resonance and lunar–solar terms with periods of days: 12 h. Both keep ε
 * honest at random instants (test/screening-model-bound.test.ts).
 */
export const MODEL_NODE_SPACING_MIN = { nearEarth: 1440, deepSpace: 720 } as const;
export const modelNodeSpacingMin = (satrec: { method: string }): number =>
  satrec.method === 'd' ? MODEL_NODE_SPACING_MIN.deepSpace : MODEL_NODE_SPACING_MIN.nearEarth;

/**
 * Filter models (orbitModel.ts), built on first use and kept for the run: SGP4 mean-element
 * models for sources that have them (Trajectory.meanElementSource), exact models otherwise.
 */
export class ModelCache {
  private readonly models = new Map<string, OrbitModel | FailureReason>();

  constructor(
    private readonly settings: WindowSettings,
    private readonly validity: ValidityProbe,
    private readonly flags: Flags,
    private readonly stats: { sgp4Evaluations: number },
  ) {}

  model(o: ScreeningObject): OrbitModel | null {
    let m = this.models.get(o.id);
    if (m === undefined) {
      const src = o.trajectory.meanElementSource;
      const until = this.validity.validUntil(o);
      if (until === null) m = 'bad-elements';
      else if (src) {
        const spacing = modelNodeSpacingMin(src.satrec);
        const build = (to: number) => {
          this.stats.sgp4Evaluations += 3 * Math.ceil((this.settings.end - this.settings.start) / 60_000 / spacing) + 1;
          return src.initFailure ?? buildSgp4Model(src.satrec, src.elements.epoch, (this.settings.start - MODEL_MARGIN_MS) as Instant, to as Instant, spacing);
        };
        m = build(until);
        if (typeof m === 'string' && !src.initFailure) {
          // A failure between the validity probes: model the span up to the first failure.
          const first = this.validity.failureSeen(o);
          if (first !== null && first < until) m = build(first);
        }
      } else {
        m = exactModel(o.trajectory, o.vMaxKmS ?? 15, o.radiusBandKm);
      }
      this.models.set(o.id, m);
    }
    if (typeof m === 'string') {
      this.flags.flag(o.id, `propagation failed: ${m}`);
      return null;
    }
    return m;
  }

}
