/**
 * The engine built as an assembly (core/network/assemble.ts): the new parts
 * at engine level, checked against the physics they stand for.
 */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { assembleEngine } from '../../src/core/network/assemble.js';
import { Network } from '../../src/core/network/network.js';
import { Chamber } from '../../src/core/network/volumes.js';
import { totalLength } from '../../src/core/pipe/mesh.js';
import { caseEstimates } from '../../src/analysis/estimates.js';
import { run, spectrumAt } from '../support/network-driver.js';
import { testEngine } from '../support/engine-fixture.js';

const ENGINE_CASES = ['cases/demo.yaml', 'cases/kart-single.yaml', 'cases/airbox-single.yaml', 'cases/resonator-single.yaml'];

describe('the airbox with a snorkel rings at its Helmholtz frequency', () => {
  it('cases/airbox-single.yaml: after a 5 kPa step in the box, valves shut, the plenum pressure spectrum peaks within 10 % of the estimate `check` prints (Kinsler et al., Fundamentals of Acoustics)', async () => {
    const { model } = await loadCase('cases/airbox-single.yaml');
    const estimate = caseEstimates(model, 3000, 10000).plenumFrequency!;
    const net = new Network(assembleEngine(model).network);
    const box = net.volume('plenum') as Chamber;
    box.reset(box.pressure + 5000, box.temperature);
    const t: number[] = [];
    const y: number[] = [];
    // θ = 360: both valves shut (compression TDC)
    run(net, 12 / estimate, (tt) => {
      t.push(tt);
      y.push(box.pressure);
    }, 360);
    const mean = y.reduce((s, v) => s + v, 0) / y.length;
    const dev = y.map((v) => v - mean);
    let best = { f: 0, a: 0 };
    for (let f = 10; f <= 1000; f += 0.5) {
      const a = spectrumAt(t, dev, f);
      if (a > best.a) best = { f, a };
    }
    expect(Math.abs(best.f / estimate - 1)).toBeLessThan(0.1);
    // and it rings: the box pressure undershoots its starting level (a plain orifice feed would only decay)
    expect(Math.min(...y)).toBeLessThan(model.ambient.pressure - 1000);
  });
});

describe('an exhaust pipe instead of the constant reservoir', () => {
  it.each(ENGINE_CASES)('%s with a 600 × 36 mm pipe at 1500 rpm: ηv above 0.6 and residual 2 to 20 per cent (typical full-load four-stroke range, Heywood 1988 ch. 6, from memory)', async (file) => {
    const { model } = await loadCase(file, { set: ['exhaust.pipe.length=600mm', 'exhaust.pipe.diameter=36mm'], rpm: 1500 });
    const { result } = simulatePoint(model);
    expect(result.volumetricEfficiency).toBeGreaterThan(0.6);
    expect(result.residualFraction).toBeGreaterThan(0.02);
    expect(result.residualFraction).toBeLessThan(0.2);
    expect(Math.abs(result.massImbalance)).toBeLessThan(0.005);
  });

  it('two exhaust lengths give different intake ηv curves (the exhaust pulse at overlap matters; common practice)', async () => {
    const curve = async (len: string) => {
      const out: number[] = [];
      for (const rpm of [5000, 6500, 8000]) {
        const { model } = await loadCase('cases/enduro-single.yaml', { set: [`exhaust.pipe.length=${len}`], rpm });
        out.push(simulatePoint(model).result.volumetricEfficiency);
      }
      return out;
    };
    const a = await curve('450mm');
    const b = await curve('900mm');
    const biggest = Math.max(...a.map((v, i) => Math.abs(v - b[i]!)));
    expect(biggest).toBeGreaterThan(0.02);
  });

  it('the blowdown runs down the pipe: the exhaust-port pressure peaks after EVO well above the back pressure, and the trace is in the result', async () => {
    const { model } = await loadCase('cases/enduro-single.yaml');
    const { result } = simulatePoint(model);
    const port = result.trace.exhaustPortPressure;
    let jMax = 0;
    for (let j = 0; j < 720; j++) if (port[j]! > port[jMax]!) jMax = j;
    const sinceEvo = (jMax - result.events.evo + 720) % 720;
    expect(port[jMax]!).toBeGreaterThan(1.3 * model.exhaust.backPressure);
    expect(sinceEvo).toBeLessThan(120);
    expect(result.pipes.map((p) => p.name)).toEqual(['runner', 'exhaust']);
  });
});

describe('side resonators split the runner with a junction', () => {
  it('the runner pieces add up to the runner, the resonator is a pipe of its own and the runner map spans the whole runner', async () => {
    const { model } = await loadCase('cases/resonator-single.yaml');
    const asm = assembleEngine(model);
    expect(asm.runner).toEqual(['runner-1', 'runner-2']);
    const lengths = asm.runner.map((n) => totalLength(asm.network.pipes.find((p) => p.name === n)!.sections));
    expect(lengths[0]! + lengths[1]!).toBeCloseTo(totalLength(model.runner.sections), 12);
    expect(lengths[1]).toBeCloseTo(model.runner.resonators![0]!.at, 12);
    expect(asm.network.connectors.filter((c) => c.kind === 'junction')).toHaveLength(1);
    const { result } = simulatePoint({ ...model, rpm: 9000 });
    expect(result.pipes[0]!.length).toBeCloseTo(totalLength(model.runner.sections), 12);
    expect(result.runnerMap.x[result.runnerMap.x.length - 1]).toBeCloseTo(totalLength(model.runner.sections), 12);
    expect(result.pipes.map((p) => p.role)).toEqual(['runner', 'resonator']);
  });

  it('a side tube changes the curve where its quarter wave falls, a Helmholtz resonator too', async () => {
    const at = async (set: string[], rpm: number) => simulatePoint((await loadCase('cases/resonator-single.yaml', { set, rpm })).model).result.volumetricEfficiency;
    const without = await at(['runner.resonator=[]'], 9000);
    const tube = await at([], 9000);
    const helm = await at(['runner.resonator.0.length=', 'runner.resonator.0.diameter=', 'runner.resonator.0.neckLength=40mm', 'runner.resonator.0.neckDiameter=18mm', 'runner.resonator.0.volume=0.3L'], 9000);
    expect(Math.abs(tube - without)).toBeGreaterThan(0.02);
    expect(Math.abs(helm - without)).toBeGreaterThan(0.02);
  });

  it('a resonator tube too narrow to matter gives nearly the plain runner (the junction is transparent when the branch carries nothing)', () => {
    const plain = simulatePoint(testEngine({ rpm: 7000 })).result.volumetricEfficiency;
    const m = testEngine({ rpm: 7000 });
    m.runner.resonators = [{ kind: 'tube', at: 0.15, length: 0.05, diameter: 0.002 }];
    const tiny = simulatePoint(m).result.volumetricEfficiency;
    expect(Math.abs(tiny / plain - 1)).toBeLessThan(0.003);
  });
});
