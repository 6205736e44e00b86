/**
 * The network of parts (src/core/network): invariants of the stepper and the
 * junction, and the acoustics of the parts against published results.
 */
import { describe, expect, it } from 'vitest';
import { CV } from '../../src/core/gas.js';
import type { SchemeName } from '../../src/core/model.js';
import type { ConservativeScheme } from '../../src/core/pipe/fv.js';
import { Chamber } from '../../src/core/network/volumes.js';
import { endCorrection } from '../../src/core/network/end-correction.js';
import { SimulationError } from '../../src/core/errors.js';
import { A0, network, P0, pressureAt, run, runSteps, setPulse, spectrumAt, straight, T0 } from '../support/network-driver.js';
import { ringingFrequency } from '../support/pipe-driver.js';

const SCHEMES: SchemeName[] = ['conservative', 'characteristics'];

describe('an isolated assembly keeps its mass (and, with the conservative scheme, its energy) to round-off', () => {
  // three pipes closed at their far ends meet in a junction; a fourth pipe
  // opens into a closed chamber: nothing enters or leaves the assembly
  const build = (scheme: SchemeName) => {
    const net = network(
      [straight('a', 0.6, 0.04), straight('b', 0.4, 0.03), straight('c', 0.3, 0.05), straight('d', 0.2, 0.02)],
      [{ kind: 'chamber', name: 'box', volume: 2e-3, pressure: P0, temperature: T0 }],
      [
        { kind: 'closed', name: 'a end', end: { pipe: 'a', side: 'left' } },
        { kind: 'closed', name: 'b end', end: { pipe: 'b', side: 'right' } },
        { kind: 'junction', name: 'j', ends: [{ pipe: 'a', side: 'right' }, { pipe: 'b', side: 'left' }, { pipe: 'c', side: 'left' }] },
        { kind: 'closed', name: 'c end', end: { pipe: 'c', side: 'right' } },
        { kind: 'closed', name: 'd end', end: { pipe: 'd', side: 'left' } },
        { kind: 'open', name: 'd into box', end: { pipe: 'd', side: 'right' }, volume: 'box', entryLoss: 0 },
      ],
      scheme,
      0.01,
    );
    // a strong start: pipe a at twice the pressure and hotter
    const a = net.pipe('a');
    const n = a.scheme.mesh.n;
    a.scheme.setState(new Float64Array(n).fill(2 * P0), new Float64Array(n), new Float64Array(n).fill(350));
    return net;
  };
  const energy = (net: ReturnType<typeof build>) => {
    let e = 0;
    for (const p of net.pipes) e += (p.scheme as ConservativeScheme).energy();
    const box = net.volume('box') as Chamber;
    return e + box.mass * CV * box.temperature;
  };
  it.each(SCHEMES)('%s: mass over 10 000 steps', (scheme) => {
    const net = build(scheme);
    const m0 = net.mass();
    runSteps(net, 10_000);
    expect(Math.abs(net.mass() / m0 - 1)).toBeLessThan(1e-12);
  });
  it('conservative: energy over 10 000 steps', () => {
    const net = build('conservative');
    const e0 = energy(net);
    runSteps(net, 10_000);
    expect(Math.abs(energy(net) / e0 - 1)).toBeLessThan(1e-12);
  });
});

describe('a weak pulse into a junction of three equal pipes splits as linear acoustics says (Kinsler et al., Fundamentals of Acoustics: transmitted 2/N, reflected 2/N − 1)', () => {
  // pipe a carries a right-going pulse into the junction; b and c take it on.
  // The same pulse through a plain two-pipe joint is the reference, so the
  // schemes' own damping of the pulse divides out.
  const peak = (scheme: SchemeName, branches: number) => {
    const pipes = [straight('a', 1.5, 0.04), straight('b', 1.5, 0.04), straight('c', 1.5, 0.04)].slice(0, branches);
    const ends = pipes.map((p, i) => ({ pipe: p.name, side: i === 0 ? ('right' as const) : ('left' as const) }));
    const net = network(
      pipes,
      [],
      [
        { kind: 'closed', name: 'a end', end: { pipe: 'a', side: 'left' } },
        { kind: 'junction', name: 'j', ends },
        ...pipes.slice(1).map((p) => ({ kind: 'closed' as const, name: `${p.name} end`, end: { pipe: p.name, side: 'right' as const } })),
      ],
      scheme,
      0.005,
    );
    setPulse(net.pipe('a'), 0.9, 0.04, 400);
    let maxB = -Infinity;
    let minA = Infinity;
    // the pulse reaches the junction after 0.6 m and the probes 0.5 m later
    run(net, 1.25 / A0, (t) => {
      if (t < 0.9 / A0) return;
      maxB = Math.max(maxB, pressureAt(net.pipe('b'), 0.5) - P0);
      minA = Math.min(minA, pressureAt(net.pipe('a'), 1.0) - P0);
    });
    return { transmitted: maxB, reflected: minA };
  };
  it.each(SCHEMES)('%s', (scheme) => {
    const ref = peak(scheme, 2).transmitted;
    const three = peak(scheme, 3);
    expect(Math.abs(three.transmitted / ref / (2 / 3) - 1)).toBeLessThan(0.03);
    expect(Math.abs(three.reflected / ref / (-1 / 3) - 1)).toBeLessThan(0.03);
  });
});

describe('a closed side branch stops transmission at its quarter-wave frequency f = a/(4(L_b + δ)) (Kinsler et al., Fundamentals of Acoustics; Munjal, Acoustics of Ducts and Mufflers, 2nd ed. 2014, side-branch resonator)', () => {
  // a broadband pulse runs down a long duct past a side tube; the spectrum
  // of what passes, over the spectrum of the same pulse past no side tube,
  // is the transmission. δ: the flanged end correction the assembly gives a
  // side tube where it meets the duct (core/network/end-correction.ts).
  const Lb = 0.2;
  const Db = 0.04;
  const delta = endCorrection('flanged', Db);
  const expected = A0 / (4 * (Lb + delta));
  const record = (scheme: SchemeName, branch: boolean) => {
    const pipes = [straight('up', 6, 0.04), straight('down', 4, 0.04)];
    if (branch) pipes.push(straight('side', Lb, Db, { left: delta, right: 0 }));
    const ends = [
      { pipe: 'up', side: 'right' as const },
      { pipe: 'down', side: 'left' as const },
      ...(branch ? [{ pipe: 'side', side: 'left' as const }] : []),
    ];
    const net = network(
      pipes,
      [],
      [
        { kind: 'closed', name: 'up end', end: { pipe: 'up', side: 'left' } },
        { kind: 'junction', name: 'j', ends },
        { kind: 'closed', name: 'down end', end: { pipe: 'down', side: 'right' } },
        ...(branch ? [{ kind: 'closed' as const, name: 'side end', end: { pipe: 'side', side: 'right' as const } }] : []),
      ],
      scheme,
      0.005,
    );
    setPulse(net.pipe('up'), 5.6, 0.03, 200);
    const t: number[] = [];
    const y: number[] = [];
    // the probe 0.3 m past the junction, until an echo from either far end could arrive
    run(net, (0.4 + 0.3 + 2 * 3.6) / A0, (tt) => {
      t.push(tt);
      y.push(pressureAt(net.pipe('down'), 0.3) - P0);
    });
    return { t, y };
  };
  it.each(SCHEMES)('%s: the transmission minimum within 1 per cent (the issue asks 5), and deep', (scheme) => {
    const a = record(scheme, true);
    const b = record(scheme, false);
    let best = { f: 0, tr: Infinity };
    for (let f = 0.5 * expected; f <= 1.5 * expected; f += expected / 400) {
      const tr = spectrumAt(a.t, a.y, f) / spectrumAt(b.t, b.y, f);
      if (tr < best.tr) best = { f, tr };
    }
    expect(best.tr).toBeLessThan(0.2);
    expect(Math.abs(best.f / expected - 1)).toBeLessThan(0.01);
  });
});

describe('a pipe into a closed volume, open to the air at its other end, rings at the Helmholtz frequency f = (a/2π)·√(S/(V·L_eff)) (Kinsler et al., Fundamentals of Acoustics)', () => {
  // L_eff = L + δ_out + δ_in: both ends unflanged, δ = 0.6133·r (Levine &
  // Schwinger 1948), as the assembly extends a snorkel. The pipe's own volume
  // (7 % of V here) lowers the 1-D pipe's frequency slightly below the lumped
  // formula.
  it.each([
    ['conservative', 3e-3, 0.15, 0.045],
    ['characteristics', 3e-3, 0.15, 0.045],
    ['conservative', 6e-3, 0.1, 0.035],
  ] as const)('%s: V %f m³, neck %f m × %f m, within 5 per cent', (scheme, V, L, D) => {
    const d = endCorrection('unflanged', D);
    const net = network(
      [straight('neck', L, D, { left: d, right: d })],
      [
        { kind: 'reservoir', name: 'air', pressure: P0, temperature: T0, burned: 0 },
        { kind: 'chamber', name: 'box', volume: V, pressure: P0 + 1000, temperature: T0 * Math.pow((P0 + 1000) / P0, 0.4 / 1.4) },
      ],
      [
        { kind: 'open', name: 'mouth', end: { pipe: 'neck', side: 'left' }, volume: 'air', entryLoss: 0 },
        { kind: 'open', name: 'into box', end: { pipe: 'neck', side: 'right' }, volume: 'box', entryLoss: 0 },
      ],
      scheme,
      0.005,
    );
    const S = (Math.PI / 4) * D * D;
    const expected = (A0 / (2 * Math.PI)) * Math.sqrt(S / (V * (L + 2 * d)));
    const t: number[] = [];
    const y: number[] = [];
    const box = net.volume('box');
    run(net, 8 / expected, (tt) => {
      t.push(tt);
      y.push(box.pressure);
    });
    const f = ringingFrequency(t, y, 1);
    expect(Math.abs(f / expected - 1)).toBeLessThan(0.05);
  });
});

describe('an assembly is checked before it runs', () => {
  const pipe = straight('p', 0.3, 0.04);
  const air = { kind: 'reservoir' as const, name: 'air', pressure: P0, temperature: T0, burned: 0 };
  it.each([
    ['an end joined to nothing', [{ kind: 'closed', name: 'c', end: { pipe: 'p', side: 'left' } }], /right end of pipe 'p' is not joined/],
    [
      'an end joined twice',
      [
        { kind: 'closed', name: 'c1', end: { pipe: 'p', side: 'left' } },
        { kind: 'closed', name: 'c2', end: { pipe: 'p', side: 'left' } },
        { kind: 'closed', name: 'c3', end: { pipe: 'p', side: 'right' } },
      ],
      /left end of pipe 'p' is joined twice \('c1' and 'c2'\)/,
    ],
    [
      'a volume that does not exist',
      [
        { kind: 'closed', name: 'c1', end: { pipe: 'p', side: 'left' } },
        { kind: 'open', name: 'o', end: { pipe: 'p', side: 'right' }, volume: 'box', entryLoss: 0 },
      ],
      /connector 'o' names a volume 'box' that does not exist/,
    ],
    ['a junction of one end', [{ kind: 'junction', name: 'j', ends: [{ pipe: 'p', side: 'left' }] }, { kind: 'closed', name: 'c', end: { pipe: 'p', side: 'right' } }], /junction 'j' joins fewer than two/],
  ] as const)('%s', (_what, connectors, message) => {
    const make = () => network([pipe], [air], connectors as never, 'conservative', 0.01);
    expect(make).toThrow(SimulationError);
    expect(make).toThrow(message);
  });
});
