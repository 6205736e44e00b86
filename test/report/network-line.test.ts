/** The network in one line, from the model (own regression, no external source). */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { networkLine } from '../../src/report/network-line.js';
import { units } from '../../src/report/units.js';

describe('the network in one line', () => {
  it('the demo: the assembly line (analysis/network-line.ts) in the report units', async () => {
    const { model } = await loadCase('cases/demo.yaml');
    expect(networkLine(model, units('metric'))).toBe('ambient → runner 380×40 → valve → cylinder → exhaust at 105.0 kPa (pipe sizes length × diameter in mm)');
  });

  it('an airbox with its snorkel, a tapered runner in inches', async () => {
    const airbox = await loadCase('cases/airbox-single.yaml');
    expect(networkLine(airbox.model, units('metric'))).toMatch(/^ambient → snorkel \d+×\d+ → airbox \d+\.\d\d L → runner \d+×\d+ → valve → cylinder → /);
    const kart = await loadCase('cases/kart-single.yaml');
    expect(networkLine(kart.model, units('imperial'))).toMatch(/runner [\d.]+ \([\d.]+→[\d.]+\) → .*\(pipe sizes length × diameter in in\)$/);
  });
});
