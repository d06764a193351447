/** `check` for the library and for `bellstep check`: the static analysis of validated inputs, no simulation. */
import { lint, type Finding } from '../model/index.js';
import { loaded, type Inputs } from './inputs.js';

export type { Finding } from '../model/index.js';

/** The findings of `bellstep check` for validated inputs, in file order: rules that cannot work as written. */
export function check(inputs: Inputs): Finding[] {
  const { programSet, noise } = loaded(inputs);
  // the noise model tells how long gates take, which decides whether a rule that consumes nothing loops at once
  return lint(programSet, noise);
}
