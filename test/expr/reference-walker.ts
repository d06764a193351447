/**
 * A plain tree-walking evaluator written from the language rules (docs/expressions.md and the
 * expr brief), independently of src/expr/compile*.ts. Tests use it as an oracle for the
 * closure compiler, and the benchmark as the baseline the compiler must beat.
 */
import type { ExprNode, Scope, Value } from '../../src/expr/types.js';

/** Where the walker found an evaluation error. */
export class WalkerError extends Error {
  constructor(
    readonly offset: number,
    readonly length: number,
    why: string,
  ) {
    super(why);
  }
}

const fail = (n: ExprNode, why: string): never => {
  throw new WalkerError(n.start, n.end - n.start, why);
};

function bool(v: Value, n: ExprNode): boolean {
  if (typeof v === 'boolean') return v;
  if (v === 0 || v === 1) return v === 1;
  return fail(n, 'not a truth value');
}

function same(a: Value, b: Value): boolean {
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => same(x, b[i]));
  if (Array.isArray(a) || Array.isArray(b)) return false;
  if (a !== null && b !== null && typeof a === 'object' && typeof b === 'object') {
    const ra = a as { readonly [k: string]: Value };
    const rb = b as { readonly [k: string]: Value };
    const ka = Object.keys(ra);
    return ka.length === Object.keys(rb).length && ka.every((k) => Object.prototype.hasOwnProperty.call(rb, k) && same(ra[k], rb[k]));
  }
  return a === b;
}

/** Evaluates a tree directly. Throws WalkerError at the node the rules blame. */
export function walk(n: ExprNode, scope: Scope): Value {
  switch (n.type) {
    case 'literal':
      return n.value;
    case 'name': {
      const v = scope.lookup(n.name);
      return v === undefined || typeof v === 'function' ? fail(n, 'unknown name') : v;
    }
    case 'member': {
      const o = walk(n.object, scope);
      if (o === null || typeof o !== 'object' || Array.isArray(o)) return fail(n, 'not a record');
      const rec = o as { readonly [k: string]: Value };
      if (!Object.prototype.hasOwnProperty.call(rec, n.property)) return fail(n, 'no field');
      return rec[n.property];
    }
    case 'index': {
      const o = walk(n.object, scope);
      const i = walk(n.index, scope);
      if (!Array.isArray(o)) return fail(n, 'not an array');
      if (typeof i !== 'number' || Math.floor(i) !== i) return fail(n.index, 'bad index');
      if (i < 0 || i >= o.length) return fail(n.index, 'out of range');
      return o[i] as Value;
    }
    case 'unary': {
      const v = walk(n.argument, scope);
      if (n.op === '!') return !bool(v, n.argument);
      if (typeof v !== 'number') return fail(n, 'not a number');
      return n.op === '-' ? -v : v;
    }
    case 'conditional':
      return bool(walk(n.test, scope), n.test) ? walk(n.consequent, scope) : walk(n.alternate, scope);
    case 'call': {
      const f = Object.prototype.hasOwnProperty.call(scope.functions, n.callee) ? scope.functions[n.callee] : undefined;
      if (typeof f !== 'function') return fail(n, 'unknown function');
      const args = n.args.map((a) => walk(a, scope));
      try {
        return f(args);
      } catch {
        return fail(n, 'function failed');
      }
    }
    case 'binary':
      return binary(n, scope);
  }
}

function binary(n: Extract<ExprNode, { type: 'binary' }>, scope: Scope): Value {
  if (n.op === '&&') return bool(walk(n.left, scope), n.left) ? bool(walk(n.right, scope), n.right) : false;
  if (n.op === '||') return bool(walk(n.left, scope), n.left) ? true : bool(walk(n.right, scope), n.right);
  const a = walk(n.left, scope);
  const b = walk(n.right, scope);
  if (n.op === '==') return same(a, b);
  if (n.op === '!=') return !same(a, b);
  const nums = typeof a === 'number' && typeof b === 'number';
  const strs = typeof a === 'string' && typeof b === 'string';
  if (n.op === '+') {
    if (nums) return a + b;
    if (strs) return a + b;
    return fail(n, 'bad +');
  }
  if (n.op === '<' || n.op === '<=' || n.op === '>' || n.op === '>=') {
    if (!nums && !strs) return fail(n, 'bad comparison');
    const x = a as number | string;
    const y = b as number | string;
    if (n.op === '<') return x < y;
    if (n.op === '<=') return x <= y;
    if (n.op === '>') return x > y;
    return x >= y;
  }
  if (!nums) return fail(n, 'not numbers');
  if (n.op === '-') return a - b;
  if (n.op === '*') return a * b;
  if (b === 0) return fail(n, 'division by zero');
  return n.op === '/' ? a / b : a % b;
}
