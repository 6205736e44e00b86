/**
 * What the views show of the analysis module's pulse timing for one point.
 * The numbers and the verdict are the analysis module's; this only picks them.
 */
import type { EngineModel, PointResult } from '../core/model.js';
import { pulseTiming, type PulseTiming } from '../analysis/pulse.js';
import type { PulseSummary } from './state.js';

export function summarisePulse(result: PointResult, model: EngineModel): PulseSummary {
  return summariseTiming(pulseTiming(result, model));
}

/** What the views show of a pulse timing the analysis module made (on a worker thread, say). */
export function summariseTiming(t: PulseTiming): PulseSummary {
  const peak = t.lastPeakBeforeIvc;
  return {
    verdict: t.verdict,
    openingNote: t.openingNote,
    roundTripDeg: t.roundTripDegrees,
    ...(peak ? { lastPeakDeg: peak.crank, peakBeforeIvcDeg: -peak.offsetFromIvc } : {}),
  };
}
