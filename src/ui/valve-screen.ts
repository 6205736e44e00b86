/**
 * The valve view as text lines: valve-end pressure, valve mass flow and
 * cylinder mass against crank angle over one converged cycle, one shared
 * crank axis with TDC/BDC and the valve events, the cursor, the values at the
 * cursor in each chart's title, and the pulse verdict. Pure.
 */
import { crankAxis, crankChart, crankSparkline, cycleMarks, valueRange, GLYPH, type ChartSeries } from './chart.js';
import { firstFit, fit, wrapWords } from './text.js';
import { fixed as fixedNum } from '../present/number.js';
import { METRIC, type Units } from '../present/units.js';
import { restateGauge } from '../present/words.js';

export interface ValveTraces {
  /** [Pa], one sample per crank degree */
  valvePressure: ArrayLike<number>;
  /** [kg/s] positive into the cylinder */
  valveFlow: ArrayLike<number>;
  /** [kg] */
  cylinderMass: ArrayLike<number>;
  /** [m] */
  lift: ArrayLike<number>;
}

export interface ValveScreenInput {
  width: number;
  rows: number;
  crank: number;
  /** crank window [deg] */
  from: number;
  span: number;
  now: ValveTraces;
  before?: ValveTraces | undefined;
  /** ambient (reference) pressure [Pa] */
  reference: number;
  /** pressure at the exhaust valve end of the exhaust pipe [Pa], when the case has one */
  exhaustPort?: ArrayLike<number> | undefined;
  events: { ivo: number; ivc: number; evo: number; evc: number };
  verdict?: string | undefined;
  /** what the valve sees when it opens (shown when there is room) */
  openingNote?: string | undefined;
  /** measured data drawn beside the model (the m key turns it on and off) */
  measured?: ValveMeasured | undefined;
  /** display units (the u key); metric when not given */
  units?: Units | undefined;
  /** mass delivered through the valve since IVO at each degree [kg] (analysis/filling.ts), of the result and of the baseline */
  delivered?: { now: ArrayLike<number>; before?: ArrayLike<number> | undefined } | undefined;
  /** the chart drawn large (key c); the others are one-line strips when rows are short (default pressure) */
  large?: 'pressure' | 'flow' | 'mass' | undefined;
}

export interface ValveMeasured {
  /** a runner pressure trace: measured and the model's at the sensor [Pa] per degree, sensor distance from the valve [m] */
  trace?: { pressure: ArrayLike<number>; model: ArrayLike<number>; sensorAt: number } | undefined;
  /** the logged valve lift [m] per degree (NaN off the log): drawn in place of the cylinder mass */
  lift?: ArrayLike<number> | undefined;
  /** whether the measured pulse agrees with the model's, in words */
  verdict?: string | undefined;
}

export const VALVE_GUTTER = 7;

/** below this many chart rows the small charts are one-line strips */
export const STRIP_BELOW = 20;

/**
 * Chart heights (pressure, flow, mass) for the rows available to the three
 * charts: with few rows (an 80×24 window) the large one gets all but one row
 * for each of the others, drawn as one-line strips; with room, the large one
 * half and the others a quarter each.
 */
export function valveChartRows(chartRows: number, large: 'pressure' | 'flow' | 'mass' = 'pressure'): [number, number, number] {
  const order = ['pressure', 'flow', 'mass'] as const;
  const k = order.indexOf(large);
  const out: [number, number, number] = [1, 1, 1];
  if (chartRows < STRIP_BELOW) {
    out[k] = Math.max(2, chartRows - 2);
    return out;
  }
  const big = Math.round(chartRows * 0.5);
  const small = Math.floor((chartRows - big) / 2);
  out[k] = chartRows - 2 * small;
  for (let j = 0; j < 3; j++) if (j !== k) out[j] = small;
  return out;
}

function at(a: ArrayLike<number>, crank: number): number {
  return a[crank] ?? Number.NaN;
}

function label1(v: number): string {
  return Math.abs(v) >= 1000 ? fixedNum(v, 0) : fixedNum(v, 1);
}

export function valveScreen(i: ValveScreenInput): string[] {
  const w = i.width;
  const u = i.units ?? METRIC;
  const kP = u.num('pressure', 1);
  const kF = u.num('massFlow', 1);
  const kM = u.num('mass', 1);
  const kL = u.num('shortLength', 1);
  const pv = (pa: number) => u.value('pressure', pa);
  const dp = (pa: number) => u.signed('gauge', pa);
  const P = u.label('pressure');
  const G = u.label('gauge');
  const F = u.label('massFlow');
  const Lu = u.label('shortLength');
  // the gauge unit is said only where it differs from the absolute one (inHg beside psi)
  const Gs = G === P ? '' : ` ${G}`;
  const noteRows = i.openingNote && i.rows >= 26 ? 1 : 0;
  const trace = i.measured?.trace;
  const liftLog = i.measured?.lift;
  const measuredRows = i.measured?.verdict ? 1 : 0;
  const fixed = 3 /* titles */ + 2 /* axis */ + 2 /* verdict */ + noteRows + measuredRows;
  const [hp, hf, hm] = valveChartRows(Math.max(4, i.rows - fixed), i.large ?? 'pressure');
  const g = VALVE_GUTTER;
  const series = (pick: (t: ValveTraces) => ArrayLike<number>, scale: number): ChartSeries[] => {
    const s: ChartSeries[] = [];
    if (i.before) s.push({ values: scaled(pick(i.before), scale), style: 'dots' });
    s.push({ values: scaled(pick(i.now), scale), style: 'line' });
    return s;
  };
  const common = { width: w, gutter: g, from: i.from, span: i.span, cursor: i.crank };
  /** a chart of height 1 is a one-line strip of the present result */
  const draw = (s: ChartSeries[], height: number, o: { yMin: number; yMax: number; formatY: (v: number) => string; reference?: number }): string[] =>
    height <= 1
      ? [crankSparkline((s.find((x) => x.style === 'line') ?? s[0])?.values ?? [], { ...common, yMin: o.yMin, yMax: o.yMax, formatY: o.formatY })]
      : crankChart(s, { ...common, height, ...o });

  // pressure [kPa]: at the valve, or with a measured trace at its sensor, the model's and the measured
  const atSensor = trace !== undefined && trace.sensorAt > 0;
  const pS: ChartSeries[] = atSensor ? [{ values: scaled(trace.model, kP), style: 'line' }] : series((t) => t.valvePressure, kP);
  if (i.exhaustPort) pS.push({ values: scaled(i.exhaustPort, kP), style: 'second' });
  if (trace) pS.push({ values: scaled(trace.pressure, kP), style: 'measured' });
  const pR = valueRange(
    pS.map((s) => s.values),
    { include: [i.reference * kP], minSpan: 2 * kP * 1000, pad: 0.04 },
  );
  const pLines = draw(pS, hp, { yMin: pR.min, yMax: pR.max, formatY: label1, reference: i.reference * kP });
  // flow [g/s]
  const fS = series((t) => t.valveFlow, kF);
  const fR = valueRange(
    fS.map((s) => s.values),
    { include: [0], minSpan: kF * 1e-3, pad: 0.04 },
  );
  const fLines = draw(fS, hf, { yMin: fR.min, yMax: fR.max, formatY: label1, reference: 0 });
  // mass [mg], or with a lift log the valve lift [mm], the model's and the logged
  const mS = liftLog ? [{ values: scaled(i.now.lift, kL), style: 'line' as const }, { values: scaled(liftLog, kL), style: 'measured' as const }] : series((t) => t.cylinderMass, kM);
  const mR = valueRange(
    mS.map((s) => s.values),
    { minSpan: liftLog ? kL * 1e-3 : kM * 1e-6 },
  );
  const mLines = draw(mS, hm, { yMin: mR.min, yMax: mR.max, formatY: label1 });

  const c = i.crank;
  const p = atSensor ? at(trace.model, c) : at(i.now.valvePressure, c);
  const legend =
    `${GLYPH.flat} ${trace ? 'model' : 'now'} ` +
    (i.before && !atSensor ? `${GLYPH.baseline} baseline ` : '') +
    (i.exhaustPort ? `${GLYPH.second} exh. port ` : '') +
    (trace ? `${GLYPH.measured} measured ` : '') +
    `${GLYPH.reference} ambient`;
  const port = i.exhaustPort ? at(i.exhaustPort, c) : undefined;
  const portText = port !== undefined ? `, exhaust port ${dp(port - i.reference)}` : '';
  const where = atSensor ? `${u.text('length', trace.sensorAt, u.system === 'metric' ? 0 : 1)} from the valve` : 'at the valve';
  const meas = trace ? at(trace.pressure, c) : undefined;
  const measText = meas !== undefined ? `, measured ${pv(meas)} ${P}` : '';
  const pTitle = titleWithLegend(
    [
      `Pressure ${where}  ${pv(p)} ${P} (${dp(p - i.reference)}${Gs} vs ambient${measText}${portText})`,
      `Pressure ${where}  ${pv(p)} ${P} (${dp(p - i.reference)}${Gs} vs ambient${measText})`,
      `Pressure ${where} ${pv(p)} ${P}${measText}`,
      `Pressure ${pv(p)} ${P}${meas !== undefined ? ` (measured ${pv(meas)})` : ''}`,
      `Pressure ${pv(p)} ${P}`,
    ],
    legend,
    w,
  );
  const flow = at(i.now.valveFlow, c);
  const lift = at(i.now.lift, c);
  const dir = flow > 0 ? 'into the cylinder' : flow < 0 ? 'back into the runner' : '';
  const fTitle = firstFit(
    [
      `Flow through the valve  ${u.value('massFlow', flow)} ${F} ${dir}   ·   lift ${u.value('shortLength', lift)} ${Lu}`,
      `Valve flow ${u.value('massFlow', flow)} ${F} ${dir}  lift ${u.value('shortLength', lift)} ${Lu}`,
      `Flow ${u.value('massFlow', flow)} ${F}  lift ${u.value('shortLength', lift)} ${Lu}`,
    ],
    w,
  );
  const mass = at(i.now.cylinderMass, c);
  const logged = liftLog ? at(liftLog, c) : Number.NaN;
  const loggedText = Number.isFinite(logged) ? u.text('shortLength', logged) : 'off the log';
  const mTitle = liftLog
    ? titleWithLegend([`Valve lift  ${u.text('shortLength', lift)} (lift log ${loggedText})`, `Lift ${u.text('shortLength', lift)} (log ${loggedText})`], `${GLYPH.flat} model ${GLYPH.measured} lift log`, w)
    : firstFit(massTitles(mass, i.delivered, c, u), w);
  const axis = crankAxis(cycleMarks(i.events), common);
  const verdict = i.verdict
    ? wrapWords(`At IVC: ${restateGauge(i.verdict, u)}.`, w, 2)
    : [fit('At IVC: (no pulse timing for this point)', w)];
  while (verdict.length < 2) verdict.push(fit('', w));
  if (noteRows > 0) verdict.push(...wrapWords(`At IVO: ${restateGauge(i.openingNote ?? '', u)}.`, w, 1));
  if (measuredRows > 0) verdict.push(...wrapWords(`Measured: ${i.measured?.verdict ?? ''}.`, w, 1));

  const lines = [pTitle, ...pLines, fTitle, ...fLines, mTitle, ...mLines, ...axis, ...verdict];
  return padLines(lines, i.rows, w);
}

/** The cylinder-mass chart's titles, longest first: with the mass delivered since IVO (and the baseline's) when known. */
function massTitles(mass: number, delivered: ValveScreenInput['delivered'], c: number, u: Units): string[] {
  const d = delivered ? at(delivered.now, c) : Number.NaN;
  const b = delivered?.before ? at(delivered.before, c) : Number.NaN;
  const m = (v: number) => u.text('mass', v);
  const mv = (v: number) => u.value('mass', v);
  const plain = [`Gas in the cylinder  ${m(mass)}`, `Cylinder ${m(mass)}`];
  if (!Number.isFinite(d)) return plain;
  const since = `delivered since IVO ${m(d)}${Number.isFinite(b) ? ` (baseline ${mv(b)})` : ''}`;
  return [`Gas in the cylinder  ${m(mass)}   ·   ${since}`, `Cylinder ${m(mass)} · ${since}`, `Cylinder ${m(mass)} · since IVO ${mv(d)}${Number.isFinite(b) ? ` (base ${mv(b)})` : ''}`, ...plain];
}

function scaled(a: ArrayLike<number>, k: number): Float64Array {
  const out = new Float64Array(a.length);
  for (let j = 0; j < a.length; j++) out[j] = (a[j] as number) * k;
  return out;
}

/** A title on the left and a legend on the right, both fitted into `w`. */
export function titleWithLegend(titles: readonly string[], legend: string, w: number): string {
  for (const t of titles) {
    if (t.length + 2 + legend.length <= w) return t + ' '.repeat(w - t.length - legend.length) + legend;
  }
  return firstFit(titles, w);
}

/** Exactly `rows` lines of exactly `w` columns. */
export function padLines(lines: readonly string[], rows: number, w: number): string[] {
  const out = lines.slice(0, rows).map((l) => fit(l, w));
  while (out.length < rows) out.push(' '.repeat(w));
  return out;
}
