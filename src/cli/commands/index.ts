/** Every CLI command, in the order `--help` lists them. */
import type { CommandSpec } from '../spec.js';

export const COMMANDS: CommandSpec[] = [];
