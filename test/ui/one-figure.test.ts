/**
 * One figure for the pressure at the valve on every screen: the Runner
 * view's readout of the valve end, the Valve view's title and the teaching
 * line read the same sample (the valve trace), on the real core (the demo
 * case on a coarse mesh). Our own consistency check, no external source.
 */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { runnerScreen } from '../../src/ui/runner-screen.js';
import { valveScreen } from '../../src/ui/valve-screen.js';
import { teachingLine } from '../../src/ui/teach.js';
import { IMPERIAL, METRIC } from '../../src/present/units.js';

describe('the valve-end pressure: Runner readout, Valve title and teaching line agree', async () => {
  const loaded = await loadCase('cases/demo.yaml', { set: ['numerics.meshSize=20mm'] });
  const { result: r } = simulatePoint(loaded.model);
  const ambient = loaded.model.ambient.pressure;
  const map = { x: r.runnerMap.x, pressure: r.runnerMap.pressure, ambient };
  const at = (crank: number, u = METRIC) => {
    const runner = runnerScreen({ width: 100, rows: 24, crank, from: 0, span: 720, map, events: r.events, runnerLength: r.runnerLength, upstream: 'ambient', rpm: r.rpm, valvePressure: r.trace.valvePressure, units: u }).join('\n');
    const valve = valveScreen({ width: 120, rows: 30, crank, from: 0, span: 720, now: r.trace, reference: ambient, events: r.events, units: u }).join('\n');
    const teach = teachingLine({ crank, lift: r.trace.lift[crank]!, exhaustLift: r.trace.exhaustLift[crank]!, valvePressure: r.trace.valvePressure[crank]!, valveFlow: r.trace.valveFlow[crank]!, reference: ambient, events: r.events }, u);
    return {
      runner: /valve end ([+−±]\d+\.\d+) /.exec(runner)?.[1],
      valve: /\(([+−±]\d+\.\d+)(?: inHg)? vs ambient/.exec(valve)?.[1],
      teach: /([+−±]\d+\.\d+) (?:kPa|inHg)/.exec(teach)?.[1],
    };
  };

  it('at every tenth degree the Runner readout and the Valve title give the same figure (metric and imperial)', () => {
    for (const u of [METRIC, IMPERIAL])
      for (let c = 0; c < 720; c += 10) {
        const f = at(c, u);
        expect(f.runner, `θ ${c}°`).toBeDefined();
        expect(f.runner, `θ ${c}°`).toBe(f.valve);
      }
  });

  it('and the teaching line, where it names the pressure, gives that figure too', () => {
    let named = 0;
    for (let c = 0; c < 720; c += 5) {
      const f = at(c);
      if (f.teach === undefined) continue;
      named++;
      expect(f.teach, `θ ${c}°`).toBe(f.runner);
    }
    expect(named).toBeGreaterThan(5);
  });
});
