/**
 * The case behind the terminal view: the file as loaded, the model with the
 * panel's edits applied (through the case loader's `--set` overrides, so
 * every unit conversion stays in src/case), the values the panel shows, the
 * sweep plan, and saving. An interface, so tests can give a fake one.
 */
import { basename, dirname, extname, join, resolve } from 'node:path';
import { DEFAULT_OUTPUT_ASSUMPTIONS } from '../analysis/estimates.js';
import type { EngineModel } from '../core/model.js';
import { buildCase, CaseError, loadCase, UNITS, type LoadedCase } from '../case/index.js';
import { printable } from '../case/printable.js';
import { costBreakdown, costCulprit, duration, engineCost } from '../analysis/cost.js';
import { liftByDegree } from '../case/lift-file.js';
import { dynoAsEta } from '../analysis/dyno.js';
import { density } from '../core/gas.js';
import { sweptVolume } from '../core/kinematics.js';
import { FIELDS, resonatorFields, sectionFields, siToUnit, type FieldDef } from './fields.js';
import { fileExists, saveDirFor, saveEditedCase, suggestSavePath, writeFileAtomic } from './save.js';
import { packageVersion } from '../case/package-root.js';
import type { Edit } from './state.js';

export interface SweepPlan {
  rpms: number[];
  band: { from: number; to: number };
}

export interface CaseSession {
  /** the case file (absolute) */
  file: string;
  name: string;
  /** the fields this case has, in the panel's order */
  fields: FieldDef[];
  /** field values in display units (see fields.ts) */
  values: Record<string, number>;
  sweepPlan: SweepPlan;
  /** the model with the edits applied; throws the case loader's CaseError on a bad value */
  build: (edits: readonly Edit[]) => EngineModel;
  suggestSavePath: () => Promise<string>;
  exists: (path: string) => Promise<boolean>;
  /** save to `path` (absolute or relative to the cwd); returns the absolute path written */
  save: (edits: readonly Edit[], path: string, overwrite: boolean) => Promise<string>;
  /** the first free name for a report of this case */
  suggestReportPath: () => Promise<string>;
  /** write the HTML report of the case with `edits` to `path`; returns the absolute path written */
  report: (edits: readonly Edit[], path: string, overwrite: boolean) => Promise<string>;
  /** the measured data the case names (its measuredTrace, intake.liftFile and measured keys) */
  measured?: SessionMeasured | undefined;
  /** the case's display.units: the units the view starts in (the u key switches) */
  units?: 'metric' | 'imperial' | undefined;
}

export interface SessionMeasured {
  /** a runner pressure trace: absolute [Pa] per degree, the sensor's distance from the valve [m] */
  trace?: { byDegree: Float64Array; sensorAt: number; file: string } | undefined;
  /** the logged intake valve lift [m] per degree (NaN off the log) */
  lift?: Float64Array | undefined;
  /** dyno points on the ηv scale (a torque or power through the case's estimate assumptions) */
  dyno?: { file: string; points: { rpm: number; eta: number }[] } | undefined;
}

/** What the views show of a case's measured files. */
export function measuredOf(loaded: LoadedCase): SessionMeasured | undefined {
  const f = loaded.files;
  const m = loaded.model;
  const e = loaded.case.estimate ?? {};
  const refMass = density(m.ambient.pressure, m.ambient.temperature) * sweptVolume(m.engine);
  const assumptions = {
    ...(e.airFuelRatio !== undefined ? { airFuelRatio: e.airFuelRatio } : {}),
    ...(e.fuelHeatingValue !== undefined ? { fuelHeatingValue: e.fuelHeatingValue } : {}),
    ...(e.brakeEfficiency !== undefined ? { brakeEfficiency: e.brakeEfficiency } : {}),
  };
  const out: SessionMeasured = {
    ...(f.trace ? { trace: { byDegree: f.trace.byDegree, sensorAt: f.trace.sensorAt, file: f.trace.log.file } } : {}),
    ...(f.intake.lift ? { lift: liftByDegree(f.intake.lift.log) } : {}),
    ...(f.dyno
      ? {
          dyno: {
            file: f.dyno.file,
            points: f.dyno.points.flatMap((p) => {
              const eta = dynoAsEta(p, refMass, assumptions);
              return eta === undefined ? [] : [{ rpm: p.rpm, eta }];
            }),
          },
        }
      : {}),
  };
  return Object.keys(out).length > 0 ? out : undefined;
}

/** A value in model units → the display unit `unitWord` ('' = as is), by the case loader's unit table. */
export const toDisplay = siToUnit;

/** The default sweep when the case gives none: half to 1.4 × the case speed, 250 rpm steps (our default, not a rule). */
export function defaultSweepPlan(rpm: number): SweepPlan {
  const step = 250;
  const from = Math.max(1000, Math.round((rpm * 0.5) / 500) * 500);
  const to = Math.max(from + 4 * step, Math.round((rpm * 1.4) / 500) * 500);
  const rpms: number[] = [];
  for (let v = from; v <= to + 1e-9; v += step) rpms.push(v);
  return { rpms, band: { from: Math.round((rpm * 0.75) / 250) * 250, to: Math.min(to, Math.round((rpm * 1.15) / 250) * 250) } };
}

export function sweepPlanOf(loaded: LoadedCase): SweepPlan {
  const c = loaded.case;
  const plan = defaultSweepPlan(c.rpm);
  if (c.sweep) {
    const rpms: number[] = [];
    for (let v = c.sweep.from; v <= c.sweep.to + 1e-9 && rpms.length < 400; v += c.sweep.step) rpms.push(Math.round(v * 1000) / 1000);
    plan.rpms = rpms;
  }
  const lo = plan.rpms[0] ?? 0;
  const hi = plan.rpms[plan.rpms.length - 1] ?? 0;
  if (c.band) plan.band = { from: c.band.from, to: c.band.to };
  plan.band = { from: Math.max(lo, plan.band.from), to: Math.min(hi, plan.band.to) };
  return plan;
}

/** The panel's fields of a loaded case and their values, in display units. */
export function fieldValues(loaded: LoadedCase): { fields: FieldDef[]; values: Record<string, number> } {
  const c = loaded.case;
  const raw = loaded.data as { runner?: Record<string, unknown>; inlet?: { snorkel?: Record<string, unknown> }; exhaust?: { pipe?: Record<string, unknown> } };
  const plainRunner = raw.runner !== undefined && 'length' in raw.runner && !('sections' in raw.runner);
  // a pipe given as length and diameter (not as sections) shows both
  const plain = (p: Record<string, unknown> | undefined) => p !== undefined && 'length' in p && !('sections' in p);
  const snorkel = c.inlet.kind === 'plenum' && plain(raw.inlet?.snorkel) ? c.inlet.snorkel?.sections[0] : undefined;
  const exhaustPipe = plain(raw.exhaust?.pipe) ? c.exhaust.pipe?.sections[0] : undefined;
  const si: Record<string, number | undefined> = {
    rpm: c.rpm,
    'runner.length': plainRunner ? c.runner.sections[0]?.length : undefined,
    'runner.diameter': plainRunner ? c.runner.sections[0]?.diameterStart : undefined,
    'runner.entryLoss': c.runner.entryLoss,
    'inlet.volume': c.inlet.kind === 'plenum' ? c.inlet.volume : undefined,
    'inlet.feedDiameter': c.inlet.kind === 'plenum' ? c.inlet.feedDiameter : undefined,
    'inlet.feedCd': c.inlet.kind === 'plenum' && c.inlet.feedDiameter !== undefined ? c.inlet.feedCd : undefined,
    'inlet.snorkel.length': snorkel?.length,
    'inlet.snorkel.diameter': snorkel?.diameterStart,
    'inlet.snorkel.entryLoss': c.inlet.kind === 'plenum' ? c.inlet.snorkel?.entryLoss : undefined,
    'intake.diameter': c.intake.diameter,
    // a lift log gives the lift: not offered for editing
    'intake.maxLift': c.intake.liftFile === undefined ? c.intake.maxLift : undefined,
    'engine.compressionRatio': c.engine.compressionRatio,
    'exhaust.pipe.length': exhaustPipe?.length,
    'exhaust.pipe.diameter': exhaustPipe?.diameterStart,
    // a valve with a lift log takes its events from the log: not offered for editing
    'intake.opens': c.intake.liftFile === undefined ? c.intake.opens : undefined,
    'intake.closes': c.intake.liftFile === undefined ? c.intake.closes : undefined,
    'exhaust.opens': c.exhaust.liftFile === undefined ? c.exhaust.opens : undefined,
    'exhaust.closes': c.exhaust.liftFile === undefined ? c.exhaust.closes : undefined,
    'ambient.pressure': c.ambient.pressure,
    'ambient.temperature': c.ambient.temperature,
  };
  const sections = plainRunner ? [] : sectionFields(c.runner.sections.length);
  c.runner.sections.forEach((sec, i) => {
    if (plainRunner) return;
    si[`runner.sections.${i}.length`] = sec.length;
    si[`runner.sections.${i}.diameterStart`] = sec.diameterStart;
    si[`runner.sections.${i}.diameterEnd`] = sec.diameterEnd;
  });
  const resonators: FieldDef[] = [];
  (c.runner.resonator ?? []).forEach((r, i) => {
    const fs = resonatorFields(i, r.kind);
    resonators.push(...fs);
    const base = `runner.resonator.${i}`;
    si[`${base}.at`] = r.at;
    if (r.kind === 'tube') {
      si[`${base}.length`] = r.length;
      si[`${base}.diameter`] = r.diameter;
    } else {
      si[`${base}.neckLength`] = r.neckLength;
      si[`${base}.neckDiameter`] = r.neckDiameter;
      si[`${base}.volume`] = r.volume;
    }
  });
  // the runner's sections take the place of its length and diameter; its resonators follow
  const at = FIELDS.findIndex((f) => f.path === 'runner.length');
  const after = FIELDS.findIndex((f) => f.path === 'inlet.volume');
  const ordered = [...FIELDS.slice(0, at), ...sections, ...FIELDS.slice(at, after), ...resonators, ...FIELDS.slice(after)];
  const fields: FieldDef[] = [];
  const values: Record<string, number> = {};
  for (const f of ordered) {
    const v = si[f.path];
    if (v === undefined) continue;
    fields.push(f);
    values[f.path] = toDisplay(v, f.unitWord);
  }
  return { fields, values };
}

function setsOf(edits: readonly Edit[]): string[] {
  return edits.map((e) => `${e.path}=${e.value}`);
}

/**
 * a point the view re-runs on an edit must come back while the user waits:
 * an edit estimated above this is refused unless --allow-long [s]
 */
export const EDIT_COST_LIMIT_SECONDS = 60;

export interface OpenOptions {
  allowExtreme?: boolean;
  allowLong?: boolean;
}

/** The model of the case with `edits`; throws CaseError for a bad value or a point that would take too long. */
export function buildEdited(raw: Record<string, unknown>, file: string, edits: readonly Edit[], opts: OpenOptions = {}): EngineModel {
  const model = buildCase(structuredClone(raw), file, { set: setsOf(edits), allowExtreme: opts.allowExtreme === true }).model;
  if (!opts.allowLong) {
    const cost = engineCost(model);
    if (cost.seconds > EDIT_COST_LIMIT_SECONDS)
      throw new CaseError(
        costCulprit(model, 'rpm'),
        `a point would take about ${duration(cost.seconds)} (${costBreakdown(cost)}); start the view with --allow-long to allow it`,
      );
  }
  return model;
}

export async function openCase(file: string, opts: OpenOptions = {}): Promise<CaseSession> {
  const loaded = await loadCase(file, { allowExtreme: opts.allowExtreme === true });
  const raw = structuredClone(loaded.data);
  buildEdited(raw, file, [], opts); // the case as it is must be usable too
  return {
    file,
    name: printable(loaded.model.name || basename(file)),
    ...fieldValues(loaded),
    sweepPlan: sweepPlanOf(loaded),
    build: (edits) => buildEdited(raw, file, edits, opts),
    suggestSavePath: async () => suggestSavePath(file, fileExists, await saveDirFor(file)),
    exists: fileExists,
    save: (edits, path, overwrite) => saveEditedCase(file, edits, path, { overwrite }),
    measured: measuredOf(loaded),
    units: loaded.case.display?.units ?? 'metric',
    suggestReportPath: async () => suggestReportPath(file, fileExists, await saveDirFor(file)),
    report: async (edits, path, overwrite) => {
      const edited = buildCase(structuredClone(raw), file, { set: setsOf(edits) });
      const plan = sweepPlanOf(edited);
      const html = await reportOfCase(edited, file, plan);
      const full = resolve(path);
      await writeFileAtomic(full, html, overwrite);
      return full;
    },
  };
}

/** demo.yaml → demo-report.html, then demo-report-2.html … (the first that does not exist) in `dir` */
export async function suggestReportPath(caseFile: string, exists: (p: string) => Promise<boolean> = fileExists, dir: string = dirname(caseFile)): Promise<string> {
  const stem = basename(caseFile, extname(caseFile));
  for (let n = 1; n < 10000; n++) {
    const candidate = join(dir, `${stem}-report${n === 1 ? '' : `-${n}`}.html`);
    if (!(await exists(candidate))) return candidate;
  }
  return join(dir, `${stem}-report.html`);
}

/**
 * The report of a loaded case over the view's sweep plan (the speeds the
 * Sweep view shows), the same document as \`tractwave report\` makes. The
 * report modules (and vega) are loaded only when a report is asked for.
 */
export async function reportOfCase(loaded: LoadedCase, file: string, plan: SweepPlan): Promise<string> {
  const { buildReport, gatherReport } = await import('../report/index.js');
  const c = loaded.case;
  const assumptions = {
    airFuelRatio: c.estimate?.airFuelRatio ?? DEFAULT_OUTPUT_ASSUMPTIONS.airFuelRatio,
    fuelHeatingValue: c.estimate?.fuelHeatingValue ?? DEFAULT_OUTPUT_ASSUMPTIONS.fuelHeatingValue,
    brakeEfficiency: c.estimate?.brakeEfficiency ?? DEFAULT_OUTPUT_ASSUMPTIONS.brakeEfficiency,
  };
  const data = await gatherReport({
    design: { name: loaded.model.name || basename(file), file: basename(file), case: c, model: loaded.model },
    rpms: plan.rpms,
    band: plan.band,
    assumptions,
  });
  const now = new Date();
  const built = await buildReport(data, {
    generatedAt: `${now.toISOString().slice(0, 16).replace('T', ' ')} UTC`,
    version: packageVersion(),
    units: 'metric',
    speedsFrom: "the terminal view's sweep",
  });
  return built.html;
}
