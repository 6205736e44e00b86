/**
 * tune --search against the grid it replaces (issue 15): on two bundled
 * cases the Nelder–Mead walk must find a design within 0.5 % (relative) of
 * the grid's best band-mean ηv, simulating at most a quarter of the grid's
 * designs. The grid is simulated here too, with the same case, speeds and
 * band: the reference is our own grid, not a stored number. A coarse 20 mm
 * mesh and four speeds keep it to a few tens of seconds.
 */
import { describe, expect, it } from 'vitest';
import { memoryIo } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/main.js';
import { ROOT } from './helpers.js';

interface TuneJson {
  designs: { values: Record<string, number>; meanVolumetricEfficiency: number; rank: number }[];
  edges: string[];
  stats: { designs: number };
  search?: { evaluations: number; budget: number; gridDesigns: number; library: string };
  evaluations?: { evaluation: number; values: Record<string, number>; meanVolumetricEfficiency: number }[];
  path?: { evaluation: number; meanVolumetricEfficiency: number }[];
}

async function tune(argv: string[]): Promise<{ json: TuneJson; err: string }> {
  const io = memoryIo({ cwd: ROOT });
  const code = await runCli(['tune', ...argv, '--json'], io);
  expect(code, io.err()).toBe(0);
  return { json: JSON.parse(io.out()) as TuneJson, err: io.err() };
}

describe.each([
  {
    name: 'demo (runner length × intake closing)',
    argv: ['cases/demo.yaml', '--vary', 'runner.length=250mm:500mm:25mm', '--vary', 'intake.closes=30:80:10', '--rpm', '5000:8000:1000', '--band', '5000:8000'],
  },
  {
    name: 'kart (tapered runner middle section × intake closing)',
    argv: ['cases/kart-single.yaml', '--vary', 'runner.sections.1.length=140mm:340mm:20mm', '--vary', 'intake.closes=25:75:10', '--rpm', '4000:7000:1000', '--band', '4000:7000'],
  },
])('tune --search on $name', ({ argv }) => {
  const common = [...argv, '--set', 'numerics.meshSize=20mm', '--jobs', '2'];
  it('comes within 0.5 % of the grid best with at most a quarter of its designs', async () => {
    const grid = (await tune(common)).json;
    const gridDesigns = grid.stats.designs;
    expect(gridDesigns).toBe(66);
    const budget = Math.floor(gridDesigns / 4);
    const { json: s } = await tune([...common, '--search', '--budget', String(budget)]);
    expect(s.search!.evaluations).toBeLessThanOrEqual(budget);
    expect(s.search!.gridDesigns).toBe(gridDesigns);
    expect(s.evaluations).toHaveLength(s.search!.evaluations);
    expect(s.designs).toHaveLength(s.search!.evaluations);
    const gridBest = grid.designs[0]!.meanVolumetricEfficiency;
    const found = s.designs[0]!.meanVolumetricEfficiency;
    expect(found).toBeGreaterThanOrEqual(gridBest * (1 - 0.005));
    // the walk only climbs, and ends at the best design found
    const climbs = s.path!.map((p) => p.meanVolumetricEfficiency);
    expect([...climbs].sort((a, b) => a - b)).toEqual(climbs);
    expect(climbs[climbs.length - 1]).toBe(found);
  });
});
