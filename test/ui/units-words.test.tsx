/**
 * The view's units key (u) and glossary page (? then g), through Ink at
 * 80×24 with the fake session and engine (fixtures.ts): screen text only,
 * each step waiting for a condition. And every abbreviation any view shows at
 * 80×24 has a glossary entry (src/present/glossary.ts).
 */
import React from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render } from 'ink-testing-library';
import { App } from '../../src/ui/app.js';
import { stripAnsi } from '../../src/ui/text.js';
import { GLOSSARY, glossaryEntry, UNIT_SYSTEMS, unitOf, type Quantity } from '../../src/present/index.js';
import { fakeEngine, fakeSession } from './fixtures.js';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { pulseTiming } from '../../src/analysis/pulse.js';
import { valveScreen } from '../../src/ui/valve-screen.js';
import { runnerScreen } from '../../src/ui/runner-screen.js';
import { shownPipe } from '../../src/ui/app.js';
import { units } from '../../src/present/units.js';

const WAIT_MS = 5000;
const tick = (ms = 10): Promise<void> => new Promise((r) => setTimeout(r, ms));

function start() {
  const app = render(<App session={fakeSession()} engine={fakeEngine()} size={{ columns: 80, rows: 24 }} color={false} debounceMs={0} />);
  const frame = (): string => stripAnsi(app.lastFrame() ?? '');
  const until = async (cond: (f: string) => boolean, what: string): Promise<string> => {
    const t0 = Date.now();
    while (!cond(frame())) {
      if (Date.now() - t0 > WAIT_MS) throw new Error(`${what} never showed; the frame is:\n${frame()}`);
      await tick();
    }
    return frame();
  };
  const press = async (key: string, cond: (f: string) => boolean, what: string): Promise<string> => {
    app.stdin.write(key);
    return until(cond, what);
  };
  return { app, frame, until, press };
}

afterEach(() => cleanup());

describe('u switches every screen between metric and imperial', () => {
  it('the Valve view titles go from kPa, g/s, mg to psi, inHg, lb/min, gr and back', async () => {
    const v = start();
    let f = await v.until((x) => x.includes('At IVC') && x.includes('kPa'), 'the first point in kPa');
    expect(f).toContain('g/s');
    expect(f).not.toContain('psi');
    f = await v.press('u', (x) => x.includes('psi'), 'psi after u');
    expect(f).toContain('inHg vs ambient');
    expect(f).toContain('lb/min');
    expect(f).toMatch(/\d gr\b/);
    expect(f).not.toMatch(/\d kPa/);
    // the Runner view's readout follows too
    f = await v.press('2', (x) => x.includes('Pressure along'), 'the Runner view');
    expect(f).toMatch(/valve end [+−±]\d+\.\d+ inHg/);
    f = await v.press('u', (x) => /valve end [+−±]\d+\.\d kPa/.test(x), 'kPa again after a second u');
    for (const line of f.split('\n')) expect([...line].length).toBeLessThanOrEqual(80);
  });
});

describe('? then g: the glossary page', () => {
  it('shows the words with their meaning, k goes back to the keys, esc closes', async () => {
    const v = start();
    await v.until((x) => x.includes('At IVC'), 'the first point');
    let f = await v.press('?', (x) => x.includes('close this help'), 'the help page');
    f = await v.press('g', (x) => x.includes('Words on the screens'), 'the glossary page');
    expect(f).toContain('volumetric efficiency');
    expect(f).toContain('swept volume');
    f = await v.press('\u001b[B', (x) => !x.includes('volumetric efficiency (ηv'), 'the glossary scrolled by one line');
    f = await v.press('k', (x) => x.includes('close this help'), 'the keys again');
    await v.press('\u001b', (x) => x.includes('At IVC'), 'the Valve view after esc');
  });
});

/** the on-screen forms that count as abbreviations: two capitals or more, Greek symbols, unit symbols */
function abbreviations(frame: string): Set<string> {
  const unitLabels = new Set<string>();
  for (const s of UNIT_SYSTEMS)
    for (const q of ['length', 'shortLength', 'volume', 'smallVolume', 'pressure', 'gauge', 'barometric', 'temperature', 'torque', 'power', 'massFlow', 'mass', 'area', 'speed'] as Quantity[])
      unitLabels.add(unitOf(s, q).label);
  const found = new Set<string>();
  // shortened words: "exh. port", "dia." (a short lowercase word with a full stop inside a line)
  for (const m of frame.matchAll(/(?:^|\s)([a-z]{2,3}\.)(?= ?[a-z(]|$)/gm)) found.add(m[1]!);
  for (const tok of frame.match(/[A-Za-zηθ/·₁]+/g) ?? []) {
    const t = tok.replace(/^\/+|\/+$/g, '');
    if (t.length < 2 && !/[ηθ]/.test(t)) continue;
    if (unitLabels.has(t) || /^[ηθ]/.test(t) || (t.match(/[A-Z]/g) ?? []).length >= 2) found.add(t);
  }
  return found;
}

describe('each abbreviation any view shows at 80×24 has a glossary entry', () => {
  it('Valve, Runner, Sweep, Case and the help, in both unit systems', async () => {
    const v = start();
    const seen = new Set<string>();
    const collect = (f: string) => abbreviations(f).forEach((a) => seen.add(a));
    for (const units of ['metric', 'imperial']) {
      collect(await v.until((x) => x.includes('At IVC'), `the Valve view (${units})`));
      collect(await v.press('2', (x) => x.includes('Pressure along'), 'the Runner view'));
      collect(await v.press('3', (x) => x.includes('[3 Sweep]'), 'the Sweep view'));
      collect(await v.press('4', (x) => x.includes('Case:'), 'the Case view'));
      collect(await v.press('?', (x) => x.includes('close this help'), 'the help'));
      await v.press('\u001b', (x) => !x.includes('close this help'), 'help closed');
      await v.press('1', (x) => x.includes('[1 Valve]'), 'the Valve view again');
      if (units === 'metric') await v.press('u', (x) => x.includes('psi'), 'imperial units');
    }
    const missing = [...seen].filter((a) => !glossaryEntry(a));
    expect(missing, `abbreviations without a glossary entry: ${missing.join(', ')}`).toEqual([]);
    expect(seen.size).toBeGreaterThan(8);
    expect(GLOSSARY.length).toBeGreaterThan(20);
  });
});

describe('the abbreviations of the bundled cases\' screens (exhaust pipe, airbox, resonators) have glossary entries', () => {
  it.each(['cases/enduro-single.yaml', 'cases/airbox-single.yaml', 'cases/resonator-single.yaml'])('%s at 80×24, both unit systems', async (file) => {
    const { model } = await loadCase(file, { set: ['numerics.meshSize=20mm'] });
    const { result } = simulatePoint(model);
    const pulse = pulseTiming(result, model);
    const point = { result, label: 'as loaded', ambient: model.ambient.pressure, upstream: model.inlet.kind };
    const seen = new Set<string>();
    for (const system of UNIT_SYSTEMS) {
      const u = units(system);
      const port = result.pipes.some((p) => p.role === 'exhaust') ? result.trace.exhaustPortPressure : undefined;
      for (const crank of [0, 240, 500]) {
        const v = valveScreen({ width: 80, rows: 20, crank, from: 0, span: 720, now: result.trace, reference: model.ambient.pressure, exhaustPort: port, events: result.events, verdict: pulse.verdict, openingNote: pulse.openingNote, units: u });
        abbreviations(v.join('\n')).forEach((a) => seen.add(a));
        for (let k = 0; k < result.pipes.length; k++) {
          const m = result.pipes[k]!;
          const r = runnerScreen({ width: 80, rows: 20, crank, from: 0, span: 720, map: { x: m.x, pressure: m.pressure, ambient: model.ambient.pressure }, events: result.events, runnerLength: result.runnerLength, upstream: model.inlet.kind, rpm: result.rpm, pipe: shownPipe(point, k), valvePressure: result.trace.valvePressure, units: u });
          abbreviations(r.join('\n')).forEach((a) => seen.add(a));
        }
      }
    }
    const missing = [...seen].filter((a) => !glossaryEntry(a));
    expect(missing, `abbreviations without a glossary entry: ${missing.join(', ')}`).toEqual([]);
  });
});
