/**
 * The views: display-only components. Each takes plain numbers and arrays,
 * draws its lines with a pure function (valve-screen.ts, runner-screen.ts,
 * sweep-screen.ts, case-screen.ts, frame-screen.ts) and renders them.
 */
import React from 'react';
import { Lines } from './lines.js';
import { CHART_PALETTE, MAP_PALETTE } from './palette.js';
import { valveScreen, type ValveScreenInput } from './valve-screen.js';
import { runnerScreen, type RunnerScreenInput } from './runner-screen.js';
import { sweepScreen, type SweepScreenInput } from './sweep-screen.js';
import { caseScreen, type CaseScreenInput } from './case-screen.js';
import { glossaryPage, helpLines, tooSmallLines } from './frame-screen.js';

type WithColor<T> = T & { color: boolean };

export function ValveView(p: WithColor<ValveScreenInput>): React.JSX.Element {
  return <Lines lines={valveScreen(p)} color={p.color} palette={CHART_PALETTE} />;
}

export function RunnerView(p: WithColor<RunnerScreenInput>): React.JSX.Element {
  return <Lines lines={runnerScreen(p)} color={p.color} palette={MAP_PALETTE} />;
}

export function SweepView(p: WithColor<SweepScreenInput>): React.JSX.Element {
  return <Lines lines={sweepScreen(p)} color={p.color} palette={CHART_PALETTE} />;
}

export function CasePanel(p: WithColor<CaseScreenInput>): React.JSX.Element {
  return <Lines lines={caseScreen(p)} color={p.color} palette={{ '▶': 'yellow', '▌': 'yellow' }} />;
}

export function HelpScreen(p: { width: number; rows: number; color: boolean; page?: 'keys' | 'words'; scroll?: number }): React.JSX.Element {
  return <Lines lines={p.page === 'words' ? glossaryPage(p.width, p.rows, p.scroll ?? 0) : helpLines(p.width, p.rows)} color={p.color} />;
}

export function TooSmall(p: { columns: number; rows: number; color: boolean }): React.JSX.Element {
  return <Lines lines={tooSmallLines(p.columns, p.rows)} color={p.color} tone="yellow" />;
}

export function Waiting(p: { width: number; rows: number; text: string; color: boolean }): React.JSX.Element {
  const lines = Array.from({ length: p.rows }, (_, k) => (k === 1 ? `  ${p.text}` : '').padEnd(p.width).slice(0, p.width));
  return <Lines lines={lines} color={p.color} />;
}
