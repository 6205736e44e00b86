/**
 * Progress of one long operating point on a terminal (stderr): the cycle
 * number against the cap and the time left at most, from the time the
 * cycles so far took. Shown only when stderr is a terminal and the estimate
 * (analysis/cost.ts) is above a few seconds; the line is cleared at the end.
 */
import { performance } from 'node:perf_hooks';
import { duration, PROGRESS_AFTER_SECONDS, type CostEstimate } from '../analysis/cost.js';
import type { CliIo } from './io.js';

export interface CycleProgress {
  /** after each cycle (simulatePoint's onCycle) */
  tick: (cycle: number) => void;
  /** clear the line */
  done: () => void;
}

export function cycleProgress(io: CliIo, cost: CostEstimate, what = 'run'): CycleProgress | undefined {
  if (!io.stderrIsTTY || !(cost.seconds > PROGRESS_AFTER_SECONDS)) return undefined;
  const t0 = performance.now();
  io.stderr.write(`\r\x1b[K${what}: cycle 1 of at most ${cost.maxCycles} (estimated ${duration(cost.seconds)}, at most ${duration(cost.maxSeconds)})`);
  return {
    tick: (cycle) => {
      const perCycle = (performance.now() - t0) / 1000 / cycle;
      const left = perCycle * (cost.maxCycles - cycle);
      if (cycle < cost.maxCycles)
        io.stderr.write(`\r\x1b[K${what}: cycle ${cycle + 1} of at most ${cost.maxCycles} (${duration(perCycle)} a cycle, at most ${duration(left)} left)`);
    },
    done: () => io.stderr.write('\r\x1b[K'),
  };
}

/** "about 40 s left" from the points done so far, for a sweep's progress line */
export function timeLeft(t0: number, done: number, total: number): string {
  if (done <= 0) return '';
  const elapsed = (performance.now() - t0) / 1000;
  return `, about ${duration((elapsed / done) * (total - done))} left`;
}
