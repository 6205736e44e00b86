/**
 * A measured pressure trace from a transducer in the runner
 * (`run --measured-trace FILE`, case key `measuredTrace`): CSV with a header row,
 *
 *   crank_deg                                  crank angle, increasing
 *   pressure_kPa | pressure_kPa_gauge          absolute, or relative to the ambient
 *
 * Crank angles are θ as in the model (0 = TDC at the start of the intake
 * stroke) after adding the logger's TDC offset: θ = crank_deg + tdcOffset
 * (a logger whose TDC mark comes 4° early reads 4° too much: tdcOffset −4).
 * A gauge pressure is made absolute with the case's ambient pressure.
 *
 * The log must cover at least one whole cycle (720°, counting one sample
 * step to close it); a longer log is averaged cycle by cycle (the ensemble
 * average a tuner would take). `traceByDegree` gives one absolute pressure
 * per whole crank degree θ = 0..719, linear between the logged samples.
 */
import { CaseError } from './errors.js';
import { cellError, parseTable, requireIncreasing } from './csv.js';

export interface PressureTraceLog {
  file: string;
  /** crank_deg as logged, increasing */
  crank: number[];
  /** [Pa], absolute or gauge as `gauge` says */
  pressure: number[];
  gauge: boolean;
  rows: number[];
  columns: { crank: string; pressure: string };
}

const CRANK = { crank_deg: (v: number) => v } as const;
const PRESSURE = { pressure_kPa: (v: number) => v * 1000, pressure_kPa_gauge: (v: number) => v * 1000 } as const;

export function parsePressureTrace(text: string, file: string): PressureTraceLog {
  const t = parseTable(text, file, 'pressure trace', [
    { key: 'crank', names: CRANK, nonNegative: false },
    // a gauge pressure below the ambient is negative; an absolute one is checked below
    { key: 'pressure', names: PRESSURE, nonNegative: false },
  ]);
  requireIncreasing(t, 'crank', 'the crank angle must increase down the file');
  const pCol = t.columns['pressure']!;
  const gauge = pCol === 'pressure_kPa_gauge';
  if (!gauge) for (const r of t.rows) if (!(r.values['pressure']! > 0)) throw cellError(file, r.row, pCol, `an absolute pressure must be above zero, got ${r.values['pressure']! / 1000} kPa (use pressure_kPa_gauge for a pressure relative to the ambient)`);
  if (t.rows.length < 8) throw new CaseError(file, `the pressure trace has ${t.rows.length} data rows; it needs a whole cycle of samples`, 'file');
  return {
    file,
    crank: t.rows.map((r) => r.values['crank']!),
    pressure: t.rows.map((r) => r.values['pressure']!),
    gauge,
    rows: t.rows.map((r) => r.row),
    columns: { crank: t.columns['crank']!, pressure: pCol },
  };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] ?? 0;
}

/**
 * One absolute pressure [Pa] per whole crank degree θ = 0..719 (see the file
 * header). `ambient` [Pa] makes a gauge trace absolute; `tdcOffset` [deg] is
 * added to the logged angles.
 */
export function traceByDegree(log: PressureTraceLog, opts: { ambient: number; tdcOffset?: number }): Float64Array {
  const off = opts.tdcOffset ?? 0;
  const th = log.crank.map((c) => c + off);
  const p = log.pressure.map((v) => (log.gauge ? v + opts.ambient : v));
  const steps = th.slice(1).map((t, i) => t - th[i]!);
  const step = median(steps);
  const first = th[0]!;
  const last = th[th.length - 1]!;
  const covered = last - first + step;
  if (covered < 720 - 1e-9)
    throw cellError(log.file, log.rows[log.rows.length - 1]!, log.columns.crank, `the trace covers ${Number(covered.toPrecision(4))} crank degrees; it needs at least one whole cycle (720°)`);
  // every a ≡ j (mod 720) inside the log, in increasing order, one forward pass
  const sum = new Float64Array(720);
  const count = new Float64Array(720);
  let k = 0;
  for (let m = Math.floor(first / 720); m * 720 <= last; m++) {
    for (let j = 0; j < 720; j++) {
      const a = j + 720 * m;
      if (a < first || a > last) continue;
      while (k < th.length - 2 && th[k + 1]! < a) k++;
      const t0 = th[k]!;
      const t1 = th[k + 1]!;
      const f = t1 > t0 ? (a - t0) / (t1 - t0) : 0;
      sum[j] = sum[j]! + p[k]! + f * (p[k + 1]! - p[k]!);
      count[j] = count[j]! + 1;
    }
  }
  const out = new Float64Array(720);
  for (let j = 0; j < 720; j++) {
    if (count[j]! > 0) {
      out[j] = sum[j]! / count[j]!;
      continue;
    }
    // in the seam of a log of one cycle: between the last sample and the first one a cycle on
    const a0 = j + 720 * Math.ceil((last - j) / 720);
    const span = first + 720 - last;
    const f = span > 0 ? (a0 - last) / span : 0;
    out[j] = p[p.length - 1]! + f * (p[0]! - p[p.length - 1]!);
  }
  return out;
}
