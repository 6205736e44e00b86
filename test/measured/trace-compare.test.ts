/**
 * A measured pressure trace against the model: the model's own trace,
 * shifted by N crank degrees, must be reported N degrees late; a sensor
 * 100 mm from the valve must be compared with the model's pressure there,
 * read off the runner's space–time map (own construction, no external source).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { compareTrace, modelPressureAt } from '../../src/analysis/trace-compare.js';
import { cli } from '../cli/helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'tractwave-trace-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const shifted = (p: ArrayLike<number>, n: number) => Float64Array.from({ length: 720 }, (_, j) => p[(((j - n) % 720) + 720) % 720]!);

describe('the model\'s own trace, shifted', async () => {
  const l = await loadCase('cases/demo.yaml');
  const { result } = simulatePoint(l.model);
  const own = result.trace.valvePressure;

  it('unshifted: the same peak, no RMS difference, agrees', () => {
    const c = compareTrace(result, l.model, own, 0);
    expect(c.lastPeakBeforeIvc.lateBy).toBeCloseTo(0, 6);
    expect(c.rms).toBe(0);
    expect(c.agrees).toBe(true);
    expect(c.ringingFrequency.measured).toBeCloseTo(c.ringingFrequency.model!, 6);
  });

  it.each([3, 7, 12, -6])('by %d degrees is reported that many degrees late (±1°)', (n) => {
    const c = compareTrace(result, l.model, shifted(own, n), 0);
    expect(c.lastPeakBeforeIvc.lateBy).not.toBeNull();
    expect(Math.abs(c.lastPeakBeforeIvc.lateBy! - n)).toBeLessThanOrEqual(1);
    expect(c.agrees).toBe(Math.abs(n) <= 5);
    expect(c.verdict).toContain(n > 0 ? 'later' : 'earlier');
  });

  it('through the command line: a CSV of the shifted trace, run --measured-trace --json', async () => {
    const n = 9;
    const p = shifted(own, n);
    const f = join(dir, 'shift9.csv');
    writeFileSync(f, `crank_deg,pressure_kPa\n${Array.from(p, (v, j) => `${j},${v / 1000}`).join('\n')}\n`);
    const r = await cli(['run', 'cases/demo.yaml', '--measured-trace', f, '--json']);
    expect(r.code, r.err).toBe(0);
    const m = JSON.parse(r.out).measuredTrace;
    expect(Object.keys(m)).toEqual(expect.arrayContaining(['lastPeakBeforeIvc', 'ringingFrequency', 'atIvo', 'atIvc', 'rms']));
    expect(Math.abs(m.lastPeakBeforeIvc.lateBy - n)).toBeLessThanOrEqual(1);
    expect(m.lastPeakBeforeIvc.measured.crank - m.lastPeakBeforeIvc.model.crank).toBeCloseTo(m.lastPeakBeforeIvc.lateBy, 9);
    // the same file with the logger's offset taken out lines up again
    const back = await cli(['run', 'cases/demo.yaml', '--measured-trace', f, '--tdc-offset', `-${n}`, '--json']);
    expect(Math.abs(JSON.parse(back.out).measuredTrace.lastPeakBeforeIvc.lateBy)).toBeLessThanOrEqual(1);
  });

  it('a gauge trace is made absolute with the case\'s ambient pressure', async () => {
    const f = join(dir, 'gauge.csv');
    // two cycles, gauge kPa
    const rows = Array.from({ length: 1440 }, (_, c) => `${c - 360},${(own[(((c - 360) % 720) + 720) % 720]! - l.model.ambient.pressure) / 1000}`);
    writeFileSync(f, `crank_deg,pressure_kPa_gauge\n${rows.join('\n')}\n`);
    const r = await cli(['run', 'cases/demo.yaml', '--measured-trace', f, '--json']);
    const m = JSON.parse(r.out).measuredTrace;
    expect(m.gauge).toBe(true);
    expect(m.rms).toBeLessThan(1e-6);
    expect(m.atIvc.measured).toBeCloseTo(m.atIvc.model, 6);
  });
});

describe('a sensor 100 mm from the valve', async () => {
  const l = await loadCase('cases/demo.yaml');
  const { result } = simulatePoint(l.model);
  const map = result.pipes[0]!;
  // by hand from the space–time map: x from the upstream end, so x = L − 0.1; linear between its two neighbours
  const L = map.x[map.x.length - 1]!;
  const x = L - 0.1;
  let k = 0;
  while (map.x[k + 1]! < x) k++;
  const w = (x - map.x[k]!) / (map.x[k + 1]! - map.x[k]!);
  const m = map.x.length;
  const byHand = Float64Array.from({ length: 720 }, (_, j) => map.pressure[j * m + k]! * (1 - w) + map.pressure[j * m + k + 1]! * w);

  it('is compared with the model\'s pressure there, off the space–time map', () => {
    const at = modelPressureAt(result, 0.1);
    for (let j = 0; j < 720; j += 37) expect(at[j]).toBeCloseTo(byHand[j]!, 6);
    const c = compareTrace(result, l.model, byHand, 0.1);
    expect(c.rms).toBeLessThan(1e-6);
    expect(c.lastPeakBeforeIvc.lateBy).toBeCloseTo(0, 6);
    // and the place matters: the valve's own trace differs from it by kilopascals
    expect(compareTrace(result, l.model, result.trace.valvePressure, 0.1).rms).toBeGreaterThan(1000);
  });

  it('the command line reads the sensor position and refuses one off the runner', async () => {
    const f = join(dir, 'at100.csv');
    writeFileSync(f, `crank_deg,pressure_kPa\n${Array.from(byHand, (v, j) => `${j},${v / 1000}`).join('\n')}\n`);
    const r = await cli(['run', 'cases/demo.yaml', '--measured-trace', f, '--sensor-at', '100mm', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out).measuredTrace;
    expect(j.sensorAt).toBeCloseTo(0.1, 12);
    expect(j.rms).toBeLessThan(1e-3);
    const text = await cli(['run', 'cases/demo.yaml', '--measured-trace', f, '--sensor-at', '100mm']);
    expect(text.out).toMatch(/measured trace .*\n  sensor 100 mm from the valve/);
    expect(text.out).toMatch(/measured pulse:[\s\S]*agrees/);
    const off = await cli(['run', 'cases/demo.yaml', '--measured-trace', f, '--sensor-at', '500mm']);
    expect(off.code).toBe(2);
    expect(off.err).toMatch(/^error: --sensor-at: must lie on the runner/);
  });
});
