/** The network in one line, from the model (own regression, no external source). */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { networkLine } from '../../src/report/network-line.js';
import { units } from '../../src/report/units.js';

describe('the network in one line', () => {
  it('the demo: ambient, bellmouth, runner, valves, cylinder, exhaust', async () => {
    const { model } = await loadCase('cases/demo.yaml');
    expect(networkLine(model, units('metric'))).toBe(
      'ambient 101.3 kPa, 20.0 °C → bellmouth (K 0.05) → runner 380.0 mm, Ø 40.0 mm → 2 intake valves Ø 35.0 mm → cylinder 449.3 cc → 2 exhaust valves Ø 29.0 mm → exhaust 105.0 kPa',
    );
  });

  it('a plenum and a runner of sections', async () => {
    const airbox = await loadCase('cases/airbox-single.yaml');
    expect(networkLine(airbox.model, units('metric'))).toMatch(/^ambient .* → feed Ø \d+\.\d mm \(Cd [\d.]+\) → plenum \d+\.\d\d L → /);
    const kart = await loadCase('cases/kart-single.yaml');
    expect(networkLine(kart.model, units('imperial'))).toMatch(/runner [\d.]+ in in 3 sections, Ø [\d.–]+ \/ [\d.–]+ \/ [\d.–]+ in/);
  });
});
