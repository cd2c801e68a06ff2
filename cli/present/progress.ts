import cliProgress from 'cli-progress';

export interface Progress {
  readonly update: (done: number, total: number) => void;
  /** ends the bar (also when the work stopped early) */
  readonly stop: () => void;
}

/** Plain progress lines are written at every this many percent (logs stay short). */
const PLAIN_STEP_PERCENT = 10;

/**
 * Progress of long work on stderr: a bar (cli-progress) when stderr is a terminal, otherwise a
 * plain line per PLAIN_STEP_PERCENT ("screening: 40% (12/30)") that logs and scripts can read.
 */
export function progress(label: string, stream: NodeJS.WriteStream = process.stderr): Progress {
  if (stream.isTTY) {
    const bar = new cliProgress.SingleBar(
      { format: `${label} [{bar}] {percentage}% | {value}/{total} | {eta_formatted} left`, stream, hideCursor: true, clearOnComplete: false },
      cliProgress.Presets.shades_classic,
    );
    let started = false;
    return {
      update(done, total) {
        if (!started) {
          bar.start(total, done);
          started = true;
        } else {
          bar.setTotal(total);
          bar.update(done);
        }
      },
      stop: () => {
        if (started) bar.stop();
        started = false;
      },
    };
  }
  let lastStep = -1;
  return {
    update(done, total) {
      const pct = total > 0 ? Math.floor((100 * done) / total) : 100;
      const step = Math.floor(pct / PLAIN_STEP_PERCENT);
      if (step > lastStep) {
        lastStep = step;
        stream.write(`${label}: ${pct}% (${done}/${total})\n`);
      }
    },
    stop: () => {},
  };
}
