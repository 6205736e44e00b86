import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import YAML from 'yaml';
import { cli, ROOT } from './helpers.js';
import { baseCase } from '../case/fixture.js';

const dir = mkdtempSync(join(tmpdir(), 'tractwave-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const RUN_FIELDS = [
  'rpm', 'converged', 'cycles', 'volumetricEfficiency', 'deliveredMass', 'inletMass', 'massImbalance', 'trappedMass',
  'ivcPressure', 'residualFraction', 'valvePressureAtIvo', 'valvePressureAtIvc', 'peakReverseFlow', 'events', 'pulse', 'stats', 'trace',
  'warnings',
  'volumetricEfficiencyBasis',
];

describe('run --json on the demo (DESIGN §3)', async () => {
  const r = await cli(['run', 'cases/demo.yaml', '--json']);
  const j = JSON.parse(r.out);
  it('exits 0 with one JSON document', () => {
    expect(r.code).toBe(0);
    expect(r.out.trim().split('\n')).toHaveLength(1);
  });
  it('has exactly the documented fields', () => {
    expect(Object.keys(j).sort()).toEqual([...RUN_FIELDS].sort());
    expect(Object.keys(j.events).sort()).toEqual(['evc', 'evo', 'ivc', 'ivo']);
    expect(Object.keys(j.stats).sort()).toEqual(['nodes', 'scheme', 'steps', 'wallSeconds']);
    expect(Object.keys(j.trace).sort()).toEqual(['crank', 'cylinderMass', 'cylinderPressure', 'lift', 'valveFlow', 'valvePressure']);
    expect(typeof j.pulse.verdict).toBe('string');
    expect(j.stats.wallSeconds).toBeGreaterThan(0);
  });
  it('has a 720-sample trace with θ increasing', () => {
    for (const k of Object.keys(j.trace)) expect(j.trace[k]).toHaveLength(720);
    const crank: number[] = j.trace.crank;
    for (let i = 1; i < 720; i++) expect(crank[i]!).toBeGreaterThan(crank[i - 1]!);
    expect(crank[0]).toBe(0);
    expect(crank[719]).toBe(719);
  });
  it('gives the events of the 30/60/60/30 card as θ', () => {
    expect(j.events).toEqual({ ivo: 690, ivc: 240, evo: 480, evc: 30 });
  });
  it('reports ηv as delivered mass over ambient density × swept volume (Heywood 1988, eq. 2.27, per-cycle form)', () => {
    // demo, worked by hand: Vd = π/4 · 97² · 60.8 mm³ = 449.30 cm³, ambient 101.325 kPa and 20 °C:
    // ρ = 101325 / (287.05 · 293.15) = 1.20412 kg/m³ → reference mass 541.011 mg
    expect(Math.abs((j.volumetricEfficiency * 541.011e-6) / j.deliveredMass - 1)).toBeLessThan(1e-5);
    expect(j.massImbalance).toBeCloseTo((j.inletMass - j.deliveredMass) / j.deliveredMass, 9);
  });
});

describe('run: text, --rpm, non-convergence, --csv', () => {
  it('prints the tuner summary', async () => {
    const r = await cli(['run', 'cases/demo.yaml']);
    expect(r.code).toBe(0);
    for (const s of ['volumetric efficiency', 'trapped mass at IVC', 'residual gas', 'valve pressure at IVO', 'peak reverse flow', 'mass balance', 'verdict:', 'IVC', '30.0° BTDC', 'estimates'])
      expect(r.out).toContain(s);
  });
  it('--rpm overrides the case speed', async () => {
    const r = await cli(['run', 'cases/kart-single.yaml', '--rpm', '4000rpm', '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).rpm).toBe(4000);
  });
  it('a run that does not converge exits 0 with converged false and a warning (DESIGN §3)', async () => {
    const r = await cli(['run', 'cases/demo.yaml', '--set', 'numerics.maxCycles=1', '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).converged).toBe(false);
    expect(r.err).toMatch(/^warning: not converged after 1 cycles/m);
  });
  it('--csv writes the trace with units in the header, atomically, and refuses to overwrite without --force', async () => {
    const f = join(dir, 'trace.csv');
    const first = await cli(['run', 'cases/demo.yaml', '--csv', f]);
    expect(first.code).toBe(0);
    const lines = readFileSync(f, 'utf8').trim().split('\n');
    expect(lines[0]).toBe('crank_deg,valve_pressure_Pa,valve_flow_kg_per_s,cylinder_pressure_Pa,cylinder_mass_kg,intake_lift_m,exhaust_lift_m,inlet_flow_kg_per_s,plenum_pressure_Pa');
    expect(lines).toHaveLength(721);
    expect(lines[1]!.split(',')[0]).toBe('0');
    expect(lines[720]!.split(',').map(Number).every(Number.isFinite)).toBe(true);
    writeFileSync(f, 'mine\n');
    const again = await cli(['run', 'cases/demo.yaml', '--csv', f]);
    expect(again.code).toBe(2);
    expect(again.err).toContain('--force');
    expect(readFileSync(f, 'utf8')).toBe('mine\n');
    const forced = await cli(['run', 'cases/demo.yaml', '--csv', f, '--force']);
    expect(forced.code).toBe(0);
    expect(readFileSync(f, 'utf8').split('\n')).toHaveLength(722);
    expect(readdirSync(dir).filter((n) => n.endsWith('.tmp'))).toEqual([]);
  });
});

describe('every engine case runs', () => {
  it.each(['demo', 'kart-single', 'airbox-single'])('%s', async (name) => {
    const r = await cli(['run', `cases/${name}.yaml`, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.volumetricEfficiency).toBeGreaterThan(0.3);
    expect(j.volumetricEfficiency).toBeLessThan(1.6);
    expect(j.trace.valvePressure).toHaveLength(720);
  });
});

describe('check: derived geometry and hand estimates', async () => {
  // the Heywood example engine (B = S = 86 mm, l 143.5 mm, rc 10) with a 300 mm x 40 mm runner at 20 °C
  const f = join(dir, 'heywood.yaml');
  writeFileSync(f, YAML.stringify(baseCase()));
  const r = await cli(['check', f]);
  it('exits 0', () => expect(r.code).toBe(0));
  it('displacement 499.6 cc and clearance 55.5 cc (computed from Heywood 1988 eqs. 2.4–2.6: 499.557 / 55.506 cm³)', () => {
    expect(r.out).toMatch(/displacement\s+499\.6 cc/);
    expect(r.out).toMatch(/clearance volume\s+55\.5 cc/);
  });
  it('curtain area 2·π·D·L at max lift (Heywood 1988 §6.3 definition): 2 · π · 33 · 9 mm² = 18.66 cm²', () => {
    expect(r.out).toMatch(/intake curtain area\s+18\.66 cm²/);
  });
  it('quarter-wave 274.8 Hz with the 0.6133·r end correction (Kinsler et al.; Levine & Schwinger 1948; REFERENCES example 274.79 Hz)', () => {
    expect(r.out).toMatch(/quarter-wave frequency\s+274\.8 Hz/);
  });
  it('wave round trip 12·N·L/a at the case speed (kinematics): 12 · 6500 · 0.3 / 343.23 = 68.2°', () => {
    // a = 343.23 m/s at 20 °C (REFERENCES.md)
    expect(r.out).toContain('68.2° of crank at 6500 rpm');
  });
  it('Helmholtz estimate f = (a/2π)·√(A/(L·Veff)), Veff = (Vd/2)(rc+1)/(rc−1) (Engelman 1973; form and constants from memory): 202.3 Hz', () => {
    // worked by hand: a 343.23 m/s, A = π · 20² mm², L 0.3 m, Vd 499.557 cm³, Veff = 305.285 cm³ → 202.35 Hz
    expect(r.out).toMatch(/Helmholtz, runner\+cylinder\s+202\.3 Hz/);
  });
  it('shows the events as card and as θ', () => {
    expect(r.out).toContain('opens 30.0° BTDC, closes 60.0° ABDC');
    expect(r.out).toMatch(/intake opens \(IVO\)\s+θ\s+690\.0°/);
    expect(r.out).toMatch(/overlap 60\.0°/);
  });
  it('lines fit an 80-column terminal', () => {
    for (const line of r.out.split('\n')) expect([...line].length).toBeLessThanOrEqual(80);
  });
});

describe('pipe: Sod shock tube through the command (Toro 2009, Table 4.3)', async () => {
  const r = await cli(['pipe', 'cases/pipe-sod.yaml', '--json']);
  const j = JSON.parse(r.out);
  it('prints x and the snapshots at the requested times', () => {
    expect(r.code).toBe(0);
    expect(j.snapshots.map((s: { time: number }) => s.time)).toEqual([0, 0.0003, 0.000632, 0.0012]);
    for (const s of j.snapshots) {
      expect(s.pressure).toHaveLength(j.x.length);
      expect(s.velocity).toHaveLength(j.x.length);
      expect(s.temperature).toHaveLength(j.x.length);
    }
  });
  it('star region p* = 0.30313·p_L and u* = 0.92745·√(p_L/ρ_L) within 2 % at t = 0.2 L/√(p_L/ρ_L)', () => {
    // p_L = 1e5 Pa, ρ_L = 1.000 kg/m³ → velocity scale 316.23 m/s; t = 0.632 ms.
    // At that time the star region spans x ≈ 0.49…0.85 m (contact at 0.69 m).
    const snap = j.snapshots[2];
    for (const x of [0.6, 0.78]) {
      const i = j.x.findIndex((xi: number) => xi >= x);
      expect(snap.pressure[i] / 30313).toBeGreaterThan(0.98);
      expect(snap.pressure[i] / 30313).toBeLessThan(1.02);
      expect(snap.velocity[i] / (0.92745 * Math.sqrt(1e5 / 1.0))).toBeGreaterThan(0.98);
      expect(snap.velocity[i] / (0.92745 * Math.sqrt(1e5 / 1.0))).toBeLessThan(1.02);
    }
  });
  it('text output: the exact solution beside the shock tube while no wave has reached an end; p* = 30.31 kPa (Toro 2009, Table 4.3: 0.30313 p_L)', async () => {
    const t = await cli(['pipe', 'cases/pipe-sod.yaml']);
    expect(t.code).toBe(0);
    const blocks = t.out.split(/\n(?=t = )/).slice(1);
    expect(blocks).toHaveLength(4);
    // t = 0: the initial split, no exact column; 0.3 and 0.632 ms: exact columns; 1.2 ms: the shock has reflected
    expect(blocks.map((b) => /p \[kPa\]\s+exact\s+u \[m\/s\]\s+exact\s+T \[°C\]\s+exact/.test(b))).toEqual([false, true, true, false]);
    expect(blocks[3]).toContain('a wave has reached an end');
    const row = blocks[2]!.split('\n').find((l) => l.trimStart().startsWith('0.600')) ?? '';
    const [, pNum, pExact, uNum, uExact] = row.trim().split(/\s+/).map(Number);
    expect(pExact).toBeCloseTo(30.31, 2);
    expect(uExact).toBeCloseTo(293.3, 1); // u* = 0.92745·√(p_L/ρ_L) = 293.3 m/s
    expect(Math.abs(pNum! / pExact! - 1)).toBeLessThan(0.02);
    expect(Math.abs(uNum! / uExact! - 1)).toBeLessThan(0.02);
    expect(t.out).toContain('Toro 2009');
  });
  it('text output: --rows, else as many rows as the terminal holds (at least 11), 11 when not a terminal', async () => {
    const rowsOf = (out: string) => out.split(/\n(?=t = )/)[1]!.split('\n').filter((l) => /^\s+\d+\.\d{3}\s/.test(l)).length;
    expect(rowsOf((await cli(['pipe', 'cases/pipe-sod.yaml'])).out)).toBe(11);
    expect(rowsOf((await cli(['pipe', 'cases/pipe-sod.yaml', '--rows', '41'])).out)).toBe(41);
    const { runCli } = await import('../../src/cli/main.js');
    const { memoryIo } = await import('../../src/cli/io.js');
    const io = memoryIo({ cwd: ROOT, stdoutIsTTY: true, stdoutRows: 40 });
    expect(await runCli(['pipe', 'cases/pipe-sod.yaml'], io)).toBe(0);
    expect(rowsOf(io.out())).toBe(35);
    const bad = await cli(['pipe', 'cases/pipe-sod.yaml', '--rows', 'many']);
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('--rows');
  });
  it('text output shows a table per snapshot', async () => {
    const t = await cli(['pipe', 'cases/pipe-pulse.yaml']);
    expect(t.code).toBe(0);
    expect(t.out.match(/x \[m\]\s+p \[kPa\]\s+u \[m\/s\]\s+T \[°C\]/g)).toHaveLength(6);
    const imperial = await cli(['pipe', 'cases/pipe-pulse.yaml', '--units', 'imperial']);
    expect(imperial.out.match(/x \[in\]\s+p \[psi\]\s+u \[ft\/s\]\s+T \[°F\]/g)).toHaveLength(6);
  });
});

describe('help', () => {
  it('top-level help lists the commands and ends with the safety caution (DESIGN §5)', async () => {
    const r = await cli(['--help']);
    expect(r.code).toBe(0);
    for (const c of ['run', 'check', 'pipe']) expect(r.out).toMatch(new RegExp(`^  ${c}\\s`, 'm'));
    expect(r.out).toMatch(/Caution: results are estimates[\s\S]*lean[\s\S]*detonation[\s\S]*emissions[\s\S]*regulations/);
    expect(r.out.trimEnd().endsWith('qualified practice.')).toBe(true);
  });
  it.each(['run', 'check', 'pipe'])('%s --help', async (c) => {
    const r = await cli([c, '--help']);
    expect(r.code).toBe(0);
    expect(r.out.startsWith(`usage: tractwave ${c} `)).toBe(true);
    const viaHelp = await cli(['help', c]);
    expect(viaHelp.out).toBe(r.out);
  });
  it('sweep --help names only columns the sweep table shows', async () => {
    const help = (await cli(['sweep', '--help'])).out;
    const table = (await cli(['sweep', 'cases/teach-short.yaml', '--rpm', '3000:3000:250'])).out;
    // the header is two rows (words above, units and the rest of the words below): a column name may span both
    const lines = table.split('\n');
    const at = lines.findIndex((l) => /^\s*rpm\s+ηv/.test(l));
    const header = at > 0 ? `${lines[at - 1]}\n${lines[at]}` : '';
    const named = [...help.matchAll(/The columns ([^.]*) say/g)].flatMap((m) => [...(m[1] ?? '').matchAll(/'([^']+)'/g)].map((q) => q[1] ?? ''));
    expect(named.length).toBeGreaterThanOrEqual(2);
    for (const column of named) for (const word of column.split(/\s+/)) expect(header, `the help names '${column}'`).toContain(word);
  });
  it('--version', async () => {
    const r = await cli(['--version']);
    expect(r.out).toMatch(/^tractwave \d+\.\d+\.\d+/);
  });
});
