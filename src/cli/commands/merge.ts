/**
 * `tractwave merge PART.json ... [--json | --csv FILE [--force]]`: join the
 * parts of a sharded tune (`tune --shard K/N --json`) into the report of the
 * whole tune — the same ranking, edges, warnings, text, JSON and CSV as the
 * unsharded `tune` with the same case and options, byte for byte.
 *
 * Before anything is joined, each part must be a tune part whose fingerprint
 * matches its own case and options (not damaged or edited), all parts must
 * share one fingerprint and one shard count (no foreign part), and every
 * shard 1 … N must be there exactly once (none missing, none twice), holding
 * exactly the designs of its slice. Otherwise: exit 2 naming the part (or the
 * missing shard). Then the plan is rebuilt from the case and options the
 * parts carry (tune.ts planTune) and the report is printed from it and the
 * designs' outcomes, in grid order, as tune prints it.
 */
import { stat, readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { shardDesigns } from '../../analysis/shard.js';
import { CaseError } from '../../case/errors.js';
import { optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { displayUnits, UNITS_OPTION, type Command } from '../command.js';
import { packageVersion } from '../package-root.js';
import { csvAndJsonChoice } from './sweep.js';
import { designsChecksum, PART_FORMAT, PART_VERSION, partFingerprint, planTune, writeTuneReport, type DesignOutcome, type TunePart, type TuneRequest } from './tune.js';

const OPTIONS: OptionSpec[] = [
  { name: 'json', type: 'boolean', description: 'print the ranking as JSON (SI units), as tune --json does' },
  { name: 'csv', type: 'string', value: 'FILE', description: 'write one row per design and speed to FILE, as tune --csv does' },
  { name: 'force', type: 'boolean', description: 'allow --csv to overwrite an existing file' },
  UNITS_OPTION,
];

/** the largest part file read [bytes] */
const MAX_PART_BYTES = 512 * 1024 * 1024;

const NUMERIC_POINT_KEYS = ['rpm', 'volumetricEfficiency', 'torque', 'power', 'massImbalance'] as const;
const NON_FINITE: Readonly<Record<string, number>> = { NaN: Number.NaN, Infinity: Number.POSITIVE_INFINITY, '-Infinity': Number.NEGATIVE_INFINITY };

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}
const isWhole = (v: unknown): v is number => typeof v === 'number' && Number.isSafeInteger(v) && v >= 0;
const isStringList = (v: unknown): v is string[] => Array.isArray(v) && v.every((x) => typeof x === 'string');
const isTextOrNull = (v: unknown): v is string | null => v === null || typeof v === 'string';

/**
 * Read a file of parts: one part (pretty-printed or not), or several, one per
 * line (JSON Lines: what GNU parallel collects from several shards' standard
 * output). Each comes with the name its errors use: the file, or file:line.
 */
async function readParts(file: string, cwd: string): Promise<{ file: string; part: TunePart }[]> {
  const full = resolve(cwd, file);
  let text: string;
  try {
    const s = await stat(full);
    if (!s.isFile()) throw new CaseError(file, 'not a file', 'file');
    if (s.size > MAX_PART_BYTES) throw new CaseError(file, `is ${s.size} bytes; a file of tune parts is at most ${MAX_PART_BYTES} bytes`, 'file');
    text = await readFile(full, 'utf8');
  } catch (e) {
    if (e instanceof CaseError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new CaseError(file, code === 'ENOENT' ? 'file not found' : `cannot read the file (${code ?? String(e)})`, 'file');
  }
  if (text.trim() === '') throw new CaseError(file, 'is empty: not a tune part (did its tune --shard run fail?)', 'file');
  let whole: unknown;
  let wholeError: Error | undefined;
  try {
    whole = JSON.parse(text);
  } catch (e) {
    wholeError = e as Error;
  }
  if (wholeError === undefined) return [{ file, part: checkPart(whole, file) }];
  const lines = text.split('\n');
  const filled = lines.filter((l) => l.trim() !== '').length;
  if (filled <= 1) throw new CaseError(file, `is not JSON (${wholeError.message}): not a tune part, or cut short`, 'file');
  const out: { file: string; part: TunePart }[] = [];
  lines.forEach((line, i) => {
    if (line.trim() === '') return;
    const where = `${file}:${i + 1}`;
    let data: unknown;
    try {
      data = JSON.parse(line);
    } catch (e) {
      throw new CaseError(where, `is not JSON (${(e as Error).message}): not a tune part, or cut short`, 'file');
    }
    out.push({ file: where, part: checkPart(data, where) });
  });
  return out;
}

/** Check one part's shape; `file` is the error path. */
function checkPart(data: unknown, file: string): TunePart {
  const bad = (what: string): CaseError => new CaseError(file, `is not a tune part (${what}); make parts with tractwave tune ... --shard K/N --json`, 'file');
  if (!isObject(data) || data.format !== PART_FORMAT) throw bad(`no "format": "${PART_FORMAT}"`);
  if (data.version !== PART_VERSION) throw new CaseError(file, `is a tune part of format version ${String(data.version)}; this tractwave reads version ${PART_VERSION}`, 'file');
  const shard = data.shard;
  if (!isObject(shard) || !isWhole(shard.index) || !isWhole(shard.count) || !(shard.index >= 1 && shard.index <= shard.count)) throw bad('shard {index, count}');
  if (typeof data.fingerprint !== 'string' || typeof data.checksum !== 'string' || typeof data.tool !== 'string' || typeof data.caseFile !== 'string' || !isWhole(data.gridDesigns)) throw bad('fingerprint, tool, caseFile, gridDesigns');
  if (!isObject(data.case)) throw bad('case');
  const o = data.options;
  if (!isObject(o) || !isStringList(o.vary) || !isStringList(o.set) || !isTextOrNull(o.rpm) || !isTextOrNull(o.band)) throw bad('options {vary, set, rpm, band}');
  if (!Array.isArray(data.designs)) throw bad('designs');
  const designs: DesignOutcome[] = data.designs.map((d: unknown, i: number) => {
    if (!isObject(d) || !isWhole(d.number) || typeof d.verdict !== 'string' || !Array.isArray(d.points)) throw bad(`designs[${i}]`);
    const points = d.points.map((p: unknown, j: number) => {
      if (!isObject(p) || typeof p.converged !== 'boolean') throw bad(`designs[${i}].points[${j}]`);
      const q: Record<string, unknown> = { ...p };
      for (const k of NUMERIC_POINT_KEYS) {
        const v = q[k];
        if (typeof v === 'string' && v in NON_FINITE) q[k] = NON_FINITE[v];
        else if (typeof v !== 'number') throw bad(`designs[${i}].points[${j}].${k}`);
      }
      return q as DesignOutcome['points'][number];
    });
    return { number: d.number, points, verdict: d.verdict };
  });
  const options: TuneRequest = { vary: o.vary, set: o.set, rpm: o.rpm, band: o.band };
  return {
    format: PART_FORMAT,
    version: PART_VERSION,
    tool: data.tool,
    fingerprint: data.fingerprint,
    shard: { index: shard.index, count: shard.count },
    gridDesigns: data.gridDesigns,
    caseFile: data.caseFile,
    case: data.case,
    options,
    designs,
    checksum: data.checksum,
  };
}

export const mergeCommand: Command = {
  name: 'merge',
  summary: 'join the parts of a sharded tune (tune --shard K/N) into the whole tune',
  help: `usage: tractwave merge PART.json ... [--json | --csv FILE [--force]]

Joins the parts that 'tractwave tune ... --shard K/N --json' printed (one per
shard, in any order, from any machines) and prints what the whole tune prints
with the same case and options: the ranking, the best design, the edges
warning, the heat map — or with --json the same JSON, or with --csv the same
CSV, byte for byte.

Each part carries the case, the tune's options and a fingerprint of both. The
merge refuses (exit 2, naming the part) a file that is not a part or whose
fingerprint does not match its contents, a part of a different tune (another
case, other --vary, --set, --rpm or --band, or another shard count), a shard
given twice, and — naming it — a missing shard. The parts need not be merged
where they were made: the case travels inside them.

options
${optionHelp(OPTIONS)}

examples
  tractwave tune cases/demo.yaml --vary runner.length=250mm:500mm:10mm \\
      --vary intake.closes=40:80:5 --shard 1/3 --json > part-1.json
  (the same with --shard 2/3 and 3/3, anywhere)
  tractwave merge part-1.json part-2.json part-3.json
  tractwave merge part-*.json --csv tune.csv
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    displayUnits(args); // a bad --units is exit 2 before any work
    const files = args.positionals;
    if (files.length === 0) throw new CaseError('merge', 'missing PART.json (usage: tractwave merge PART.json ...; see tractwave merge --help)', 'option');
    const csv = csvAndJsonChoice(args, io);
    const parts: { file: string; part: TunePart }[] = [];
    for (const file of files) parts.push(...(await readParts(file, io.cwd)));

    for (const { file, part } of parts) {
      const own = partFingerprint({ caseFile: part.caseFile, case: part.case, request: part.options, tool: part.tool });
      if (own !== part.fingerprint) throw new CaseError(file, 'its fingerprint does not match its case and options: the part was edited or damaged; make it again', 'file');
      if (designsChecksum(part.designs) !== part.checksum) throw new CaseError(file, 'its checksum does not match its designs: the part was edited or damaged; make it again', 'file');
    }
    const first = parts[0]!;
    for (const { file, part } of parts.slice(1)) {
      if (part.fingerprint !== first.part.fingerprint) {
        const what =
          part.tool !== first.part.tool
            ? `made by ${part.tool}, ${first.file} by ${first.part.tool}`
            : part.caseFile !== first.part.caseFile
              ? `its case is ${part.caseFile}, that of ${first.file} is ${first.part.caseFile}`
              : 'its case or its options (--vary, --set, --rpm, --band) differ';
        throw new CaseError(file, `is a part of another tune than ${first.file} (${what})`, 'file');
      }
      if (part.shard.count !== first.part.shard.count)
        throw new CaseError(file, `is shard ${part.shard.index}/${part.shard.count}, but ${first.file} is of a tune cut into ${first.part.shard.count} shards`, 'file');
    }
    const count = first.part.shard.count;
    const byShard = new Map<number, string>();
    for (const { file, part } of parts) {
      const other = byShard.get(part.shard.index);
      if (other !== undefined)
        throw new CaseError(
          file,
          other === file ? `is given twice: give each shard once` : `is shard ${part.shard.index}/${count} again (${other} is that shard too): give each shard once`,
          'file',
        );
      byShard.set(part.shard.index, file);
    }
    for (let k = 1; k <= count; k++)
      if (!byShard.has(k)) {
        const given = [...byShard.entries()].sort((a, b) => a[0] - b[0]).map(([i, f]) => `${i}/${count} ${f}`);
        const list = given.length > 6 ? `${given.slice(0, 6).join(', ')}, …` : given.join(', ');
        throw new CaseError(`shard ${k}/${count}`, `missing: no part holds it (given: ${list}); run tune ... --shard ${k}/${count} and merge again`, 'option');
      }

    const plan = planTune(first.part.case, first.part.caseFile, first.part.options);
    const outcomes: DesignOutcome[] = [];
    for (const { file, part } of parts) {
      const want = shardDesigns(plan.total, part.shard);
      const have = part.designs.map((d) => d.number);
      if (part.gridDesigns !== plan.total || want.length !== have.length || want.some((n, i) => have[i] !== n))
        throw new CaseError(file, `does not hold the designs of shard ${part.shard.index}/${count} of a grid of ${plan.total} (made by another version of tractwave, or edited)`, 'file');
      outcomes.push(...part.designs);
    }
    outcomes.sort((a, b) => a.number - b.number);
    if (first.part.tool !== `tractwave ${packageVersion()}`)
      io.stderr.write(`note: the parts were made by ${first.part.tool}; this is tractwave ${packageVersion()}\n`);
    return writeTuneReport(plan, outcomes, io, { json: args.flag('json'), csv, force: args.flag('force') });
  },
};
