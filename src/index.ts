/**
 * bellstep as a library: load and validate a program set and a noise model, check them,
 * run them headless, sweep them over seeds, or open a stepping session. The only public
 * surface of the package; the CLI is built on these same functions.
 */
export { load, loadText, type Inputs, type LoadOptions, type TextInputs } from './api/inputs.js';
export { check, type Finding } from './api/check.js';
export { run, type RunOptions, type RunSummary, type RunStats } from './api/run.js';
export { sweep, type SweepOptions } from './api/sweep.js';
export { openSession, type SessionOptions } from './api/session.js';
export { InputError, type InputIssue } from './model/errors.js';
export type { SweepReport } from './sweep/types.js';
export type { Session } from './session/session.js';
