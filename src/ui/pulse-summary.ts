/**
 * What the views show of the analysis module's pulse timing for one point.
 * The numbers and the verdict are the analysis module's; this only picks them.
 */
import type { EngineModel, PointResult } from '../core/model.js';
import { pulseTiming } from '../analysis/pulse.js';
import type { PulseSummary } from './state.js';

export function summarisePulse(result: PointResult, model: EngineModel): PulseSummary {
  const t = pulseTiming(result, model);
  const peak = t.lastPeakBeforeIvc;
  return {
    verdict: t.verdict,
    openingNote: t.openingNote,
    roundTripDeg: t.roundTripDegrees,
    ...(peak ? { lastPeakDeg: peak.crank, peakBeforeIvcDeg: -peak.offsetFromIvc } : {}),
  };
}
