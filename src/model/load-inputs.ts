/** Loads a program set and a noise model together, as every command that runs a network does. */
import { crossCheck } from './cross-check.js';
import { InputError, InputErrors } from './errors.js';
import { idealNoise, loadNoiseModel } from './load-noise.js';
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
  const loaded =
    opts.noiseText === undefined ? idealNoise(opts.seed ?? 1) : attempt(() => loadNoiseModel(opts.noiseFile ?? 'noise.yaml', opts.noiseText as string));
  if (problems.length > 0 || !programSet || !loaded) throw new InputErrors(problems);
  const noise = opts.seed === undefined ? loaded : { ...loaded, seed: opts.seed };
  crossCheck(programSet, noise);
  return { programSet, noise };
}
