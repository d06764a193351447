/** Every CLI command, in the order `--help` lists them. */
import type { CommandSpec } from '../spec.js';
import { runCommand } from './run.js';
import { replayCommand } from './replay.js';
import { checkCommand } from './check.js';
import { schemaCommand } from './schema.js';
import { debugCommand } from './debug.js';
import { demoCommand } from './demo.js';
import { sweepCommand } from './sweep.js';
import { mergeCommand } from './merge.js';
import { chartCommand } from './chart.js';
import { diffCommand } from './diff.js';

export const COMMANDS: CommandSpec[] = [debugCommand, runCommand, replayCommand, checkCommand, sweepCommand, mergeCommand, chartCommand, diffCommand, schemaCommand, demoCommand];
