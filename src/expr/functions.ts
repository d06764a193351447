/** The functions every scope can offer: bits, extremes and rounding. */
import type { ExprFunction, Value } from './types.js';
import { describeValue } from './values.js';

function bit(name: string, v: Value): number {
  if (v === 0 || v === false) return 0;
  if (v === 1 || v === true) return 1;
  throw new Error(`${name} needs bits (0/1) or true/false, got ${describeValue(v)}`);
}

function number(name: string, v: Value): number {
  if (typeof v !== 'number') throw new Error(`${name} needs numbers, got ${describeValue(v)}`);
  return v;
}

/** The least or greatest of numbers given as arguments, or as one array argument (`min(bell(p))`). */
function extreme(name: string, args: readonly Value[], pick: (a: number, b: number) => number): number {
  const list = args.length === 1 && Array.isArray(args[0]) ? (args[0] as readonly Value[]) : args;
  if (list.length === 0) throw new Error(`${name} needs at least one number`);
  let best = number(name, list[0]);
  for (let i = 1; i < list.length; i++) best = pick(best, number(name, list[i]));
  return best;
}

// the number of arguments is checked against the table of functions (library.ts) before a call
const one = (name: string, f: (x: number) => number): ExprFunction => (args) => f(number(name, args[0]));

/** `xor(a, b)`, `min(...)`, `max(...)`, `abs(x)`, `floor(x)`, `round(x)`; the engine and session add their own. */
export const baseFunctions: Readonly<Record<string, ExprFunction>> = Object.freeze({
  xor: (args: readonly Value[]) => bit('xor', args[0]) ^ bit('xor', args[1]),
  min: (args: readonly Value[]) => extreme('min', args, Math.min),
  max: (args: readonly Value[]) => extreme('max', args, Math.max),
  abs: one('abs', Math.abs),
  floor: one('floor', Math.floor),
  // Halves round away from zero (round(-2.5) is -3), unlike Math.round; no -0 results.
  round: one('round', (x) => {
    const r = Math.sign(x) * Math.round(Math.abs(x));
    return r === 0 ? 0 : r;
  }),
});
