/** Reading the input files and parsing the flags that several commands share. */
import { InputError } from '../model/errors.js';
import { parseDuration } from '../model/units.js';
import { readInputFile, type InputKind } from '../api/files.js';
import { loadText, type Inputs } from '../api/inputs.js';
import type { CliIo } from './io.js';

export { INPUT_LIMITS, mebibytes, type InputKind } from '../api/files.js';

/**
 * Reads an input file. It must be a regular file within the size of its kind: a directory,
 * a device, a pipe or a file that is too large is an input error before anything is read.
 */
export function readInput(io: CliIo, path: string, what: InputKind): string {
  return readInputFile(io, path, what);
}

/** Parses `--seed`: a non-negative integer. */
export function parseSeed(v: unknown): number | undefined {
  if (v === undefined) return undefined;
  const s = String(v).trim();
  if (!/^[0-9]+$/.test(s) || !Number.isSafeInteger(Number(s))) {
    throw new InputError({ code: 'usage', field: '--seed', message: `expected a non-negative integer, got "${s}"`, fix: 'write e.g. --seed 7' });
  }
  return Number(s);
}

/** Parses a duration flag such as `--until 60ms`. */
export function parseDurationFlag(v: unknown, flag: string): number | undefined {
  if (v === undefined) return undefined;
  try {
    return parseDuration(String(v));
  } catch (e) {
    if (e instanceof InputError) throw new InputError({ code: 'usage', field: flag, message: e.message, fix: e.fix ?? `write e.g. ${flag} 60ms` });
    throw e;
  }
}

/** Parses a count flag such as `--events 5000`. */
export function parseCount(v: unknown, flag: string): number | undefined {
  if (v === undefined) return undefined;
  const s = String(v).trim();
  if (!/^[0-9]+$/.test(s) || Number(s) < 1 || !Number.isSafeInteger(Number(s))) {
    throw new InputError({ code: 'usage', field: flag, message: `expected a positive integer, got "${s}"`, fix: `write e.g. ${flag} 1000` });
  }
  return Number(s);
}

/** Reads the program set and the optional noise model through the CLI's file access and validates them as the library does. */
export function readInputs(io: CliIo, netPath: string, noisePath: string | undefined): Inputs {
  const programSet = readInput(io, netPath, 'program set');
  const noise = noisePath === undefined ? undefined : readInput(io, noisePath, 'noise model');
  return loadText({ programSet, noise, programSetFile: netPath, noiseFile: noisePath });
}

/** Collects a repeatable flag's values. */
export function many(v: unknown): string[] {
  if (v === undefined) return [];
  return Array.isArray(v) ? v.map(String) : [String(v)];
}

/** Parses an event index flag such as `--from 12`: a whole number, 0 or more. */
export function parseIndex(v: unknown, flag: string): number | undefined {
  if (v === undefined) return undefined;
  const s = String(v).trim();
  if (!/^[0-9]+$/.test(s) || !Number.isSafeInteger(Number(s))) {
    throw new InputError({ code: 'usage', field: flag, message: `expected an event index (0 or more), got "${s}"`, fix: `write e.g. ${flag} 12` });
  }
  return Number(s);
}
