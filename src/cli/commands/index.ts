/**
 * The command registry: a plain list. To add a command, write
 * src/cli/commands/<name>.ts exporting a `Command` (see ../command.ts) and
 * add it here; main.ts dispatches on `name` and lists `summary` in the help.
 */
import type { Command } from '../command.js';
import { runCommand } from './run.js';
import { checkCommand } from './check.js';
import { pipeCommand } from './pipe.js';
import { sweepCommand } from './sweep.js';
import { tuneCommand } from './tune.js';
import { compareCommand } from './compare.js';
import { mergeCommand } from './merge.js';
import { reportCommand } from './report.js';
import { flowCommand } from './flow.js';
import { calibrateCommand } from './calibrate.js';

export const commands: readonly Command[] = [runCommand, checkCommand, pipeCommand, sweepCommand, tuneCommand, mergeCommand, compareCommand, reportCommand, flowCommand, calibrateCommand];
