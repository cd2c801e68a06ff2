/**
 * An OEM from trajectories sampled on a time grid: what `plan --oem` writes for a manoeuvred
 * trajectory and what tests use to make ephemerides of known orbits. Nodes are TEME states of the
 * trajectories; the segment's REF_FRAME (EME2000 unless asked otherwise) is what the writer
 * converts them to, with core/frames.
 *
 * One span per segment: a manoeuvre plan passes the trajectory before the burn up to the burn
 * time and the trajectory after it from the burn time on, so no interpolation ever crosses the
 * velocity change (adjacent segments share the burn epoch; the later one is used from it on).
 */
import { KeepclearError } from '../../errors.js';
import { nodesFor } from '../../propagation/interpolation.js';
import type { Trajectory } from '../../propagation/trajectory.js';
import { instantFromMs, toIso, type Instant } from '../../time/instant.js';
import type { OemInterpolationMethod, OemStateFrame } from './keywords.js';
import type { Oem, OemSegment, TemeNodeStates } from './model.js';

/**
 * What a sampled OEM asks its readers to use unless the caller says otherwise: LAGRANGE 9,
 * positions only. SGP4's velocity is not exactly the derivative of its position (measured up to
 * 2.4 cm/s in LEO, test/oem-frames.test.ts), and HERMITE would carry that into the positions
 * between nodes (≈ 0.33·h·|δv|, half a metre at 60 s); 10 nodes 60 s apart interpolate a LEO
 * orbit to micrometres (test/oem-interpolation.test.ts). A caller whose velocities are the
 * derivative of its positions (a numerical propagator) may ask for HERMITE and sparser nodes.
 */
export const SAMPLED_INTERPOLATION = { method: 'LAGRANGE', degree: 9 } as const satisfies {
  method: OemInterpolationMethod;
  degree: number;
};

export interface SampledSpan {
  readonly trajectory: Trajectory;
  readonly start: Instant;
  readonly end: Instant;
  /** Grid step, s; the last step is shorter when the span is not a whole number of steps. */
  readonly stepS: number;
}

export interface OemSampleOptions {
  readonly objectName: string;
  readonly objectId: string;
  readonly originator: string;
  readonly creationDate: Instant;
  readonly messageId?: string;
  /** Frame the writer will use; default EME2000. */
  readonly frame?: OemStateFrame;
  /** Default SAMPLED_INTERPOLATION. */
  readonly interpolation?: { readonly method: OemInterpolationMethod; readonly degree: number };
  readonly comments?: readonly string[];
  /** Name used in notes and errors when this OEM is written or screened. */
  readonly file?: string;
}

/** Grid instants of a span in whole milliseconds (the writer prints milliseconds). */
function grid(span: SampledSpan): number[] {
  const start = Math.round(span.start), end = Math.round(span.end);
  const stepMs = Math.round(span.stepS * 1000);
  if (!(stepMs > 0) || !(end > start))
    throw new KeepclearError('BAD_ARGUMENT',
      `cannot sample ${toIso(span.start)} … ${toIso(span.end)} every ${span.stepS} s: the span must be positive and the step at least 1 ms`);
  const out: number[] = [];
  for (let t = start; t < end; t += stepMs) out.push(t);
  out.push(end);
  return out;
}

export function sampleOem(spans: readonly SampledSpan[], opts: OemSampleOptions): Oem {
  const frame = opts.frame ?? 'EME2000';
  const interpolation = { ...(opts.interpolation ?? SAMPLED_INTERPOLATION), stated: true };
  const buf = new Float64Array(6);
  const segments = spans.map((span): OemSegment => {
    const times = grid(span);
    if (nodesFor(interpolation.method, interpolation.degree) > times.length)
      throw new KeepclearError('BAD_ARGUMENT',
        `${times.length} samples cannot carry ${interpolation.method} degree ${interpolation.degree}; use a smaller step`);
    const teme = new Float64Array(6 * times.length) as TemeNodeStates;
    times.forEach((t, i) => {
      const failure = span.trajectory.stateInto(instantFromMs(t), buf, 0);
      if (failure)
        throw new KeepclearError('PROPAGATION_FAILED',
          `${span.trajectory.objectId} has no state at ${toIso(instantFromMs(t))} (${failure}); the OEM cannot be sampled there`);
      teme.set(buf, 6 * i);
    });
    const start = instantFromMs(times[0]!), end = instantFromMs(times.at(-1)!);
    return {
      metadata: {
        objectName: opts.objectName, objectId: opts.objectId, centerName: 'EARTH',
        refFrame: frame, stateFrame: frame, timeSystem: 'UTC', startTime: start, stopTime: end,
        interpolation, comments: [],
      },
      dataComments: [], epochs: Float64Array.from(times), teme, nodeLines: new Int32Array(times.length),
      usable: { start, end }, covariances: [], line: 0,
    };
  });
  return {
    file: opts.file ?? `${opts.objectId}.oem`,
    header: {
      version: '2.0', creationDate: opts.creationDate, originator: opts.originator,
      comments: opts.comments ?? [], line: 0, ...(opts.messageId !== undefined ? { messageId: opts.messageId } : {}),
    },
    segments,
  };
}
