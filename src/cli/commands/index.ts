/** Every CLI command, in the order `--help` lists them. */
import type { CommandSpec } from '../spec.js';
import { runCommand } from './run.js';
import { replayCommand } from './replay.js';
import { checkCommand } from './check.js';
import { schemaCommand } from './schema.js';

export const COMMANDS: CommandSpec[] = [runCommand, replayCommand, checkCommand, schemaCommand];
