/** `openSession` for the library and for `bellstep debug`: the stepping session the debugger drives. */
import { Engine } from '../engine/index.js';
import { Session, type SessionOptions as SessionCoreOptions } from '../session/session.js';
import { loaded, type Inputs } from './inputs.js';
import { seedOption } from './options.js';

/** Options of `openSession`. */
export interface SessionOptions {
  /** The seed (default: the noise model's). */
  readonly seed?: number;
}

/** How the debugger opens a session: also the bounds of its history, a continue's limit and the clock its slices are timed by. */
export type DebugSessionOptions = SessionCoreOptions;

/** A session on validated inputs with the debugger's settings. */
export function openSessionWith(inputs: Inputs, opts: DebugSessionOptions = {}): Session {
  const { programSet, noise } = loaded(inputs);
  return new Session(new Engine(programSet, noise), { ...opts, seed: opts.seed ?? noise.seed });
}

/**
 * Opens a stepping session at the start of a run: step, back, go to an event or a time,
 * breakpoints and watches, explanations of waiting rules, and what the panes show.
 */
export function openSession(inputs: Inputs, opts: SessionOptions = {}): Session {
  return openSessionWith(inputs, { seed: seedOption(opts.seed) });
}
