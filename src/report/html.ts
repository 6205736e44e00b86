/**
 * The report as one self-contained HTML document: inline CSS and inline SVG,
 * no scripts, no fonts, no links to anywhere, so it opens from a USB stick
 * on a shop laptop with no network. Printable: each `section.page` is one
 * printed page (A4 or Letter; the browser's paper size is used).
 *
 * Every number shown beside a figure that `run --json` or `sweep --json`
 * also gives carries that figure in SI as `data-si`, with its JSON name as
 * `data-key`, so a reader (and the tests) can check the two agree.
 */
import { MASS_IMBALANCE_LIMIT, massBalanceOk } from '../analysis/mass-balance.js';
import type { SweepPoint } from '../analysis/sweep.js';
import type { OperatingPoint, ReportData } from './gather.js';
import { pipeMapName } from './charts.js';
import { pipeSize, resonatorWords } from '../analysis/network-line.js';
import { lineUnits, networkLine } from './network-line.js';
import type { RenderedChart } from './render.js';
import { fixed, units, type ReportQuantity, type UnitSystem, type Units } from './units.js';

export interface ReportMeta {
  /** when the report was made, as it should be printed (e.g. "2026-12-02 14:05 UTC") */
  generatedAt: string;
  /** tractwave's version */
  version: string;
  units: UnitSystem;
  /** where the speeds and the band came from, in words */
  speedsFrom?: string;
  /** worker threads used for the sweeps */
  jobs?: number;
}

/** Escape text for HTML element content and attribute values. */
export function esc(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** A cell that carries the SI value it shows. */
function siCell(key: string, si: number, shown: string, tag: 'td' | 'span' = 'td'): string {
  return `<${tag} data-key="${esc(key)}" data-si="${Number.isFinite(si) ? String(si) : ''}">${esc(shown)}</${tag}>`;
}

function pct(v: number, d = 1): string {
  return `${fixed(v * 100, d)} %`;
}

function signedPct(v: number, d = 2): string {
  const s = fixed(v * 100, d);
  return `${v > 0 && Number(s) !== 0 ? '+' : ''}${s} %`;
}

function cardText(v: number, pos: string, neg: string): string {
  const r = Number(fixed(v, 1));
  return r < 0 ? `${fixed(-r, 1)}° ${neg}` : `${fixed(r, 1)}° ${pos}`;
}

const CSS = `
:root { --ink: #111; --muted: #555; --rule: #bbb; --soft: #f2f2f2; }
* { box-sizing: border-box; }
html { background: #fff; }
body { font: 10pt/1.38 system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif; color: var(--ink);
  margin: 0 auto; max-width: 200mm; padding: 8mm 7mm; background: #fff; }
h1 { font-size: 17pt; margin: 0 0 1mm; }
h2 { font-size: 13pt; margin: 0 0 2mm; padding-bottom: 1mm; border-bottom: 1.5px solid var(--ink); }
h3 { font-size: 10.5pt; margin: 3mm 0 1mm; }
p { margin: 1mm 0 2mm; }
.sub { color: var(--muted); margin: 0 0 3mm; }
.network { font-weight: 600; background: var(--soft); border-left: 3px solid var(--ink); padding: 1.5mm 2.5mm; }
section.page { margin: 0 0 10mm; }
table { border-collapse: collapse; width: 100%; font-size: 9pt; }
th, td { text-align: left; padding: 0.6mm 1.5mm; border-bottom: 0.5px solid var(--rule); vertical-align: top; }
th { font-weight: 600; }
td.n, th.n { text-align: right; font-variant-numeric: tabular-nums; }
.cols { display: grid; grid-template-columns: minmax(0, 1fr) minmax(0, 1fr); gap: 0 6mm; align-items: start; }
.cols3 { display: grid; grid-template-columns: 1fr 1fr 1fr; gap: 0 5mm; align-items: start; }
.kv { font-size: 9pt; }
.kv th { font-weight: normal; color: var(--muted); width: 55%; }
.kv td { text-align: right; font-variant-numeric: tabular-nums; }
.cols3 .kv th, .cols3 .kv td { white-space: nowrap; width: auto; }
.kv tr.group th { color: var(--ink); font-weight: 600; border-bottom: 1px solid var(--ink); padding-top: 1.5mm; }
figure { margin: 2mm 0 3mm; break-inside: avoid; page-break-inside: avoid; }
figure svg { display: block; width: 100%; height: auto; }
figcaption { font-size: 9pt; color: var(--muted); margin-top: 0.5mm; }
.verdict { font-size: 11pt; font-weight: 600; border: 1.5px solid var(--ink); padding: 1.5mm 2.5mm; margin: 1mm 0 2mm; }
.verdict .effect { text-transform: uppercase; letter-spacing: 0.04em; margin-right: 1.5mm; }
.verdict .effect::after { content: " —"; }
.note { font-size: 9pt; color: var(--muted); }
ul.facts { margin: 1mm 0 2mm; padding-left: 5mm; }
ul.facts li { margin: 0.3mm 0; }
.warn { font-weight: 600; }
.safety { border: 2px solid var(--ink); padding: 2mm 3mm; margin-top: 3mm; break-inside: avoid; }
.safety h3 { margin-top: 0; }
.small { font-size: 8pt; }
table.points td, table.points th { padding: 0.25mm 1mm; white-space: nowrap; }
table.points th { vertical-align: bottom; line-height: 1.15; }
@page { margin: 11mm 11mm 12mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 9.5pt; }
  section.page { margin: 0; break-after: page; page-break-after: always; }
  section.page:last-of-type { break-after: auto; page-break-after: auto; }
  tr { break-inside: avoid; }
  /* each section one page of A4 or Letter (content about 188 × 256 mm), with about 10 mm to spare: a line more of text must not push a section over */
  figure svg { max-height: var(--fig-h, 100mm); }
  figure[data-chart="speed-ve"] { --fig-h: 76mm; }
  figure[data-chart="speed-output"] { --fig-h: 84mm; }
  figure[data-chart^="valve-"] { --fig-h: 94mm; }
  figure[data-chart^="runner-"], figure[data-chart^="pipe-"] { --fig-h: 56mm; }
  figure[data-chart="mass-balance"] { --fig-h: 62mm; }
}
`;

function caseTable(data: ReportData, u: Units): string {
  const c = data.design.case;
  const m = data.design.model;
  const rows: string[] = [];
  const group = (title: string) => rows.push(`<tr class="group"><th colspan="2">${esc(title)}</th></tr>`);
  const row = (label: string, value: string) => rows.push(`<tr><th>${esc(label)}</th><td>${esc(value)}</td></tr>`);
  const q = (label: string, qty: ReportQuantity, si: number, d?: number) => row(label, u.text(qty, si, d));
  const swept = (Math.PI / 4) * c.engine.bore ** 2 * c.engine.stroke;
  const lu = lineUnits(u);
  const size = `length × diameter [${u.unit('length').label}]`;
  group('Engine');
  q('bore', 'length', c.engine.bore);
  q('stroke', 'length', c.engine.stroke);
  q('connecting rod (centres)', 'length', c.engine.rod);
  row('compression ratio', fixed(c.engine.compressionRatio, 2));
  q('swept volume', 'smallVolume', swept);
  row('cylinder wall', c.engine.wallTemperature !== undefined ? u.text('temperature', c.engine.wallTemperature) : 'adiabatic (no heat transfer)');
  group('Ambient');
  q('pressure', 'pressure', c.ambient.pressure, 2);
  q('temperature', 'temperature', c.ambient.temperature);
  for (const side of ['intake', 'exhaust'] as const) {
    const v = c[side];
    group(side === 'intake' ? 'Intake valves' : 'Exhaust valves');
    row('valves', String(v.valves));
    q('head diameter', 'length', v.diameter);
    q('max lift', 'length', v.maxLift, 2);
    if (side === 'intake') {
      row('opens (IVO)', `${cardText(c.intake.opens, 'BTDC', 'ATDC')} — θ ${fixed(m.intake.openAngle, 1)}°`);
      row('closes (IVC)', `${cardText(c.intake.closes, 'ABDC', 'BBDC')} — θ ${fixed(m.intake.closeAngle, 1)}°`);
    } else {
      row('opens (EVO)', `${cardText(c.exhaust.opens, 'BBDC', 'ABDC')} — θ ${fixed(m.exhaust.openAngle, 1)}°`);
      row('closes (EVC)', `${cardText(c.exhaust.closes, 'ATDC', 'BTDC')} — θ ${fixed(m.exhaust.closeAngle, 1)}°`);
    }
    if (v.checkingLift !== undefined) q('events measured at lift', 'length', v.checkingLift, 2);
    row('duration (zero lift)', `${fixed((((side === 'intake' ? m.intake.closeAngle - m.intake.openAngle : m.exhaust.closeAngle - m.exhaust.openAngle) % 720) + 720) % 720, 1)}°`);
    if (side === 'exhaust') {
      q('back pressure', 'pressure', c.exhaust.backPressure);
      q('gas temperature', 'temperature', c.exhaust.gasTemperature);
      if (m.exhaust.pipe) row(`exhaust pipe, ${size}`, pipeSize(m.exhaust.pipe.sections, lu));
    }
  }
  group('Runner (upstream end first)');
  c.runner.sections.forEach((s, i) => {
    const d = s.diameterStart === s.diameterEnd ? `Ø ${u.text('length', s.diameterStart)}` : `Ø ${u.text('length', s.diameterStart)} → ${u.text('length', s.diameterEnd)}`;
    row(c.runner.sections.length > 1 ? `section ${i + 1}` : 'length, diameter', `${u.text('length', s.length)}, ${d}`);
  });
  if (c.runner.sections.length > 1) q('total length', 'length', c.runner.sections.reduce((t, s) => t + s.length, 0));
  row('entry loss coefficient K', fixed(c.runner.entryLoss, 2));
  row('wall friction (Fanning f)', fixed(c.runner.friction, 4));
  row('wall heat transfer', c.runner.heatTransfer ? `on, wall ${u.text('temperature', m.runner.wallTemperature)}` : 'off');
  for (const r of resonatorWords(m, lu)) row(`side resonator (sizes in ${u.unit('length').label})`, r);
  group('Inlet');
  if (m.inlet.kind === 'plenum') {
    row('runner draws from', m.inlet.snorkel ? 'an airbox fed by a snorkel' : 'a plenum (airbox)');
    q('plenum volume', 'volume', m.inlet.volume);
    if (m.inlet.snorkel) row(`snorkel, ${size}`, pipeSize(m.inlet.snorkel.sections, lu));
    else if (m.inlet.feedDiameter !== undefined) {
      q('feed diameter', 'length', m.inlet.feedDiameter);
      row('feed discharge coefficient', fixed(m.inlet.feedCd, 2));
    }
  } else row('runner draws from', 'the ambient air');

  group('Torque and power estimate');
  row('air–fuel ratio', fixed(data.assumptions.airFuelRatio, 1));
  q('fuel heating value', 'heatingValue', data.assumptions.fuelHeatingValue);
  row('brake efficiency (assumed)', pct(data.assumptions.brakeEfficiency, 0));
  // two columns, split at the group heading nearest the middle so no group is cut
  let at = Math.ceil(rows.length / 2);
  let bestGap = Infinity;
  rows.forEach((r, i) => {
    if (i > 0 && r.startsWith('<tr class="group">') && Math.abs(i - rows.length / 2) < bestGap) {
      bestGap = Math.abs(i - rows.length / 2);
      at = i;
    }
  });
  return `<div class="cols"><table class="kv">${rows.slice(0, at).join('')}</table><table class="kv">${rows.slice(at).join('')}</table></div>`;
}

function numericsText(data: ReportData, meta: ReportMeta, u: Units): string {
  const n = data.design.model.numerics;
  const lo = data.rpms[0]!;
  const hi = data.rpms[data.rpms.length - 1]!;
  const step = data.rpms.length > 1 ? data.rpms[1]! - lo : 0;
  return (
    `Runner scheme <b>${esc(n.scheme)}</b>, mesh ${esc(u.text('length', n.meshSize))}, Courant number ${fixed(n.courant, 2)}, ` +
    `cycles repeated until the delivered mass changes by less than ${esc(String(n.tolerance))} (at most ${n.maxCycles} cycles). ` +
    `Speeds ${fixed(lo, 0)}–${fixed(hi, 0)} rpm${step > 0 ? ` every ${fixed(step, 0)} rpm` : ''} (${data.rpms.length} points${meta.speedsFrom ? `, ${esc(meta.speedsFrom)}` : ''}); ` +
    `band ${fixed(data.band.from, 0)}–${fixed(data.band.to, 0)} rpm. Gas: air as an ideal gas, R = 287.05 J/(kg·K), γ = 1.4.`
  );
}

function figure(chart: RenderedChart | undefined, caption: string): string {
  if (!chart) return '';
  return `<figure class="chart" data-chart="${esc(chart.name)}">${chart.svg}<figcaption>${esc(caption)}</figcaption></figure>`;
}

function speedSection(data: ReportData, u: Units, charts: Map<string, RenderedChart>): string {
  const s = data.curve.summary;
  const e = data.estimates;
  const facts: string[] = [];
  facts.push(
    `Band ${fixed(data.band.from, 0)}–${fixed(data.band.to, 0)} rpm: mean ηv ${siCell('band.meanVolumetricEfficiency', s.band.meanVolumetricEfficiency, pct(s.band.meanVolumetricEfficiency), 'span')} ` +
      '(area under the curve over the band width — the band average, not the peak, is the figure of merit).',
  );
  facts.push(`Best ηv ${siCell('bestVolumetricEfficiency', s.bestVolumetricEfficiency, pct(s.bestVolumetricEfficiency), 'span')} at ${siCell('bestRpm', s.bestRpm, `${fixed(s.bestRpm, 0)} rpm`, 'span')}.`);
  const tuned = e.tunedSpeeds.length > 0 ? e.tunedSpeeds.map((t) => `order ${t.order} at ${fixed(t.rpm, 0)} rpm`).join(', ') : 'no whole order falls in the range';
  facts.push(
    `Quarter-wave estimate: ${fixed(e.quarterWaveFrequency, 1)} Hz (sound speed ${fixed(e.soundSpeed, 1)} m/s at the ambient temperature, runner ${esc(u.text('length', e.runnerLength))} ` +
      `+ end correction ${esc(u.text('length', e.endCorrection))}); tuned speeds N = 120·f/order: ${esc(tuned)} (marked on the chart).`,
  );
  facts.push(`Helmholtz estimate (the runner as the neck, the cylinder volume at mid-stroke as the volume): ${fixed(e.helmholtz.frequency, 1)} Hz, peak near ${fixed(e.helmholtz.peakRpm, 0)} rpm.`);
  if (e.plenumFrequency !== null) facts.push(`The plenum ringing through its feed: ${fixed(e.plenumFrequency, 1)} Hz.`);
  if (data.compare) {
    const cs = data.compare.curve.summary;
    const d = cs.band.meanVolumetricEfficiency - s.band.meanVolumetricEfficiency;
    facts.push(
      `Compared design <b>${esc(data.compare.design.name)}</b>${data.compare.design.file ? ` (${esc(data.compare.design.file)})` : ''}: band mean ${siCell('compare.band.meanVolumetricEfficiency', cs.band.meanVolumetricEfficiency, pct(cs.band.meanVolumetricEfficiency), 'span')} ` +
        `(${d >= 0 ? '+' : ''}${fixed(d * 100, 1)} points against this design), best ${pct(cs.bestVolumetricEfficiency)} at ${fixed(cs.bestRpm, 0)} rpm.`,
    );
  }
  if (data.measured) {
    const what = data.measured.kinds.map((k) => (k === 'volumetricEfficiency' ? 'ηv' : k)).join(', ');
    facts.push(`Measured points from ${esc(data.measured.file)} (${esc(what)}, ${data.measured.points.length} speeds) are drawn as crosses.`);
  }
  return `<section class="page" id="speed">
<h2>Across the speed range</h2>
<ul class="facts">${facts.map((f) => `<li>${f}</li>`).join('')}</ul>
${figure(charts.get('speed-ve'), 'Volumetric efficiency ηv (fresh mass delivered per cycle over ambient density × swept volume) against speed. Grey: the band. Dashed black: the band mean. Dotted green: quarter-wave tuned speeds.')}
${figure(charts.get('speed-output'), `Estimated brake torque and power: ηv burnt at air–fuel ratio ${fixed(data.assumptions.airFuelRatio, 1)} with ${fixed(data.assumptions.fuelHeatingValue / 1e6, 1)} MJ/kg fuel and an assumed brake efficiency of ${pct(data.assumptions.brakeEfficiency, 0)} — estimates, not simulated combustion.`)}
</section>`;
}

function pointFigures(p: OperatingPoint, u: Units): string {
  const r = p.result;
  const pu = p.pulse;
  const kv = (label: string, cell: string) => `<tr><th>${esc(label)}</th>${cell}</tr>`;
  const si = (key: string, qty: ReportQuantity, v: number, d?: number) => siCell(key, v, u.text(qty, v, d));
  const peak = (pu.effect === 'helping' ? pu.peakAfterIvc : null) ?? pu.lastPeakBeforeIvc;
  const a = [
    kv('volumetric efficiency ηv', siCell('volumetricEfficiency', r.volumetricEfficiency, pct(r.volumetricEfficiency))),
    kv('delivered per cycle', si('deliveredMass', 'mass', r.deliveredMass)),
    kv('trapped at IVC', si('trappedMass', 'mass', r.trappedMass)),
    kv('residual gas', siCell('residualFraction', r.residualFraction, pct(r.residualFraction))),
    kv('peak reverse flow', si('peakReverseFlow', 'massFlow', r.peakReverseFlow)),
  ];
  const b = [
    kv('cylinder at IVC', si('ivcPressure', 'pressure', r.ivcPressure)),
    kv('valve end at IVO', si('valvePressureAtIvo', 'pressure', r.valvePressureAtIvo)),
    kv('valve end at IVC', si('valvePressureAtIvc', 'pressure', r.valvePressureAtIvc)),
    kv('mass balance', siCell('massImbalance', r.massImbalance, signedPct(r.massImbalance))),
    kv('cycles', siCell('cycles', r.cycles, `${r.cycles}${r.converged ? ', periodic' : ', NOT converged'}`)),
  ];
  const c = [
    kv('round trip 2L/a', siCell('pulse.roundTripDegrees', pu.roundTripDegrees, `${fixed(pu.roundTripDegrees, 1)}°`)),
    kv('quarter-wave f₁', siCell('pulse.quarterWaveFrequency', pu.quarterWaveFrequency, `${fixed(pu.quarterWaveFrequency, 1)} Hz`)),
    kv('wave order f₁·120/N', siCell('pulse.waveOrder', pu.waveOrder, fixed(pu.waveOrder, 2))),
    kv(peak === pu.peakAfterIvc && peak ? 'peak just after IVC' : 'last peak before IVC', peak ? siCell('pulse.peakOffsetFromIvc', peak.offsetFromIvc, `${fixed(Math.abs(peak.offsetFromIvc), 1)}° ${peak.offsetFromIvc <= 0 ? 'before' : 'after'}`) : '<td>none</td>'),
    kv(`at IVC vs ${pu.referenceKind}`, siCell('pulse.atIvc.pressureAboveReference', pu.atIvc.pressureAboveReference, u.text('pressure', pu.atIvc.pressureAboveReference, 2))),
  ];
  return `<div class="cols3"><table class="kv">${a.join('')}</table><table class="kv">${b.join('')}</table><table class="kv">${c.join('')}</table></div>`;
}

function pointSection(p: OperatingPoint, data: ReportData, u: Units, charts: Map<string, RenderedChart>): string {
  const rpm = fixed(p.rpm, 0);
  const why = p.reason === 'best' ? 'the best speed of the sweep' : 'asked for';
  const imb = massBalanceOk(p.result.massImbalance) ? '' : `<p class="warn">The mass balance is off by ${signedPct(p.result.massImbalance)} (above ${pct(MASS_IMBALANCE_LIMIT)}): a finer mesh would make these figures surer.</p>`;
  const conv = p.result.converged ? '' : `<p class="warn">Not periodic after ${p.result.cycles} cycles: the figures are from the last cycle run.</p>`;
  const end = data.design.model.inlet.kind === 'plenum' ? 'the plenum end' : 'the open end';
  return `<section class="page point" id="point-${rpm}" data-rpm="${rpm}">
<h2>At ${rpm} rpm — ${esc(why)}</h2>
<p class="verdict" data-key="pulse.verdict"><span class="effect">${esc(p.pulse.effect)}</span>${esc(p.pulse.verdict)}</p>
<p class="note">When the valve opens: ${esc(p.pulse.openingNote)}</p>
${imb}${conv}
${pointFigures(p, u)}
${figure(charts.get(`valve-${rpm}rpm`), `One converged cycle at ${rpm} rpm. Grey span: the intake valve open. Top: static pressure at the valve end of the runner with the ${p.pulse.referenceKind} pressure dashed; middle: flow through the intake valve (positive into the cylinder); bottom: gas in the cylinder.`)}
${figure(charts.get(`runner-${rpm}rpm`), `Pressure along the runner against crank angle (the valve at the top, ${end} at the bottom): a pulse is seen as a sloping stripe running between the ends. Light is high pressure, dark is low.`)}
</section>${pipesSections(p, charts)}`;
}

/** the maps of the case's other pipes (snorkel, exhaust pipe, resonators) at one speed, three to a printed page */
export const PIPE_MAPS_PER_PAGE = 3;

function pipesSections(p: OperatingPoint, charts: Map<string, RenderedChart>): string {
  const rpm = fixed(p.rpm, 0);
  const others = p.result.pipes.filter((m) => m.role !== 'runner');
  const pages: string[] = [];
  for (let k = 0; k < others.length; k += PIPE_MAPS_PER_PAGE) {
    const figures = others
      .slice(k, k + PIPE_MAPS_PER_PAGE)
      .map((m) => figure(charts.get(pipeMapName(m, p.rpm)), `Pressure along the ${m.name} against crank angle (the ${m.start} at the bottom, the ${m.end} at the top), in the runner map's shades.`))
      .join('\n');
    pages.push(`
<section class="page pipes" id="pipes-${rpm}${k > 0 ? `-${k / PIPE_MAPS_PER_PAGE + 1}` : ''}" data-rpm="${rpm}">
<h2>At ${rpm} rpm — the other pipes</h2>
${figures}
</section>`);
  }
  return pages.join('');
}

/** cells of one design at one speed; `prefix` '' for the design, 'compare.' for the compared one */
function pointCells(p: SweepPoint | undefined, prefix: string, output: boolean): string {
  if (!p) return '<td class="n">—</td>'.repeat(output ? 5 : 3);
  const c = (key: string, si: number | boolean, shown: string, cls = 'n') => `<td class="${cls}" data-key="${prefix}${key}" data-si="${String(si)}">${esc(shown)}</td>`;
  return (
    c('volumetricEfficiency', p.volumetricEfficiency, fixed(p.volumetricEfficiency * 100, 1)) +
    (output ? c('torque', p.torque, fixed(p.torque, 1)) + c('power', p.power, fixed(p.power / 1000, 1)) : '') +
    c('massImbalance', p.massImbalance, `${signedPct(p.massImbalance).replace(' %', '')}${massBalanceOk(p.massImbalance) ? '' : ' !'}`) +
    `<td class="n" data-key="${prefix}cycles" data-si="${p.cycles}" data-converged="${p.converged}">${p.cycles}${p.converged ? '' : ' NO'}</td>`
  );
}

/**
 * The table of every speed: one row a speed, the compared design beside it
 * (then without the torque and power columns, which the speed page shows);
 * split in two halves side by side when long, so it stays on its page.
 */
function balanceTable(data: ReportData): string {
  const cmp = data.compare?.curve.points;
  const output = !cmp;
  const cols = (who: string) =>
    `<th class="n">${who}ηv<br>%</th>${output ? '<th class="n">torque*<br>N·m</th><th class="n">power*<br>kW</th>' : ''}<th class="n">${who}imbal.<br>%</th><th class="n">cycles<br>run</th>`;
  const head = `<tr><th class="n">rpm</th>${cols(cmp ? 'A ' : '')}${cmp ? cols('B ') : ''}</tr>`;
  const rows = data.curve.points.map(
    (p, i) => `<tr data-rpm="${p.rpm}"><td class="n">${fixed(p.rpm, 0)}</td>${pointCells(p, '', output)}${cmp ? pointCells(cmp[i], 'compare.', false) : ''}</tr>`,
  );
  const table = (r: string[]) => `<table class="points small"><thead>${head}</thead><tbody>${r.join('')}</tbody></table>`;
  if (rows.length <= 20) return table(rows);
  const half = Math.ceil(rows.length / 2);
  return `<div class="cols">${table(rows.slice(0, half))}${table(rows.slice(half))}</div>`;
}

function balanceSection(data: ReportData, charts: Map<string, RenderedChart>): string {
  const all = [...data.curve.points, ...(data.compare?.curve.points ?? [])];
  const bad = all.filter((p) => !massBalanceOk(p.massImbalance)).length;
  const unconverged = all.filter((p) => !p.converged).length;
  const summary =
    bad === 0 && unconverged === 0
      ? `Every point is periodic and its mass balance (mass into the runner against mass through the intake valve over the last cycle) is within ${pct(MASS_IMBALANCE_LIMIT)}.`
      : `${unconverged} point(s) not periodic and ${bad} point(s) with a mass balance off by more than ${pct(MASS_IMBALANCE_LIMIT)} (marked !): their figures are less certain.`;
  const b = data.compare ? ` A: this design; B: the compared design, ${esc(data.compare.design.name)}.` : '';
  return `<section class="page" id="balance">
<h2>Mass balance and convergence</h2>
<p>${esc(summary)} Each speed of a sweep starts from the converged state of the speed before it, in fixed chunks of four from rest, as in <code>tractwave sweep</code>; each operating point page starts from rest, as <code>tractwave run</code>.</p>
${figure(charts.get('mass-balance'), `Top: mass imbalance per cycle with the ±${pct(MASS_IMBALANCE_LIMIT)} limit dashed. Bottom: cycles run to reach a periodic cycle, with the cap of ${data.design.model.numerics.maxCycles} dashed; triangles did not converge.`)}
${balanceTable(data)}
<p class="note">${data.compare ? '' : '* estimated brake torque [N·m] and power [kW] (see the speed page); '}imbal.: mass imbalance of the last cycle, ! above the limit; NO: not periodic within the cycle cap.${b}</p>
${safetyBlock()}
</section>`;
}

function safetyBlock(): string {
  return `<div class="safety" id="safety"><h3>Before anything is cut, welded or run</h3>
<p>These are estimates from a simplified one-dimensional model of one cylinder's intake; verify them on a running engine. Changing an intake changes the fuelling the engine needs: more air with the same fuel runs lean, which can cause detonation and engine damage — re-map fuel and ignition and check the air–fuel ratio on the engine. Dyno and road testing carry their own hazards, and intake changes can breach emissions and noise rules. Follow local regulations and qualified practice.</p></div>`;
}

/** The whole report. `charts` are the rendered charts of `reportCharts` (any missing one is left out). */
export function reportHtml(data: ReportData, meta: ReportMeta, rendered: readonly RenderedChart[]): string {
  const u = units(meta.units);
  const charts = new Map(rendered.map((c) => [c.name, c]));
  const d = data.design;
  const title = `${d.name} — intake tract report`;
  const parts = [
    `<section class="page" id="design">
<h1>${esc(d.name)}</h1>
<p class="sub">Intake tract report · ${esc(d.file || 'case given as text')} · made ${esc(meta.generatedAt)} with tractwave ${esc(meta.version)} · units ${esc(meta.units)}</p>
<p class="network" id="network">${esc(networkLine(d.model, u))}</p>
<h3>The case</h3>
${caseTable(data, u)}
<h3>How it was computed</h3>
<p class="note" id="numerics">${numericsText(data, meta, u)}</p>
<p class="note">Crank angle θ: 0 = top dead centre at the start of the intake stroke, 720° per cycle. Cam events as on the cam card (intake opens ° BTDC, closes ° ABDC; exhaust opens ° BBDC, closes ° ATDC); θ beside them.</p>
</section>`,
    speedSection(data, u, charts),
    ...data.points.map((p) => pointSection(p, data, u, charts)),
    balanceSection(data, charts),
  ];
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="tractwave ${esc(meta.version)}">
<title>${esc(title)}</title>
<style>${CSS}</style>
</head>
<body>
${parts.join('\n')}
</body>
</html>
`;
}
