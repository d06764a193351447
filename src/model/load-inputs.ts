/** Loads a program set and a noise model together, as every command that runs a network does. */
import { crossCheck } from './cross-check.js';
import { InputError, InputErrors } from './errors.js';
import { sortErrors } from './file-ctx.js';
import { idealNoise, loadNoiseParts } from './load-noise.js';
import { loadProgramSet } from './load-program.js';
import type { NoiseModel, ProgramSet } from './types.js';

export interface InputFiles {
  readonly netFile: string;
  readonly netText: string;
  readonly noiseFile?: string;
  readonly noiseText?: string;
  /** Overrides the noise file's seed (the CLI's --seed). */
  readonly seed?: number;
}

/** Loads the program set and the noise model (ideal when none is given) and cross-checks them. */
export function loadInputs(opts: InputFiles): { programSet: ProgramSet; noise: NoiseModel } {
  const problems: InputError[] = [];
  const attempt = <T>(load: () => T): T | undefined => {
    try {
      return load();
    } catch (err) {
      if (err instanceof InputErrors) problems.push(...err.errors);
      else if (err instanceof InputError) problems.push(err);
      else throw err;
      return undefined;
    }
  };
  // Both files are checked before giving up, so one run reports the problems of each.
  const programSet = attempt(() => loadProgramSet(opts.netFile, opts.netText));
  let loaded: NoiseModel | undefined;
  if (opts.noiseText === undefined) loaded = idealNoise(opts.seed ?? 1);
  else {
    const parts = attempt(() => loadNoiseParts(opts.noiseFile ?? 'noise.yaml', opts.noiseText as string));
    if (parts) {
      problems.push(...parts.errors);
      loaded = parts.model;
    }
  }
  // the valid parts of a noise file are checked against the network too, in the same pass;
  // a program set with errors is no reference to check against
  if (programSet && loaded) attempt(() => crossCheck(programSet, loaded));
  if (problems.length > 0 || !programSet || !loaded) {
    // the program set's errors first, then the noise model's, each in file order
    const net = problems.filter((e) => e.file === opts.netFile);
    throw new InputErrors([...sortErrors(net), ...sortErrors(problems.filter((e) => e.file !== opts.netFile))]);
  }
  const noise = opts.seed === undefined ? loaded : { ...loaded, seed: opts.seed };
  return { programSet, noise };
}
