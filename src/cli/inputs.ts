/** Reading the input files and parsing the flags that several commands share. */
import { InputError } from '../model/errors.js';
import { loadInputs } from '../model/index.js';
import type { NoiseModel, ProgramSet } from '../model/types.js';
import { parseDuration } from '../model/units.js';
import type { CliIo, PathKind } from './io.js';

/** The kinds of file the commands read, each with the largest size it may have (documented in docs/cli.md). */
export const INPUT_LIMITS = {
  'program set': 16 * 1024 * 1024,
  'noise model': 16 * 1024 * 1024,
  'replay file': 256 * 1024 * 1024,
  'sweep file': 64 * 1024 * 1024,
} as const;

/** A kind of input file. */
export type InputKind = keyof typeof INPUT_LIMITS;

/** `16 MiB`, `256 MiB`: a byte count as the limits are documented. */
export function mebibytes(bytes: number): string {
  return `${Math.round((bytes / 1024 / 1024) * 10) / 10} MiB`;
}

const KIND_WORDS: Partial<Record<PathKind, string>> = {
  directory: 'a directory',
  fifo: 'a named pipe (FIFO)',
  device: 'a device',
  socket: 'a socket',
  other: 'not a regular file',
};

function fileError(path: string, what: string, why: string, fix = `check the path of the ${what}`): InputError {
  return new InputError({ code: 'file', file: path, message: `cannot read the ${what}: ${why}`, fix });
}

/**
 * Reads an input file. It must be a regular file within the size of its kind: a directory,
 * a device, a pipe or a file that is too large is an input error before anything is read.
 */
export function readInput(io: CliIo, path: string, what: InputKind): string {
  const limit = INPUT_LIMITS[what];
  const info = io.stat(path);
  if (info.kind === 'missing') throw fileError(path, what, 'no such file');
  if (info.kind !== 'file') throw fileError(path, what, `${path} is ${KIND_WORDS[info.kind]}`, `give the path of a ${what} file; bellstep reads regular files only`);
  const tooLarge = () => fileError(path, what, `it is larger than ${mebibytes(limit)}, the most a ${what} may be`, `a ${what} holds at most ${mebibytes(limit)}; check that this is the right file`);
  if (info.size > limit) throw tooLarge();
  try {
    return io.readFile(path, limit);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'EFBIG') throw tooLarge();
    if (code === 'ENOTREG') throw fileError(path, what, `${path} is not a regular file`, `give the path of a ${what} file; bellstep reads regular files only`);
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : code === 'EACCES' || code === 'EPERM' ? 'permission denied' : String((e as Error).message);
    throw fileError(path, what, why);
  }
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

export interface LoadedInputs {
  readonly programSet: ProgramSet;
  readonly noise: NoiseModel;
}

/** Reads and validates the program set and the optional noise model; `--seed` overrides the file's seed. */
export function loadFiles(io: CliIo, netPath: string, noisePath: string | undefined, seed: number | undefined): LoadedInputs {
  const netText = readInput(io, netPath, 'program set');
  const noiseText = noisePath === undefined ? undefined : readInput(io, noisePath, 'noise model');
  return loadInputs({ netFile: netPath, netText, noiseFile: noisePath, noiseText, seed });
}

/** Collects a repeatable flag's values. */
export function many(v: unknown): string[] {
  if (v === undefined) return [];
  return Array.isArray(v) ? v.map(String) : [String(v)];
}
