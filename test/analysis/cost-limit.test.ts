/**
 * The limit of the up-front cost estimate (analysis/cost.ts), and the
 * estimate against what the stepper
 * really does: the mesh points of its pipes and the time steps a cycle
 * takes. Own calibration check, no external source: the CFL relation
 * dt = C·dx/max(|u| + a) is the textbook one (Courant, Friedrichs & Lewy
 * 1928), the factor 1.2 on the steps (STEP_RATIO) is fitted to our bundled cases.
 */
import { describe, expect, it } from 'vitest';
import { combinedCost, COST_LIMIT_SECONDS, costProblem, engineCost, pipeCost } from '../../src/analysis/cost.js';
import { simulatePoint } from '../../src/core/engine.js';
import { loadCase, loadPipeCase } from '../../src/case/load.js';
import { runPipeExperiment } from '../../src/core/pipe-experiment.js';
import { ROOT } from '../hardening/cli.js';

describe('cost estimate against the steps the stepper takes', () => {
  it.each([
    ['cases/demo.yaml', 'conservative', 3000],
    ['cases/demo.yaml', 'characteristics', 9000],
    ['cases/kart-single.yaml', 'conservative', 6000],
    ['cases/airbox-single.yaml', 'characteristics', 4000],
    ['cases/enduro-single.yaml', 'conservative', 6000],
    ['cases/resonator-single.yaml', 'conservative', 7000],
  ])('%s, %s, %d rpm: points within 10 per cent (pipes split at junctions and extended by end corrections), steps a cycle within 15 per cent', async (file, scheme, rpm) => {
    const { model } = await loadCase(file, { cwd: ROOT, rpm, set: [`numerics.scheme=${scheme}`] });
    const est = engineCost(model);
    const { result } = simulatePoint(model);
    expect(Math.abs(est.nodes / result.stats.nodes - 1)).toBeLessThan(0.1);
    const perCycle = result.stats.steps / result.cycles;
    expect(Math.abs(est.stepsPerCycle / perCycle - 1)).toBeLessThan(0.15);
    // the cycle cap bounds what was done
    expect(result.stats.nodes * result.stats.steps).toBeLessThanOrEqual(est.maxNodeUpdates * 1.2);
  });

  it('a pipe experiment: points exact, steps within 40 % (shocks move faster than sound)', async () => {
    const { model } = await loadPipeCase('cases/pipe-sod.yaml', { cwd: ROOT });
    const est = pipeCost(model);
    const r = runPipeExperiment(model);
    expect(est.nodes).toBe(r.stats.nodes);
    expect(Math.abs(est.stepsPerCycle / r.stats.steps - 1)).toBeLessThan(0.4);
  });
});

describe('the limit', () => {
  it('the bundled cases over their whole sweep ranges are far inside it', async () => {
    for (const file of ['cases/demo.yaml', 'cases/kart-single.yaml', 'cases/airbox-single.yaml', 'cases/enduro-single.yaml', 'cases/resonator-single.yaml']) {
      const { model, case: c } = await loadCase(file, { cwd: ROOT });
      const rpms: number[] = [];
      for (let v = c.sweep!.from; v <= c.sweep!.to; v += c.sweep!.step) rpms.push(v);
      const cost = engineCost(model, rpms, 1);
      expect(costProblem(cost)).toBeUndefined();
      expect(cost.seconds).toBeLessThan(COST_LIMIT_SECONDS / 10);
    }
  });
  it('a mesh of 0.01 mm is over it, and the message says the estimate and the way out', async () => {
    const { model } = await loadCase('cases/demo.yaml', { cwd: ROOT, set: ['numerics.meshSize=0.01mm'] });
    const msg = costProblem(engineCost(model));
    expect(msg).toMatch(/^this would take about (\d+ h( \d+ min)?|\d+(\.\d+)? days) \(an estimate: 38001 mesh points × /);
    expect(msg).toContain('--allow-long');
  });
  it('workers share the points: two designs on two workers cost what one does on one', async () => {
    const { model } = await loadCase('cases/demo.yaml', { cwd: ROOT });
    const one = engineCost(model, [5000, 6000]);
    const both = combinedCost([one, one], 2);
    expect(both.seconds).toBeCloseTo(one.seconds, 9);
    expect(both.points).toBe(4);
  });
});
