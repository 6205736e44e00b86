/**
 * `tractwave calibrate CASE --measured FILE --fit a,b`: fit values of the
 * model to a dyno sheet (analysis/calibrate.ts), print them with their
 * uncertainty and the residuals, and optionally write a calibrated copy of
 * the case (`--out`, never over an existing file without --force).
 */
import { basename, dirname, resolve } from 'node:path';
import YAML from 'yaml';
import { performance } from 'node:perf_hooks';
import { calibrate, FIT_NAMES, FIT_PARAMETERS, fitProblem, type CalibrationResult, type FitName } from '../../analysis/calibrate.js';
import { leadingKind, type DynoKind } from '../../analysis/dyno.js';
import { CaseError } from '../../case/errors.js';
import { parseCase, parseSetValue, readCaseText, type LoadedCase } from '../../case/load.js';
import { movedFileKeys } from '../../case/measured-files.js';
import { didYouMean } from '../../case/suggest.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { displayUnits, SET_OPTION, UNITS_OPTION, type Command } from '../command.js';
import { METRIC, type Units } from '../../present/units.js';
import { fix, table } from '../format.js';
import { dynoOf, MEASURED_OPTION } from '../measured-options.js';
import { writeFileAtomic } from '../write-file.js';
import { assumptionsOf, loadForSweep, signed, wrapLine } from './sweep.js';
import { existsSync } from 'node:fs';

export const DEFAULT_FIT: readonly FitName[] = ['brakeEfficiency', 'cdScale'];

const QUANTITY_WORDS: Record<string, DynoKind> = { torque: 'torque', power: 'power', ve: 'volumetricEfficiency' };

const OPTIONS: OptionSpec[] = [
  MEASURED_OPTION,
  { name: 'fit', type: 'string', value: 'a,b', description: `values to fit, from ${FIT_NAMES.join(', ')} (default ${DEFAULT_FIT.join(',')})` },
  { name: 'quantity', type: 'string', value: 'Q', description: 'the measured quantity to fit: torque, power or ve (default: torque, else power, else ve, as the sheet has)' },
  SET_OPTION,
  { name: 'json', type: 'boolean', description: 'print the fit as JSON (SI units)' },
  { name: 'out', type: 'string', value: 'NEW.yaml', description: 'write a copy of the case with the fitted values' },
  { name: 'force', type: 'boolean', description: 'allow --out to overwrite an existing file' },
  UNITS_OPTION,
];

function parseFit(text: string | undefined): FitName[] {
  if (text === undefined) return [...DEFAULT_FIT];
  const names = text.split(',').map((s) => s.trim()).filter((s) => s !== '');
  const out: FitName[] = [];
  for (const n of names) {
    if (!(FIT_NAMES as readonly string[]).includes(n)) throw new CaseError('--fit', `unknown value '${n}'${didYouMean(n, FIT_NAMES)} (one or more of ${FIT_NAMES.join(', ')})`, 'option');
    if (out.includes(n as FitName)) throw new CaseError('--fit', `'${n}' is named twice`, 'option');
    out.push(n as FitName);
  }
  if (out.length === 0) throw new CaseError('--fit', `name at least one of ${FIT_NAMES.join(', ')}`, 'option');
  return out;
}

const kindWords: Record<DynoKind, string> = { torque: 'brake torque', power: 'brake power', volumetricEfficiency: 'volumetric efficiency' };

function showValue(name: FitName, v: number): string {
  return name === 'friction' ? fix(v, 5) : fix(v, 4);
}

function showQuantity(kind: DynoKind, v: number, u: Units = METRIC): string {
  return kind === 'torque' ? u.text('torque', v, 2) : kind === 'power' ? u.text('power', v, 2) : `${fix(v * 100, 1)} %`;
}

/** The case text with the fitted values put in (comments kept) and a note on top; file paths rebased to `target`. */
export function calibratedCaseText(original: string, loaded: LoadedCase, sets: readonly string[], r: CalibrationResult, sheetFile: string, target: string): string {
  const doc = YAML.parseDocument(original);
  for (const s of sets) {
    const eq = s.indexOf('=');
    const segs = s.slice(0, eq).trim().split('.').map((x) => (/^\d+$/.test(x) ? Number(x) : x));
    const v = parseSetValue(s.slice(eq + 1).trim(), s.slice(0, eq));
    if (v === undefined) doc.deleteIn(segs);
    else doc.setIn(segs, v);
  }
  for (const m of movedFileKeys(loaded.data, loaded.file, target)) doc.setIn(m.path, m.value);
  for (const [k, v] of Object.entries(r.fit) as [FitName, number][]) {
    const segs = FIT_PARAMETERS[k].caseKey.split('.');
    doc.setIn(segs, Number(v.toPrecision(5)));
    const node = doc.getIn(segs, true);
    const u = r.uncertainty[k];
    if (YAML.isScalar(node)) node.comment = ` fitted by tractwave calibrate${u ? ` (95 %: ${showValue(k, u.low95)} to ${showValue(k, u.high95)})` : ''}`;
  }
  const note = [
    ` Calibrated by tractwave calibrate from ${basename(loaded.file)}:`,
    `   ${Object.keys(r.fit).map((k) => FIT_PARAMETERS[k as FitName].caseKey).join(', ')} fitted to the ${kindWords[r.quantity]}`,
    `   of ${sheetFile} at ${r.points.length} speeds, ${fix(r.covers.from, 0)}–${fix(r.covers.to, 0)} rpm (RMS residual ${fix(r.residual.rmsRelative * 100, 2)} %).`,
    ...(sets.length > 0 ? [`   With ${sets.join(', ')}.`] : []),
    '   Fitted values hold for this engine over these speeds; results stay estimates to verify on the engine.',
  ].join('\n');
  doc.commentBefore = doc.commentBefore ? `${note}\n\n${doc.commentBefore}` : note;
  return doc.toString({ lineWidth: 0 });
}

export const calibrateCommand: Command = {
  name: 'calibrate',
  summary: 'fit brake efficiency, the Cd scale or runner friction to a dyno sheet; uncertainty and residuals',
  help: `usage: tractwave calibrate CASE [--measured FILE] [--fit a,b] [--quantity Q]
                           [--set path=value ...] [--json]
                           [--out NEW.yaml [--force]]

Fits values of the model to a dyno sheet by least squares (Levenberg–
Marquardt) over the measured speeds: each evaluation simulates every
measured speed. It prints each fitted value with its standard error and 95 %
interval (linearised, Student's t), the residual at each speed and its RMS,
and the speeds the fit covers. Residuals are relative, so every speed counts
alike.

Values to fit (--fit, comma separated):
  brakeEfficiency  estimate.brakeEfficiency: scales the torque and power
                   estimate (not with a ve_pct sheet)
  cdScale          intake.cdScale: multiplies the intake valve's Cd table
  friction         runner.friction: the runner's Fanning friction factor

The dyno sheet: --measured FILE (relative to where you are), else the case's
measured key. --out writes a copy of the case with the fitted values, comments
kept, a note on top saying what was fitted to what; file names in it are
rewritten to work from its folder.

A fit matches the model to this engine over these speeds; it does not make the
model right elsewhere. Dyno testing carries its own hazards: follow qualified
practice.

options
${optionHelp(OPTIONS)}

--json prints: quantity, fit {name: value}, start {name: value}, uncertainty
{name: {standardError, low95, high95} | null}, atBound [...], residual
{rmsRelative, rms, startRmsRelative}, points [{rpm, measured, model, residual,
relative}], covers {from, to}, degreesOfFreedom, iterations, evaluations, file.

examples
  tractwave calibrate cases/measured-single.yaml --fit brakeEfficiency,cdScale
  tractwave calibrate my.yaml --measured dyno.csv --out my-calibrated.yaml
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const u = displayUnits(args);
    const [file] = expectPositionals(args, ['CASE'], 'calibrate');
    const fit = parseFit(args.string('fit'));
    const out = args.string('out');
    if (args.flag('force') && out === undefined) throw new CaseError('--force', 'only applies with --out NEW.yaml', 'option');
    if (out !== undefined) {
      if (!/\.(ya?ml|json)$/i.test(out)) throw new CaseError('--out', `'${out}' should be a case file (.yaml)`, 'option');
      if (!args.flag('force') && existsSync(resolve(io.cwd, out))) throw new CaseError('--out', `'${out}' already exists; add --force to overwrite it`, 'option');
      if (resolve(io.cwd, out) === resolve(io.cwd, file!) && !args.flag('force')) throw new CaseError('--out', 'is the case file itself; add --force to overwrite it', 'option');
    }
    const loaded = await loadForSweep(file!, args, io);
    const sheet = await dynoOf(args, loaded, io.cwd);
    if (!sheet) throw new CaseError('--measured', "required: a dyno sheet (--measured FILE, or the case's measured key)", 'option');
    const qText = args.string('quantity');
    let quantity: DynoKind | undefined;
    if (qText !== undefined) {
      quantity = QUANTITY_WORDS[qText];
      if (!quantity) throw new CaseError('--quantity', `expected torque, power or ve, got '${qText}'${didYouMean(qText, Object.keys(QUANTITY_WORDS))}`, 'option');
      if (!sheet.points.some((p) => p[quantity!] !== undefined)) throw new CaseError('--quantity', `the sheet ${sheet.file} has no ${qText} column`, 'option');
    } else quantity = fit.includes('brakeEfficiency') ? (['torque', 'power', 'volumetricEfficiency'] as const).find((k) => sheet.points.some((p) => p[k] !== undefined)) : leadingKind(sheet.points);
    const speeds = sheet.points.filter((p) => p[quantity!] !== undefined).length;
    const problem = fitProblem(fit, quantity!, speeds);
    if (problem) throw new CaseError('--fit', problem, 'option');

    const assumptions = assumptionsOf(loaded.case);
    let shown = false;
    const t0 = performance.now();
    let r: CalibrationResult;
    try {
      r = calibrate({
        model: loaded.model,
        cdScale: loaded.case.intake.cdScale ?? 1,
        assumptions,
        measured: sheet.points,
        quantity: quantity!,
        fit,
        onEvaluation: (n) => {
          if (!io.stderrIsTTY) return;
          shown = true;
          io.stderr.write(`\r\x1b[Kcalibrate: ${n} simulations of the ${speeds} measured speeds (${fix((performance.now() - t0) / 1000, 0)} s)`);
        },
      });
    } finally {
      if (shown) io.stderr.write('\r\x1b[K');
    }
    const seconds = (performance.now() - t0) / 1000;
    for (const k of r.atBound) io.stderr.write(`warning: ${k} ended at its bound (${FIT_PARAMETERS[k].min} to ${FIT_PARAMETERS[k].max}): the data pull it further than this model allows\n`);

    let wrote: string | undefined;
    if (out !== undefined) {
      const original = await readCaseText(file!, io.cwd);
      const target = resolve(io.cwd, out);
      const text = calibratedCaseText(original, loaded, args.list('set'), r, sheet.file, target);
      parseCase(text, target); // a copy that would not load is never written
      await writeFileAtomic(out, text, { force: args.flag('force'), option: '--out', cwd: io.cwd });
      wrote = out;
    }
    if (args.flag('json')) {
      io.stdout.write(`${JSON.stringify({ file: sheet.file, ...r, ...(wrote ? { out: wrote } : {}), seconds })}\n`);
      return 0;
    }
    const lines: string[] = [];
    lines.push(`${loaded.model.name}: calibrated to the ${kindWords[r.quantity]} of ${sheet.file}`);
    lines.push(`  ${r.points.length} speeds, ${fix(r.covers.from, 0)}–${fix(r.covers.to, 0)} rpm; ${r.iterations} iterations, ${r.evaluations} simulations of the speeds, ${fix(seconds, 1)} s`);
    lines.push('');
    lines.push('fitted values (± standard error; 95 % interval, linearised)');
    const rows: string[] = [];
    for (const k of fit) {
      const u = r.uncertainty[k];
      const v = r.fit[k]!;
      const span = u ? `± ${showValue(k, u.standardError)}   (${showValue(k, u.low95)} to ${showValue(k, u.high95)})` : r.atBound.includes(k) ? '(at its bound: no interval)' : '(no interval: as many values as speeds)';
      rows.push(`  ${FIT_PARAMETERS[k].caseKey.padEnd(25)}${showValue(k, v).padStart(8)}  ${span}`);
      rows.push(`  ${''.padEnd(25)}was ${showValue(k, r.start[k]!)}: ${FIT_PARAMETERS[k].words}`.slice(0, 80));
    }
    const after = ['', `residual: RMS ${fix(r.residual.rmsRelative * 100, 2)} % (${showQuantity(r.quantity, r.residual.rms, u)}), was ${fix(r.residual.startRmsRelative * 100, 2)} % before the fit`];
    io.stdout.write([...lines.map((l) => wrapLine(l)), ...rows, ...after.map((l) => wrapLine(l))].join('\n') + '\n');
    io.stdout.write(
      table(
        ['rpm', 'measured', 'model', 'model − meas.', '%'],
        r.points.map((p) => [fix(p.rpm, 0), showQuantity(r.quantity, p.measured, u), showQuantity(r.quantity, p.model, u), showQuantity(r.quantity, p.residual, u), signed(p.relative * 100, 2)]),
      ),
    );
    const tail = [
      '',
      `The fit covers ${fix(r.covers.from, 0)}–${fix(r.covers.to, 0)} rpm: outside it the fitted values are untested.`,
      'Results stay estimates from a simplified model: verify them on the engine.',
    ];
    if (wrote) tail.push(`wrote the calibrated case to ${wrote} (from ${dirname(wrote) === '.' ? 'here' : dirname(wrote)}, its file names are rewritten to match)`);
    io.stdout.write(tail.map((l) => wrapLine(l)).join('\n') + '\n');
    return 0;
  },
};
