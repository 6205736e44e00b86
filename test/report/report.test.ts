/**
 * The report of each bundled case: one self-contained file, the sections
 * the issue asks for, at least four charts whose axis titles carry units,
 * and numbers equal to those of `sweep --json` and `run --json` (the same
 * functions make both: own regression, no external source).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import { cli } from '../cli/helpers.js';
import { axisTitles, BUNDLED, chartsOf, makeReport, sectionById, siValues, tempDir, type MadeReport } from './reports.js';

const tmp = tempDir();
afterAll(() => tmp.remove());

/** a value at a dotted path of a JSON object */
function at(obj: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown> | undefined)?.[k], obj);
}

describe.each(BUNDLED)('the report of cases/%s.yaml', (name) => {
  let r: MadeReport;
  let sweep: any;
  let run: any;
  beforeAll(async () => {
    r = await makeReport(tmp.dir, name, [`cases/${name}.yaml`]);
    sweep = JSON.parse((await cli(['sweep', `cases/${name}.yaml`, '--json'])).out);
    run = JSON.parse((await cli(['run', `cases/${name}.yaml`, '--rpm', String(sweep.bestRpm), '--json'])).out);
  }, 120_000);

  it('is written in one go: exit 0, one file in the folder and no temporary file left', () => {
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain(`wrote ${r.file}`);
    expect(readdirSync(tmp.dir).filter((f) => f.startsWith(`${name}.`) || f.startsWith(`.${name}.`))).toEqual([`${name}.html`]);
    expect(readdirSync(tmp.dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });

  it('needs nothing from outside: no src or href at all, no script, stylesheet link, import or url()', () => {
    const refs = [...r.html.matchAll(/\s(?:src|href|xlink:href|srcset|poster|action)\s*=\s*["']([^"']*)["']/gi)].map((m) => m[1]);
    expect(refs).toEqual([]);
    // (url(#id) points inside the document: the heat map's legend gradient)
    expect(r.html.match(/<script|<link|<iframe|<img|<object|<embed|@import|url\((?!#)/i)?.[0] ?? null).toBeNull();
    // the only URLs are the SVG and XLink namespace names, which nothing fetches
    const urls = r.html.replace(/xmlns(?::xlink)?="http:\/\/www\.w3\.org\/(?:2000\/svg|1999\/xlink)"/g, '').match(/[a-z]+:\/\/[^\s"'<>)]+/gi);
    expect(urls).toBeNull();
    expect(r.html.match(/url\(#[^)]*\)/g)?.every((u) => r.html.includes(`id="${u.slice(5, -1)}"`))).not.toBe(false);
  });

  it('holds the sections: case table, network line, date, version and numerics; speed curves; the best speed; mass balance; safety', () => {
    for (const id of ['design', 'network', 'numerics', 'speed', `point-${sweep.bestRpm}`, 'balance', 'safety']) expect(r.html.includes(`id="${id}"`), id).toBe(true);
    expect(/made \d{4}-\d\d-\d\d \d\d:\d\d UTC with tractwave \d+\.\d+\.\d+/.test(r.html)).toBe(true);
    const network = /<p class="network" id="network">([^<]*)<\/p>/.exec(r.html)?.[1] ?? '';
    // the assembly's own line (analysis/network-line.ts), as the text commands print it
    expect(network).toMatch(/^ambient → (?:.* → )?runner \d+.* → valve → cylinder → exhaust .*\(pipe sizes length × diameter in mm\)$/);
    expect(sectionById(r.html, 'numerics')).toContain(`Runner scheme <b>${run.stats.scheme}</b>`);
    for (const label of ['bore', 'stroke', 'compression ratio', 'opens (IVO)', 'closes (IVC)', 'back pressure', 'entry loss coefficient K', 'detonation', 'local regulations'])
      expect(r.html.includes(label), label).toBe(true);
  });

  it('has at least four SVG charts, and every axis title carries its unit in brackets', () => {
    const charts = chartsOf(r.html);
    expect(charts.size).toBeGreaterThanOrEqual(4);
    // the other pipes of the case (snorkel, exhaust pipe, resonators) each get a map of their own after the runner's
    const others = [...charts.keys()].filter((k) => k.startsWith('pipe-'));
    expect([...charts.keys()]).toEqual(['speed-ve', 'speed-output', `valve-${sweep.bestRpm}rpm`, `runner-${sweep.bestRpm}rpm`, ...others, 'mass-balance']);
    const expected: Record<string, string[]> = { 'airbox-single': ['snorkel'], 'resonator-single': ['resonator-1'], demo: [] };
    if (expected[name]) expect(others).toEqual(expected[name]!.map((p) => `pipe-${p}-${sweep.bestRpm}rpm`));
    for (const k of others) expect(axisTitles(charts.get(k)!, 'legend'), k).toEqual(['pressure [kPa]']);
    for (const [chart, svg] of charts) {
      const titles = axisTitles(svg);
      expect(titles.length, chart).toBeGreaterThanOrEqual(2);
      for (const t of titles) expect(t, `${chart}: ${t}`).toMatch(/\[[^\]]+\]/);
    }
    // the heat map's legend is in pressure units
    expect(axisTitles(charts.get(`runner-${sweep.bestRpm}rpm`)!, 'legend')).toEqual(['pressure [kPa]']);
  });

  it('shows the numbers of sweep --json: every speed, the band mean and the best speed', () => {
    const balance = sectionById(r.html, 'balance');
    expect(sweep.points.length).toBeGreaterThan(5);
    for (const p of sweep.points) {
      const row = new RegExp(`<tr data-rpm="${p.rpm}">([\\s\\S]*?)</tr>`).exec(balance)?.[1] ?? '';
      const v = siValues(row);
      for (const key of ['volumetricEfficiency', 'torque', 'power', 'massImbalance', 'cycles']) expect(Number(v.get(key)), `${p.rpm} ${key}`).toBe(p[key]);
      expect(row).toContain(`data-converged="${p.converged}"`);
    }
    const speed = siValues(sectionById(r.html, 'speed'));
    expect(Number(speed.get('band.meanVolumetricEfficiency'))).toBe(sweep.band.meanVolumetricEfficiency);
    expect(Number(speed.get('bestRpm'))).toBe(sweep.bestRpm);
    expect(Number(speed.get('bestVolumetricEfficiency'))).toBe(sweep.bestVolumetricEfficiency);
  });

  it('shows at the best speed the numbers of run --rpm BEST --json, and its verdict word for word', () => {
    const section = sectionById(r.html, `point-${sweep.bestRpm}`);
    const v = siValues(section);
    const keys = [
      'volumetricEfficiency', 'deliveredMass', 'trappedMass', 'residualFraction', 'peakReverseFlow', 'ivcPressure', 'valvePressureAtIvo',
      'valvePressureAtIvc', 'massImbalance', 'cycles', 'pulse.roundTripDegrees', 'pulse.quarterWaveFrequency', 'pulse.waveOrder',
      'pulse.peakOffsetFromIvc', 'pulse.atIvc.pressureAboveReference',
    ];
    for (const key of keys) {
      const want = at(run, key);
      if (want === null) continue; // no peak: the report says "none"
      expect(Number(v.get(key)), key).toBe(want);
    }
    const verdict = /data-key="pulse.verdict"><span class="effect">([^<]*)<\/span>([^<]*)<\/p>/.exec(section);
    const unescape = (t: string) => t.replace(/&#39;/g, "'").replace(/&quot;/g, '"').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&');
    expect(unescape(verdict?.[2] ?? '')).toBe(run.pulse.verdict);
    expect(verdict?.[1]).toBe(run.pulse.effect);
  });
});
