/**
 * Validated inputs for the library (docs/format.md1): a program set and a noise model loaded
 * and checked once, then handed to `check`, `run`, `sweep` and `openSession`. What they
 * hold inside stays inside: a caller sees the file names, the title, the sites and the seed.
 */
import { readInputFile, realFiles, type InputKind } from './files.js';
import { InputError } from '../model/errors.js';
import { loadInputs } from '../model/index.js';
import type { NoiseModel, ProgramSet } from '../model/types.js';

/** Inputs ready to run, from `load` or `loadText`. */
export interface Inputs {
  readonly programSet: {
    /** The file name it was loaded under. */
    readonly file: string;
    readonly title: string;
    /** The sites (node ids), as the file lists them. */
    readonly sites: readonly string[];
  };
  readonly noise: {
    /** The noise model's file name; null for the ideal model used when none is given. */
    readonly file: string | null;
    /** The seed a run uses unless it is given another. */
    readonly seed: number;
  };
}

/** The loaded model behind each Inputs value. */
interface Loaded {
  readonly programSet: ProgramSet;
  readonly noise: NoiseModel;
}

const LOADED = new WeakMap<Inputs, Loaded>();

/** Wraps a loaded program set and noise model as Inputs (for the CLI and replays, which load their own). */
export function inputsOf(programSet: ProgramSet, noise: NoiseModel): Inputs {
  const inputs: Inputs = Object.freeze({
    programSet: Object.freeze({ file: programSet.file, title: programSet.title, sites: Object.freeze(programSet.nodes.map((n) => n.id)) }),
    noise: Object.freeze({ file: noise.file ? noise.file : null, seed: noise.seed }),
  });
  LOADED.set(inputs, { programSet, noise });
  return inputs;
}

/** The model behind Inputs; anything else is a usage error. */
export function loaded(inputs: Inputs): Loaded {
  const l = typeof inputs === 'object' && inputs !== null ? LOADED.get(inputs) : undefined;
  if (!l) throw new InputError({ code: 'usage', field: 'inputs', message: 'not inputs made by load or loadText', fix: 'pass what load(...) or loadText(...) returned' });
  return l;
}

/** Options of `loadText`: the texts, and the names that messages give the files. */
export interface TextInputs {
  /** The program set's YAML text. */
  readonly programSet: string;
  /** The noise model's YAML text; the ideal model when left out. */
  readonly noise?: string;
  /** The name messages give the program set (default `program-set.net.yaml`). */
  readonly programSetFile?: string;
  /** The name messages give the noise model (default `noise.noise.yaml`). */
  readonly noiseFile?: string;
}

/** Validates a program set and noise model given as text; throws an InputError listing every problem. */
export function loadText(texts: TextInputs): Inputs {
  if (typeof texts?.programSet !== 'string') {
    throw new InputError({ code: 'usage', field: 'programSet', message: 'loadText needs the program set as text', fix: "call loadText({programSet: text}) with the file's YAML" });
  }
  if (texts.noise !== undefined && typeof texts.noise !== 'string') {
    throw new InputError({ code: 'usage', field: 'noise', message: 'the noise model must be text', fix: "pass the noise model's YAML, or leave it out for the ideal model" });
  }
  const netFile = texts.programSetFile ?? 'program-set.net.yaml';
  const noiseFile = texts.noise === undefined ? undefined : (texts.noiseFile ?? 'noise.noise.yaml');
  const { programSet, noise } = loadInputs({ netFile, netText: texts.programSet, noiseFile, noiseText: texts.noise });
  return inputsOf(programSet, noise);
}

/** Reads an input file for the library with the CLI's checks (a regular file within its size). */
function readFile(path: string, what: InputKind): string {
  return readInputFile(realFiles, path, what);
}

/** Options of `load`. */
export interface LoadOptions {
  /** Path of the noise model; the ideal model when left out. */
  readonly noise?: string;
}

/** Reads and validates a program set file (and a noise model file); throws an InputError listing every problem. */
export function load(programSetPath: string, opts: LoadOptions = {}): Inputs {
  if (typeof programSetPath !== 'string') {
    throw new InputError({ code: 'usage', field: 'programSetPath', message: 'load needs the path of a program set', fix: "call load('network.net.yaml', {noise: 'network.noise.yaml'})" });
  }
  const programSet = readFile(programSetPath, 'program set');
  const noise = opts.noise === undefined ? undefined : readFile(opts.noise, 'noise model');
  return loadText({ programSet, noise, programSetFile: programSetPath, noiseFile: opts.noise });
}
