/**
 * The top component: owns the state (one reducer, keys → actions) and the
 * effects — running points and sweeps through the engine service in the
 * background, the play timer, saving — and passes plain numbers to the
 * display-only views.
 */
import { basename, dirname, resolve } from 'node:path';
import React, { useCallback, useEffect, useReducer, useRef } from 'react';
import { Box, useApp, useInput, useStdin, type Key } from 'ink';
import type { WarmStart } from '../core/engine.js';
import type { EngineModel } from '../core/model.js';
import { MASS_IMBALANCE_LIMIT, massBalanceOk } from '../analysis/mass-balance.js';
import { compareTrace } from '../analysis/trace-compare.js';
import { deliveredSinceIvo } from '../analysis/filling.js';
import { windowStart } from './chart.js';
import type { CaseSession } from './case-session.js';
import type { EngineService } from './engine-service.js';
import { RunError } from './engine-service.js';
import { headerLine, keyHints, tooSmall } from './frame-screen.js';
import { reduceApp, type KeyAction } from './keys.js';
import { Lines } from './lines.js';
import { colorWanted } from './palette.js';
import { FileExistsError } from './save.js';
import { baselineLabel, baselineName, initialState, pinLetter, playRate, shownBaseline, sweepIsStale, whatDiffers, zoomSpan, type Action, type PointShown, type UiState } from './state.js';
import type { PipeShown } from './runner-screen.js';
import type { ValveMeasured } from './valve-screen.js';
import { teachingLine } from './teach.js';
import { etaPct, etaPoints, fit, joinFit, wrapWords } from './text.js';
import { units as unitsOf } from '../present/units.js';
import { fixed } from '../present/number.js';
import { useTerminalSize, type TerminalSize } from './use-terminal-size.js';
import { CasePanel, HelpScreen, RunnerView, SweepView, TooSmall, ValveView, Waiting } from './views.js';

export interface AppProps {
  session: CaseSession;
  engine: EngineService;
  /** a fixed size (tests); default: the terminal's, following resizes */
  size?: TerminalSize | undefined;
  /** colour on/off; default: on unless NO_COLOR is set */
  color?: boolean | undefined;
  /** the teaching line at start (default on) */
  teach?: boolean | undefined;
  /** wait this long after the last change before running [ms] (default 120) */
  debounceMs?: number | undefined;
}

/** Messages of errors for the status line: the case loader's CaseError names the field. */
function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/** A file-system failure of a save, in plain words (no temp-file names). */
export function saveProblem(e: unknown, path: string): string {
  const code = (e as NodeJS.ErrnoException | undefined)?.code;
  const dir = dirname(resolve(path));
  if (code === 'ENOENT') return `the folder ${dir} does not exist`;
  if (code === 'EACCES' || code === 'EPERM') return `no permission to write in ${dir}`;
  if (code === 'EISDIR') return `${path} is a folder`;
  if (code === 'ENOSPC') return 'the disk is full';
  return messageOf(e);
}

function isBadInput(e: unknown): boolean {
  if (e instanceof RunError) return e.badInput;
  return e instanceof Error && e.name === 'CaseError';
}

export function App(props: AppProps): React.JSX.Element {
  const { session, engine } = props;
  const [state, dispatch] = useReducer(
    (s: UiState, a: Action | KeyAction) => reduceApp(s, a),
    undefined,
    () =>
      initialState({
        values: session.values,
        fields: session.fields,
        sweepPlan: session.sweepPlan,
        suggestedSavePath: '',
        ...(session.units ? { units: session.units } : {}),
        ...(props.teach !== undefined ? { teach: props.teach } : {}),
      }),
  );
  const { exit } = useApp();
  const { isRawModeSupported } = useStdin();
  const terminal = useTerminalSize();
  const size = props.size ?? terminal;
  const color = props.color ?? colorWanted();
  const warm = useRef<WarmStart | undefined>(undefined);

  const onKey = useCallback((input: string, key: Key) => dispatch({ type: 'key', input, key }), []);
  useInput(onKey, { isActive: isRawModeSupported === true });

  // the first names offered for saving the case and for its report
  useEffect(() => {
    void session.suggestSavePath().then(
      (path) => dispatch({ type: 'suggestSave', path }),
      () => undefined,
    );
    void session.suggestReportPath().then(
      (path) => dispatch({ type: 'suggestReport', path }),
      () => undefined,
    );
  }, [session]);

  // run the point whenever the request changes (after a short pause, so a
  // burst of key presses runs once)
  const request = state.request;
  useEffect(() => {
    let live = true;
    const timer = setTimeout(() => {
      let model: EngineModel;
      try {
        model = session.build(request.edits);
      } catch (e) {
        dispatch({ type: 'pointFailed', id: request.id, message: messageOf(e), badInput: isBadInput(e) });
        return;
      }
      engine.runPoint(model, warm.current).then(
        (out) => {
          warm.current = out.warmStart;
          if (!live) return;
          // the case's measured trace against this result (analysis, on this thread: 720 samples)
          const trace = session.measured?.trace;
          let traceCheck: PointShown['traceCheck'];
          if (trace) {
            try {
              const c = compareTrace(out.result, model, trace.byDegree, trace.sensorAt);
              traceCheck = { model: c.model, verdict: c.verdict };
            } catch {
              traceCheck = undefined; // the point stands without the comparison
            }
          }
          dispatch({
            type: 'pointDone',
            id: request.id,
            point: {
              result: out.result,
              pulse: out.pulse,
              label: request.label,
              ambient: model.ambient.pressure,
              upstream: model.inlet.kind,
              ...(traceCheck ? { traceCheck } : {}),
            },
          });
        },
        (e: unknown) => {
          if (live) dispatch({ type: 'pointFailed', id: request.id, message: messageOf(e), badInput: isBadInput(e) });
        },
      );
    }, request.id === 1 ? 0 : (props.debounceMs ?? 120));
    return () => {
      live = false;
      clearTimeout(timer);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [request.id]);

  // the sweep, in the background; a new request or leaving stops the old one
  const sweepId = state.sweepRequest;
  useEffect(() => {
    if (state.sweepStatus !== 'running') return;
    let model: EngineModel;
    try {
      model = session.build(state.sweepEdits ?? state.edits);
    } catch (e) {
      dispatch({ type: 'sweepFailed', id: sweepId, message: messageOf(e) });
      return;
    }
    const handle = engine.runSweep(model, state.sweepPlan.rpms, {
      onPoint: (index, eta, converged) => dispatch({ type: 'sweepPoint', id: sweepId, index, eta, converged }),
      onDone: () => dispatch({ type: 'sweepDone', id: sweepId }),
      onError: (message) => dispatch({ type: 'sweepFailed', id: sweepId, message }),
    });
    return () => handle.cancel();
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [sweepId]);

  // play
  useEffect(() => {
    if (!state.playing) return;
    let last = Date.now();
    const t = setInterval(() => {
      const now = Date.now();
      dispatch({ type: 'tick', ms: now - last });
      last = now;
    }, 40);
    return () => clearInterval(t);
  }, [state.playing]);

  // saving
  const save = state.save;
  useEffect(() => {
    if (!save) return;
    let live = true;
    if (save.stage === 'checking') {
      void session.exists(save.path).then((exists) => {
        if (live) dispatch({ type: 'saveChecked', exists });
      });
    } else if (save.stage === 'saving') {
      const report = save.kind === 'report';
      (report ? session.report(state.edits, save.path, save.overwrite) : session.save(state.edits, save.path, save.overwrite)).then(
        async (path) => {
          const next = await (report ? session.suggestReportPath() : session.suggestSavePath()).catch(() => '');
          if (live) dispatch({ type: 'saved', path, next });
        },
        (e: unknown) => {
          if (!live) return;
          if (e instanceof FileExistsError) dispatch({ type: 'saveChecked', exists: true });
          else dispatch({ type: 'saveFailed', message: `${report ? 'No report written' : 'Not saved'}: ${saveProblem(e, save.path)}` });
        },
      );
    }
    return () => {
      live = false;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [save?.stage]);

  // quit
  useEffect(() => {
    if (state.quit) exit();
  }, [state.quit, exit]);

  if (tooSmall(size.columns, size.rows)) return <TooSmall columns={size.columns} rows={size.rows} color={color} />;
  return <Screen state={state} session={session} size={size} color={color} />;
}

/** Row budget: one line less than the terminal, so the frame never scrolls it. */
export function rowBudget(rows: number, teach: boolean, help: boolean): { body: number; teach: number } {
  const total = rows - 1;
  const teachRows = teach && !help ? 2 : 0;
  return { body: Math.max(1, total - 3 - teachRows), teach: teachRows };
}

function Screen(p: { state: UiState; session: CaseSession; size: TerminalSize; color: boolean }): React.JSX.Element {
  const { state: s, session, color } = p;
  const w = p.size.columns;
  const rpm = s.values['rpm'] ?? s.point?.result.rpm ?? 0;
  const budget = rowBudget(p.size.rows, s.teach, s.help);
  const span = zoomSpan(s);
  const header = headerLine({
    width: w,
    name: session.name,
    rpm,
    crank: s.crank,
    view: s.view,
    running: s.running || s.sweepStatus === 'running',
    ...(span < 720 && (s.view === 'valve' || s.view === 'runner') ? { zoom: span } : {}),
  });
  const point = s.point;
  const compared = shownBaseline(s);
  const from = windowStart(s.crank, span);

  let body: React.JSX.Element;
  const u = unitsOf(s.units);
  if (s.help) body = <HelpScreen width={w} rows={budget.body + budget.teach} color={color} page={s.helpPage} scroll={s.helpScroll} />;
  else if (s.view === 'sweep')
    body = (
      <SweepView
        width={w}
        rows={budget.body}
        now={s.sweep}
        before={s.sweepBaseline}
        band={s.sweepPlan.band}
        plan={{
          from: s.sweepPlan.rpms[0] ?? 0,
          to: s.sweepPlan.rpms[s.sweepPlan.rpms.length - 1] ?? 0,
          count: s.sweepPlan.rpms.length,
        }}
        currentRpm={rpm}
        status={s.sweepStatus}
        stale={sweepIsStale(s)}
        measured={s.measured && session.measured?.dyno ? { points: session.measured.dyno.points, label: `dyno ${basename(session.measured.dyno.file)}` } : undefined}
        color={color}
      />
    );
  else if (s.view === 'case')
    body = (
      <CasePanel
        width={w}
        rows={budget.body}
        name={session.name}
        file={session.file}
        savedAs={s.savedAs ? { path: s.savedAs.path, changedSince: JSON.stringify(s.savedAs.edits) !== JSON.stringify(s.edits) } : undefined}
        fields={s.fields}
        values={s.values}
        baseValues={compared?.values}
        selected={s.selected}
        editing={s.editing}
        cursor={s.cursor}
        running={s.running}
        result={point?.result}
        baseline={compared?.result}
        baselineLabel={compared ? baselineLabel(s) : undefined}
        pins={s.pins.map((p, k) => ({
          name: `pin ${pinLetter(k)}`,
          eta: p.result.volumetricEfficiency,
          differs: whatDiffers(s.fields, s.values, p.values, s.units),
          compared: s.compare === k + 1,
        }))}
        canUndo={s.history.length > 0}
        save={s.save}
        units={u}
        color={color}
      />
    );
  else if (!point)
    body = <Waiting width={w} rows={budget.body} text={s.runError ? `The point did not run: ${s.runError}` : 'Running the first point…'} color={color} />;
  else if (s.view === 'runner')
    body = (
      <RunnerView
        width={w}
        rows={budget.body}
        crank={s.crank}
        from={from}
        span={span}
        map={shownPipeMap(point, s.pipeIndex)}
        events={point.result.events}
        runnerLength={point.result.runnerLength}
        upstream={point.upstream}
        pipe={shownPipe(point, s.pipeIndex)}
        roundTripDeg={point.pulse?.roundTripDeg}
        rpm={point.result.rpm}
        valvePressure={point.result.trace.valvePressure}
        units={u}
        color={color}
      />
    );
  else
    body = (
      <ValveView
        width={w}
        rows={budget.body}
        crank={s.crank}
        from={from}
        span={span}
        now={point.result.trace}
        before={compared?.result.trace}
        delivered={{ now: deliveredSinceIvo(point.result), before: compared ? deliveredSinceIvo(compared.result) : undefined }}
        large={s.bigChart}
        reference={point.ambient}
        exhaustPort={point.result.pipes.some((p) => p.role === 'exhaust') ? point.result.trace.exhaustPortPressure : undefined}
        events={point.result.events}
        verdict={point.pulse?.verdict}
        openingNote={point.pulse?.openingNote}
        measured={s.measured ? valveMeasured(session, point) : undefined}
        units={u}
        color={color}
      />
    );

  const teachLines =
    budget.teach > 0
      ? point
        ? wrapWords(
            teachingLine({
              crank: s.crank,
              lift: point.result.trace.lift[s.crank] ?? 0,
              exhaustLift: point.result.trace.exhaustLift[s.crank] ?? 0,
              valvePressure: point.result.trace.valvePressure[s.crank] ?? point.ambient,
              valveFlow: point.result.trace.valveFlow[s.crank] ?? 0,
              reference: point.ambient,
              events: point.result.events,
            }, u),
            w,
            budget.teach,
          )
        : []
      : [];
  while (teachLines.length < budget.teach) teachLines.push(' '.repeat(w));

  return (
    <Box flexDirection="column" width={w}>
      <Lines lines={[header]} color={color} bold />
      {body}
      {teachLines.length > 0 ? <Lines lines={teachLines} color={color} tone="green" /> : null}
      <Lines lines={[statusLine(s, w)]} color={color} tone={s.message?.tone === 'error' ? 'red' : undefined} />
      <Lines lines={[keyHints(s.view, w, s.playing)]} color={color} dim />
    </Box>
  );
}

/** The measured data the Valve view draws: the case's trace (with the model at its sensor) and intake lift log. */
export function valveMeasured(session: CaseSession, point: PointShown): ValveMeasured | undefined {
  const m = session.measured;
  if (!m || (!m.trace && !m.lift)) return undefined;
  return {
    ...(m.trace && point.traceCheck ? { trace: { pressure: m.trace.byDegree, model: point.traceCheck.model, sensorAt: m.trace.sensorAt }, verdict: point.traceCheck.verdict } : {}),
    ...(m.lift ? { lift: m.lift } : {}),
  };
}

/** The map of the pipe the Runner view shows (the runner when the case has no other). */
function shownPipeMap(point: PointShown, index: number): { x: ArrayLike<number>; pressure: ArrayLike<number>; ambient: number } {
  const m = point.result.pipes[index] ?? point.result.runnerMap;
  return { x: m.x, pressure: m.pressure, ambient: point.ambient };
}

/** The words for the ends of the pipe shown, drawn with the engine end at the top. */
export function shownPipe(point: PointShown, index: number): PipeShown | undefined {
  const pipes = point.result.pipes;
  const m = pipes[index];
  if (!m || pipes.length <= 1) return undefined;
  const base = { name: m.name, length: m.length, index, count: pipes.length };
  switch (m.role) {
    case 'runner':
      return { ...base, top: 'valve', bottom: point.upstream === 'plenum' ? 'plenum' : 'open', startOnTop: false };
    case 'snorkel':
      return { ...base, top: 'airbox', bottom: 'ambient', startOnTop: false };
    case 'exhaust':
      return { ...base, top: 'valve', bottom: 'outlet', startOnTop: true };
    case 'resonator':
      return { ...base, top: 'runner', bottom: m.end === 'cavity' ? 'cavity' : 'closed', startOnTop: true };
  }
}

/** |mass imbalance| per cycle above which the status line warns [-] (analysis/mass-balance.ts) */
export const MASS_WARNING = MASS_IMBALANCE_LIMIT;

export function statusLine(s: UiState, w: number): string {
  if (s.message) return fit(s.message.text, w);
  const r = s.point?.result;
  const b = shownBaseline(s)?.result;
  const parts: string[] = [];
  if (s.running) parts.push(`Running ${s.values['rpm'] ?? ''} rpm… (keys keep working)`);
  if (r) {
    parts.push(`ηv ${etaPct(r.volumetricEfficiency)}`);
    if (b) {
      parts.push(`${baselineName(s)} ${etaPct(b.volumetricEfficiency)} (${etaPoints(r.volumetricEfficiency, b.volumetricEfficiency)})`);
    }
    parts.push(`trapped ${unitsOf(s.units).text('mass', r.trappedMass)}`);
    parts.push(r.converged ? `${r.cycles} cycles` : `NOT converged in ${r.cycles} cycles`);
    // the solver's own mass balance: above 0.5 % the figures are suspect
    if (!massBalanceOk(r.massImbalance)) parts.push(`mass balance off ${fixed(r.massImbalance * 100, 1)} %!`);
  }
  if (s.playing) parts.push(`playing ${playRate(s)}°/s`);
  return joinFit(parts, w, ' · ');
}
