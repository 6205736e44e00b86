/**
 * Results no engine gives, caught before they are printed as answers: the
 * model is outside what it represents there (for example a constant exhaust
 * back pressure far above the intake's at a very low speed drives exhaust gas
 * out through the intake), or the solver left its range. Each kind says, in
 * plain words, what the number means.
 *
 *   ηv < 0        more gas went back out through the intake valve than came in
 *   ηv > 2        twice the cylinder's ambient charge, more than wave tuning
 *                 gives an unboosted engine (common practice: 1.1–1.3 at best)
 *   residual > ½  most of the trapped charge is exhaust gas
 *   mass < 0      the cylinder held less than nothing: not a physical state
 *
 * Pure: no I/O.
 */
import type { EngineModel, PointResult } from '../core/model.js';
import { density } from '../core/gas.js';

/** the limits above */
export const RESULT_LIMITS = { minVolumetricEfficiency: 0, maxVolumetricEfficiency: 2, maxResidualFraction: 0.5 } as const;

export type ResultProblem = 'negative-ve' | 'huge-ve' | 'mostly-residual' | 'negative-mass';

export interface PointFigures {
  volumetricEfficiency: number;
  /** when known */
  residualFraction?: number;
  /** the smallest cylinder mass over the cycle [kg], when known */
  minCylinderMass?: number;
}

/**
 * the highest plausible ηv (on the ambient density) of a model: 2, or 2 × the
 * supply's density over the ambient's when a boosted supply feeds the plenum
 */
export function maxVolumetricEfficiency(model?: Pick<EngineModel, 'inlet' | 'ambient'>): number {
  const supply = model?.inlet.kind === 'plenum' ? model.inlet.supply : undefined;
  const ratio = supply ? density(supply.pressure, supply.temperature) / density(model!.ambient.pressure, model!.ambient.temperature) : 1;
  return RESULT_LIMITS.maxVolumetricEfficiency * Math.max(1, ratio);
}

/** the kinds of implausible result one point shows (empty: none); `maxVe` from maxVolumetricEfficiency */
export function resultProblems(p: PointFigures, maxVe: number = RESULT_LIMITS.maxVolumetricEfficiency): ResultProblem[] {
  const out: ResultProblem[] = [];
  const ve = p.volumetricEfficiency;
  if (ve < RESULT_LIMITS.minVolumetricEfficiency) out.push('negative-ve');
  else if (ve > maxVe) out.push('huge-ve');
  if (p.residualFraction !== undefined && p.residualFraction > RESULT_LIMITS.maxResidualFraction) out.push('mostly-residual');
  if (p.minCylinderMass !== undefined && p.minCylinderMass < 0) out.push('negative-mass');
  return out;
}

/** what each kind means, for a tuner */
export const PROBLEM_MEANING: Readonly<Record<ResultProblem, string>> = {
  'negative-ve':
    'more gas went back out through the intake valve than came in over the cycle (exhaust blowing through the intake): ' +
    'the model is outside what it represents here, so this is not a breathing figure; check exhaust.backPressure, ambient and the speed',
  'huge-ve':
    'more than twice the charge the cylinder holds at the density it breathes (the ambient, or a boosted supply), which wave tuning ' +
    'does not give: check the pressures and sizes of the case',
  'mostly-residual':
    'over half of what the cylinder holds at IVC is exhaust gas, so it would hardly fire: check exhaust.backPressure and the valve overlap',
  'negative-mass': 'the cylinder mass went below zero, which is not a physical state: the solver left its range; try a finer numerics.meshSize',
};

function pct(v: number): string {
  return `${(v * 100).toFixed(1)} %`;
}

/** the smallest cylinder mass of a point's trace [kg] */
export function minCylinderMass(r: Pick<PointResult, 'trace'>): number {
  let m = Infinity;
  for (const v of r.trace.cylinderMass) m = Math.min(m, v);
  return m;
}

/** Warnings (without the "warning: " prefix) for one simulated point of `model` (for a boosted supply). */
export function resultWarnings(r: Pick<PointResult, 'volumetricEfficiency' | 'residualFraction' | 'trace' | 'rpm'>, model?: Pick<EngineModel, 'inlet' | 'ambient'>): string[] {
  const maxVe = maxVolumetricEfficiency(model);
  const probs = resultProblems({ volumetricEfficiency: r.volumetricEfficiency, residualFraction: r.residualFraction, minCylinderMass: minCylinderMass(r) }, maxVe);
  return probs.map((k) => {
    const figure =
      k === 'negative-ve'
        ? `ηv ${pct(r.volumetricEfficiency)} is below zero`
        : k === 'huge-ve'
          ? `ηv ${pct(r.volumetricEfficiency)} is above ${pct(maxVe)}`
          : k === 'mostly-residual'
            ? `residual gas ${pct(r.residualFraction)} is above ${pct(RESULT_LIMITS.maxResidualFraction)}`
            : `cylinder mass ${(minCylinderMass(r) * 1e6).toFixed(1)} mg is below zero`;
    return `${figure} at ${Math.round(r.rpm)} rpm: ${PROBLEM_MEANING[k]}`;
  });
}

/** Warnings for the points of a curve of `model`: one line per kind, naming the speeds. */
export function curveWarnings(points: readonly (PointFigures & { rpm: number })[], label = '', model?: Pick<EngineModel, 'inlet' | 'ambient'>): string[] {
  const out: string[] = [];
  const who = label ? `${label}: ` : '';
  const maxVe = maxVolumetricEfficiency(model);
  const names: Record<ResultProblem, string> = {
    'negative-ve': 'ηv below zero',
    'huge-ve': `ηv above ${pct(maxVe)}`,
    'mostly-residual': `residual gas above ${pct(RESULT_LIMITS.maxResidualFraction)}`,
    'negative-mass': 'cylinder mass below zero',
  };
  for (const k of Object.keys(names) as ResultProblem[]) {
    const at = points.filter((p) => resultProblems(p, maxVe).includes(k)).map((p) => Math.round(p.rpm));
    if (at.length > 0) out.push(`${who}${names[k]} at ${at.join(', ')} rpm: ${PROBLEM_MEANING[k]}`);
  }
  return out;
}
