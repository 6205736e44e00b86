/**
 * The runner's space–time map as text cells (rendering only, synthetic data).
 */
import { describe, expect, it } from 'vitest';
import { ABOVE, BELOW, NEAR, mapCells, mapLegend, mapLines, niceFloor, niceStep, rowNodes, shadeOf, shadeStep } from '../../src/ui/space-time.js';

describe('shade scale', () => {
  it.each([
    [0, 1000, NEAR],
    [400, 1000, NEAR],
    [600, 1000, ABOVE[0]],
    [2000, 1000, ABOVE[1]],
    [3000, 1000, ABOVE[2]],
    [4000, 1000, ABOVE[3]],
    [9000, 1000, ABOVE[3]], // beyond the scale: the strongest shade
    [-1000, 1000, BELOW[0]],
    [-2400, 1000, BELOW[1]],
    [-4000, 1000, BELOW[3]],
    [Number.NaN, 1000, '?'],
  ])('Δp %d Pa with a %d Pa step shows %j', (dp, step, ch) => {
    expect(shadeOf(dp, step)).toBe(ch);
  });

  it('uses different characters above and below ambient, none of them blank', () => {
    const all = [...ABOVE, ...BELOW];
    expect(new Set(all).size).toBe(all.length);
    expect(all).not.toContain(NEAR);
  });

  it.each([
    [0.7, 1],
    [1, 1],
    [1.2, 2],
    [2.2, 2.5],
    [3, 5],
    [7, 10],
    [1234, 2000],
    [0.031, 0.05],
  ])('rounds %d up to the 1-2-2.5-5 step %d', (v, step) => {
    expect(niceStep(v)).toBeCloseTo(step, 12);
  });

  it.each([
    [0.7, 0.5],
    [1, 1],
    [1.9, 1],
    [2.2, 2],
    [3, 2.5],
    [7, 5],
    [1429, 1000],
  ])('rounds %d down to the 1-2-2.5-5 step %d', (v, step) => {
    expect(niceFloor(v)).toBeCloseTo(step, 12);
  });
});

describe('rows of the map', () => {
  it.each([
    [5, 5, [[4], [3], [2], [1], [0]]],
    [3, 5, [[2], [2], [1], [1], [0]]],
    [6, 3, [[5, 4], [3, 2], [1, 0]]],
  ])('%i nodes on %i rows, valve end (highest node) first', (nodes, rows, expected) => {
    expect(rowNodes(nodes, rows)).toEqual(expected);
  });
});

describe('map cells', () => {
  // a single pulse: +5 kPa at node k at crank angle 10·(nodes−1−k): it starts at the valve end and travels up the runner
  const nodes = 5;
  const ambient = 100000;
  const pressure = new Float64Array(720 * nodes).fill(ambient);
  for (let k = 0; k < nodes; k++) pressure[10 * (nodes - 1 - k) * nodes + k] = ambient + 5000;
  const input = { x: Float64Array.from({ length: nodes }, (_, k) => k * 0.1), pressure, ambient };

  it('keeps the largest deviation of each cell, so a one-degree pulse is not averaged away', () => {
    const cells = mapCells(input, { from: 0, span: 720, cols: 72, rows: nodes });
    // row 0 is the valve end (node 4): pulse at 0°, column 0
    expect(cells[0]?.[0]).toBe(5000);
    // the open end (node 0) sees it at 40°, column 4
    expect(cells[4]?.[4]).toBe(5000);
    expect(cells[4]?.[0]).toBe(0);
  });

  it('shows the pulse travelling: its column moves one step per row', () => {
    const lines = mapLines(input, { from: 0, span: 720, cols: 72, rows: nodes });
    expect(lines).toHaveLength(nodes);
    lines.forEach((line, r) => {
      expect([...line]).toHaveLength(72);
      const at = [...line].findIndex((ch) => ch !== NEAR);
      expect(at).toBe(r);
    });
  });

  it('scales the shades so the largest deviation gets the strongest shade', () => {
    expect(shadeStep(input)).toBe(1000); // 5000 / 3.5 = 1429, rounded down to 1000
    const lines = mapLines(input, { from: 0, span: 720, cols: 72, rows: nodes });
    expect(lines[0]?.[0]).toBe(ABOVE[3]);
  });
});

describe('legend', () => {
  it.each([120, 80, 72, 60, 40])('fits %i columns and names the scale', (w) => {
    const text = mapLegend(20000, w);
    expect([...text].length).toBeLessThanOrEqual(w);
    if (w >= 60) {
      expect(text).toContain('kPa');
      expect(text).toContain(ABOVE[3]);
      expect(text).toContain(BELOW[3]);
    }
  });
});
