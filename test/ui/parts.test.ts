/**
 * The terminal view and the parts of a case beyond the runner: the Runner
 * view picks any pipe (runner, snorkel, exhaust, resonators), the Valve view
 * draws the exhaust-port pressure, the Case view offers the parts' sizes.
 * On the real core, with the bundled cases at a coarse mesh.
 */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { fieldValues } from '../../src/ui/case-session.js';
import { shownPipe } from '../../src/ui/app.js';
import { runnerScreen, reversedMap } from '../../src/ui/runner-screen.js';
import { valveScreen } from '../../src/ui/valve-screen.js';
import { initialState, reduce, type PointShown, type UiState } from '../../src/ui/state.js';
import { keyToAction } from '../../src/ui/keys.js';
import { GLYPH } from '../../src/ui/chart.js';

const COARSE = ['numerics.meshSize=20mm'];

async function point(file: string): Promise<PointShown> {
  const { model } = await loadCase(file, { set: COARSE });
  const { result } = simulatePoint(model);
  return { result, label: 'as loaded', ambient: model.ambient.pressure, upstream: model.inlet.kind };
}

describe('the Runner view shows every pipe of the case', () => {
  it('↑ and ↓ pick the pipe; the exhaust pipe is drawn with its valve end at the top', async () => {
    const p = await point('cases/enduro-single.yaml');
    let s: UiState = { ...initialState({ values: { rpm: 7000 }, sweepPlan: { rpms: [7000], band: { from: 6000, to: 8000 } }, suggestedSavePath: 'x.yaml' }), view: 'runner', point: p };
    const down = keyToAction('', { downArrow: true }, s);
    expect(down).toEqual({ type: 'pipe', by: 1 });
    s = reduce(s, down!);
    expect(s.pipeIndex).toBe(1);
    s = reduce(s, { type: 'pipe', by: 1 });
    expect(s.pipeIndex).toBe(0); // wraps: the case has two pipes
    const pipe = shownPipe(p, 1)!;
    expect(pipe).toMatchObject({ name: 'exhaust', top: 'valve', bottom: 'outlet', startOnTop: true, count: 2 });
    const map = p.result.pipes[1]!;
    const crank = (p.result.events.evo + 20) % 720;
    const lines = runnerScreen({
      width: 80,
      rows: 20,
      crank,
      from: 0,
      span: 720,
      map: { x: map.x, pressure: map.pressure, ambient: p.ambient },
      events: p.result.events,
      runnerLength: p.result.runnerLength,
      upstream: 'ambient',
      rpm: 7000,
      pipe,
    });
    expect(lines[0]).toContain('exhaust');
    // the readout's top end is the exhaust valve end: the exhaust-port trace at that crank angle
    const top = (p.result.trace.exhaustPortPressure[crank]! - p.ambient) / 1000;
    const shown = /valve end ([+−-][\d.]+) kPa/.exec(lines.find((l) => l.startsWith(`At ${crank}°`)) ?? '');
    expect(shown).not.toBeNull();
    // the map samples the pipe state at the step after the degree, the trace interpolates: close, not equal
    const v = Number(shown![1]!.replace('−', '-'));
    const nx = map.x.length;
    const outlet = (map.pressure[crank * nx + nx - 1]! - p.ambient) / 1000;
    expect(Math.abs(v - top)).toBeLessThan(1.5);
    expect(Math.abs(v - top)).toBeLessThan(Math.abs(v - outlet));
  }, 30_000);

  it('a case with only a runner says so instead of switching', async () => {
    const p = await point('cases/demo.yaml');
    const s = reduce({ ...initialState({ values: { rpm: 6500 }, sweepPlan: { rpms: [6500], band: { from: 6000, to: 7000 } }, suggestedSavePath: 'x.yaml' }), point: p }, { type: 'pipe', by: 1 });
    expect(s.pipeIndex).toBe(0);
    expect(s.message?.text).toMatch(/one pipe/);
    expect(shownPipe(p, 0)).toBeUndefined();
  }, 30_000);

  it('reversing a map puts its first node last (pure)', () => {
    const m = reversedMap({ x: [0, 1, 3], pressure: [1, 2, 3, 4, 5, 6], ambient: 0 });
    expect(Array.from(m.x)).toEqual([0, 2, 3]);
    expect(Array.from(m.pressure)).toEqual([3, 2, 1, 6, 5, 4]);
  });
});

describe('the Valve view draws the exhaust-port pressure when the case has an exhaust pipe', () => {
  it('its glyph, its legend and its value at the cursor', async () => {
    const p = await point('cases/enduro-single.yaml');
    const t = p.result.trace;
    const base = { width: 100, rows: 24, crank: 10, from: 0, span: 720, now: t, reference: p.ambient, events: p.result.events };
    const withPort = valveScreen({ ...base, exhaustPort: t.exhaustPortPressure }).join('\n');
    const without = valveScreen(base).join('\n');
    expect(withPort).toContain(GLYPH.second);
    expect(withPort).toContain('exh. port');
    expect(withPort).toMatch(/exhaust port [+−-]\d/);
    expect(without).not.toContain(GLYPH.second);
  }, 30_000);
});

describe('the Case view offers the sizes of the parts', () => {
  it.each([
    ['cases/airbox-single.yaml', ['inlet.volume', 'inlet.snorkel.length', 'inlet.snorkel.diameter']],
    ['cases/enduro-single.yaml', ['exhaust.pipe.length', 'exhaust.pipe.diameter']],
    ['cases/resonator-single.yaml', ['runner.resonator.0.at', 'runner.resonator.0.length', 'runner.resonator.0.diameter']],
  ])('%s', async (file, paths) => {
    const loaded = await loadCase(file);
    const { fields, values } = fieldValues(loaded);
    for (const path of paths) {
      expect(fields.map((f) => f.path)).toContain(path);
      expect(values[path]).toBeGreaterThan(0);
    }
  });
  it('a Helmholtz resonator shows its neck and volume, in litres', async () => {
    const loaded = await loadCase('cases/resonator-single.yaml', {
      set: ['runner.resonator.0.length=', 'runner.resonator.0.diameter=', 'runner.resonator.0.neckLength=40mm', 'runner.resonator.0.neckDiameter=18mm', 'runner.resonator.0.volume=0.3L'],
    });
    const { values } = fieldValues(loaded);
    expect(values['runner.resonator.0.neckLength']).toBeCloseTo(40, 9);
    expect(values['runner.resonator.0.volume']).toBeCloseTo(0.3, 9);
    expect(values['runner.resonator.0.length']).toBeUndefined();
  });
});
