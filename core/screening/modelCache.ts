import type { Instant } from '../time/instant.js';
import type { FailureReason } from '../propagation/trajectory.js';
import { buildSgp4Model, exactModel, type OrbitModel } from './orbitModel.js';
import type { ScreeningObject, WindowSettings } from './screeningObject.js';
import { MODEL_MARGIN_MS, type Flags, type ValidityProbe } from './validity.js';

/** Spacing of the sampled mean elements of the filter model (min): 12 h keeps ε honest (tested). */
const MODEL_NODE_SPACING_MIN = 720;

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
        const build = (to: number) => {
          this.stats.sgp4Evaluations += 2 * Math.ceil((this.settings.end - this.settings.start) / 60_000 / MODEL_NODE_SPACING_MIN) + 3;
          return src.initFailure ?? buildSgp4Model(src.satrec, src.elements.epoch, (this.settings.start - MODEL_MARGIN_MS) as Instant, to as Instant, MODEL_NODE_SPACING_MIN);
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
