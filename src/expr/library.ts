/**
 * The functions and constants of the expression language, in one table: the parser checks
 * the number of arguments against it, the evaluator too, the checkers of programs,
 * breakpoints and expectations take names and argument kinds from it, and docs/ is
 * generated from it (`npm run docs`).
 */

/** Where a function may be called. */
export type FunctionScope = 'both' | 'program' | 'debugger';

/** What an argument must be, so that a checker can test literals and names before a run. */
export type ArgKind = 'number' | 'bit' | 'pair' | 'pair-id' | 'node' | 'rule' | 'stage' | 'kind' | 'text';

export interface ParamSpec {
  readonly name: string;
  readonly kind: ArgKind;
  readonly optional?: boolean;
  /** The last parameter takes any number of values. */
  readonly rest?: boolean;
}

export interface FunctionSpec {
  readonly name: string;
  readonly params: readonly ParamSpec[];
  readonly scope: FunctionScope;
  /** What it gives, in one sentence for the reference. */
  readonly does: string;
}

const p = (name: string, kind: ArgKind, more: Partial<ParamSpec> = {}): ParamSpec => ({ name, kind, ...more });

/** Every function of the language. */
export const FUNCTIONS: readonly FunctionSpec[] = [
  { name: 'xor', params: [p('a', 'bit'), p('b', 'bit')], scope: 'both', does: 'The exclusive or of two bits (0/1 or true/false), as 0 or 1.' },
  { name: 'min', params: [p('x', 'number'), p('more', 'number', { optional: true, rest: true })], scope: 'both', does: 'The least of its numbers, or of the numbers in one list (min(bell(p))).' },
  { name: 'max', params: [p('x', 'number'), p('more', 'number', { optional: true, rest: true })], scope: 'both', does: 'The greatest of its numbers, or of the numbers in one list.' },
  { name: 'abs', params: [p('x', 'number')], scope: 'both', does: 'The absolute value.' },
  { name: 'floor', params: [p('x', 'number')], scope: 'both', does: 'The greatest whole number not above x.' },
  { name: 'round', params: [p('x', 'number')], scope: 'both', does: 'x rounded to a whole number; halves round away from zero.' },
  { name: 'join', params: [p('a', 'pair-id'), p('b', 'pair-id')], scope: 'both', does: 'The shared id of the pair that swapping pairs a and b makes; the same whichever order they come in.' },
  { name: 'age', params: [p('pair', 'pair')], scope: 'program', does: 'Nanoseconds since the pair (a bound name or a pair id) arrived at this node.' },
  { name: 'waited', params: [p('pair', 'pair')], scope: 'program', does: 'Nanoseconds since the pair entered its current stage at this node (arrival counts as entering link).' },
  { name: 'now', params: [], scope: 'program', does: "The node's local time in nanoseconds: the event's time plus the durations of the steps run so far." },
  { name: 'fidelity', params: [p('id', 'pair-id')], scope: 'debugger', does: 'The true fidelity to Φ+ of a pair held at both ends (decayed to now) or delivered.' },
  { name: 'bell', params: [p('id', 'pair-id')], scope: 'debugger', does: 'The four Bell coefficients [Φ+, Φ−, Ψ+, Ψ−] of that pair.' },
  { name: 'pairs', params: [p('node', 'node'), p('partner', 'node', { optional: true }), p('stage', 'stage', { optional: true })], scope: 'debugger', does: 'How many pairs a node holds, with a partner and in a stage if given.' },
  { name: 'inflight', params: [p('from', 'node', { optional: true }), p('to', 'node', { optional: true }), p('kind', 'kind', { optional: true })], scope: 'debugger', does: 'How many messages are on their way, from, to and of a kind if given.' },
  { name: 'delivered', params: [p('a', 'node', { optional: true }), p('b', 'node', { optional: true })], scope: 'debugger', does: 'How many pairs were delivered at both ends, with an end at a (and at b) if given.' },
  { name: 'min_fidelity_delivered', params: [], scope: 'debugger', does: 'The least fidelity of the delivered pairs; 1 while none was delivered.' },
  { name: 'fired', params: [p('node', 'node'), p('rule', 'rule')], scope: 'debugger', does: 'How many times a rule of a node has fired.' },
  { name: 'stalled', params: [], scope: 'debugger', does: 'True when no event can happen while a node still holds pairs or messages.' },
  { name: 'time', params: [], scope: 'debugger', does: 'The simulated time in nanoseconds.' },
  { name: 'event', params: [], scope: 'debugger', does: 'The number of events applied so far.' },
];

/** Named constants, read like names. */
export const CONSTANTS: readonly { readonly name: string; readonly value: number; readonly does: string }[] = [
  { name: 'pi', value: Math.PI, does: 'π, for rotation angles: rx by pi / 2.' },
];

const byName = new Map(FUNCTIONS.map((f) => [f.name, f]));

/** The function of this name, if the language has one. */
export function functionSpec(name: string): FunctionSpec | undefined {
  return byName.get(name);
}

/** The fewest and the most arguments a function takes (the most is Infinity for a rest parameter). */
export function arity(f: FunctionSpec): { min: number; max: number } {
  const min = f.params.filter((x) => !x.optional).length;
  const max = f.params.some((x) => x.rest) ? Infinity : f.params.length;
  return { min, max };
}

/** `pairs(node, partner?, stage?)`, `min(x, more...)`: how a function is called. */
export function signature(f: FunctionSpec): string {
  return `${f.name}(${f.params.map((x) => `${x.name}${x.rest ? '...' : x.optional ? '?' : ''}`).join(', ')})`;
}

/** Why `n` arguments do not suit the function, or undefined when they do. */
export function arityProblem(f: FunctionSpec, n: number): string | undefined {
  const { min, max } = arity(f);
  if (n >= min && n <= max) return undefined;
  const want = min === max ? `${min}` : max === Infinity ? `at least ${min}` : `${min} to ${max}`;
  const one = (min === max || max === Infinity) && min === 1;
  return `${f.name}() takes ${want} argument${one ? '' : 's'}, got ${n}: write ${signature(f)}`;
}

/** The names a scope may call. */
export function functionNames(scope: 'program' | 'debugger'): string[] {
  return FUNCTIONS.filter((f) => f.scope === 'both' || f.scope === scope).map((f) => f.name);
}
