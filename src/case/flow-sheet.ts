/**
 * A flow-bench sheet (`tractwave flow FILE`, `intake.flowFile`): CSV with a
 * header row,
 *
 *   lift_mm | lift_in                             valve lift, increasing, above zero
 *   flow_cfm | flow_L_per_s | flow_kg_per_s       the flow at that lift, not negative
 *
 * Volume flows (cubic feet per minute, litres per second) are of air at the
 * bench's upstream (room) state; the core turns them into mass flows
 * (core/flow-bench.ts). Factors: 1 ft = 0.3048 m exactly, so
 * 1 ft³/min = 0.028316846592 m³ / 60 s; 1 L = 0.001 m³ (NIST SP 811, 2008,
 * Appendix B).
 *
 * `benchCdTable` turns a sheet into the discharge coefficients on the
 * curtain area against L/D that the model's valve uses.
 */
import { benchMassFlow, benchPoint, type BenchPoint, type BenchSetup } from '../core/flow-bench.js';
import { cellError, parseTable, requireIncreasing } from './csv.js';

/**
 * The bench's room state when none is given [Pa, K]: a standard sea-level
 * pressure (101.325 kPa) and 20 °C, our choice (benches correct their sheets
 * to a standard state of their own; give --pressure and --temperature when
 * the sheet says which).
 */
export const BENCH_DEFAULTS = { pressure: 101325, temperature: 293.15 } as const;

/** 1 ft³/min in m³/s */
export const CFM = (0.3048 ** 3) / 60;

export interface FlowSheet {
  file: string;
  /** valve lift [m] per row, increasing */
  lift: number[];
  /** flow per row: [m³/s] of air at the bench's upstream state when kind is 'volume', [kg/s] when 'mass' */
  flow: number[];
  kind: 'volume' | 'mass';
  rows: number[];
  columns: { lift: string; flow: string };
}

const LIFT = { lift_mm: (v: number) => v / 1000, lift_in: (v: number) => v * 0.0254 } as const;
const FLOW = { flow_cfm: (v: number) => v * CFM, flow_L_per_s: (v: number) => v / 1000, flow_kg_per_s: (v: number) => v } as const;

export function parseFlowSheet(text: string, file: string): FlowSheet {
  const t = parseTable(text, file, 'flow sheet', [
    { key: 'lift', names: LIFT },
    { key: 'flow', names: FLOW },
  ]);
  const liftCol = t.columns['lift']!;
  for (const r of t.rows) if (!(r.values['lift']! > 0)) throw cellError(file, r.row, liftCol, 'the lift must be above zero (a closed valve has no curtain area: leave that row out)');
  requireIncreasing(t, 'lift', 'the lift must increase down the sheet');
  const flowCol = t.columns['flow']!;
  return {
    file,
    lift: t.rows.map((r) => r.values['lift']!),
    flow: t.rows.map((r) => r.values['flow']!),
    kind: flowCol === 'flow_kg_per_s' ? 'mass' : 'volume',
    rows: t.rows.map((r) => r.row),
    columns: { lift: liftCol, flow: flowCol },
  };
}

/** Each row of a sheet as discharge coefficients on the given bench. */
export function benchPoints(sheet: FlowSheet, setup: BenchSetup): BenchPoint[] {
  return sheet.lift.map((lift, i) => {
    const f = sheet.flow[i]!;
    return benchPoint(lift, sheet.kind === 'mass' ? f : benchMassFlow(f, setup), setup);
  });
}

/** The Cd table (x = L/D, y = Cd on the curtain area) a case's valve uses from a sheet. */
export function benchCdTable(sheet: FlowSheet, setup: BenchSetup): { x: number; y: number }[] {
  return benchPoints(sheet, setup).map((p) => ({ x: p.ld, y: p.cd }));
}
