/** Helpers for the pane tests: build a controller on a scenario and wait for a frame to show something. */
import { Session } from '../../src/session/session.js';
import { Controller, type ControllerOptions } from '../../src/tui/controller.js';
import { engineFrom } from '../engine/scenarios.js';

/** A controller over a fresh session of a scenario; long work runs at once instead of after a frame. */
export function controllerFor(net: string, noise?: string, opts: ControllerOptions = {}): Controller {
  return new Controller(new Session(engineFrom(net, noise)), { defer: (fn) => fn(), ...opts });
}

/** Polls `check` until it returns true or `ms` pass; throws with the last frame on timeout. */
export async function waitFor(check: () => boolean, frame: () => string | undefined, ms = 4000): Promise<void> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (check()) return;
    await new Promise((r) => setTimeout(r, 10));
  }
  throw new Error(`timed out; last frame:\n${frame() ?? '(none)'}`);
}

/** Keys as a terminal sends them. */
export const KEY = {
  up: '\u001B[A',
  down: '\u001B[B',
  right: '\u001B[C',
  left: '\u001B[D',
  shiftRight: '\u001B[1;2C',
  enter: '\r',
  tab: '\t',
  shiftTab: '\u001B[Z',
  esc: '\u001B',
  backspace: '\u007f',
} as const;
