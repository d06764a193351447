/** Closures for the unary and binary operators, with the language's strict typing. */
import { evalError, snippet } from './errors.js';
import type { ExprNode, Scope, Value } from './types.js';
import { describeValue, valuesEqual } from './values.js';

/** A compiled sub-expression. */
export type Run = (scope: Scope) => Value;

type Unary = Extract<ExprNode, { type: 'unary' }>;
type Binary = Extract<ExprNode, { type: 'binary' }>;

/**
 * Reads a value as a truth value: booleans, and the bits 0 and 1 that measurements produce.
 * Anything else is an error rather than JavaScript's loose truthiness.
 */
export function truth(v: Value, source: string, node: ExprNode, what: string): boolean {
  if (v === true || v === false) return v;
  if (v === 0) return false;
  if (v === 1) return true;
  throw evalError(source, node, `${what} needs true/false (or a bit 0/1), got ${describeValue(v)} from \`${snippet(source, node.start, node.end)}\``);
}

/** Closure for `- + !`. */
export function compileUnary(node: Unary, arg: Run, source: string): Run {
  const fail = (v: Value): never => {
    throw evalError(source, node, `"${node.op}" needs a number, got ${describeValue(v)} in \`${snippet(source, node.start, node.end)}\``);
  };
  switch (node.op) {
    case '-':
      return (s) => {
        const v = arg(s);
        return typeof v === 'number' ? -v : fail(v);
      };
    case '+':
      return (s) => {
        const v = arg(s);
        return typeof v === 'number' ? v : fail(v);
      };
    case '!': {
      const a = node.argument;
      return (s) => !truth(arg(s), source, a, '"!"');
    }
  }
}

/** Closure for a binary operator; `&&` and `||` evaluate their right side only when needed. */
export function compileBinary(node: Binary, l: Run, r: Run, source: string): Run {
  const text = (): string => snippet(source, node.start, node.end);
  const mismatch = (a: Value, b: Value, wanted: string): never => {
    throw evalError(source, node, `"${node.op}" needs ${wanted}, got ${describeValue(a)} and ${describeValue(b)} in \`${text()}\``);
  };
  const divisionByZero = (): never => {
    throw evalError(source, node, `division by zero in \`${text()}\``);
  };
  // Each operator gets its own closure body rather than a shared one calling a small
  // function, so that V8 sees one target per call site and can inline the arithmetic.
  switch (node.op) {
    case '+':
      return (s) => {
        const a = l(s);
        const b = r(s);
        if (typeof a === 'number' && typeof b === 'number') return a + b;
        if (typeof a === 'string' && typeof b === 'string') return a + b;
        return mismatch(a, b, 'two numbers or two strings');
      };
    case '-':
      return (s) => {
        const a = l(s);
        const b = r(s);
        return typeof a === 'number' && typeof b === 'number' ? a - b : mismatch(a, b, 'two numbers');
      };
    case '*':
      return (s) => {
        const a = l(s);
        const b = r(s);
        return typeof a === 'number' && typeof b === 'number' ? a * b : mismatch(a, b, 'two numbers');
      };
    case '/':
      return (s) => {
        const a = l(s);
        const b = r(s);
        if (typeof a !== 'number' || typeof b !== 'number') return mismatch(a, b, 'two numbers');
        return b === 0 ? divisionByZero() : a / b;
      };
    case '%':
      return (s) => {
        const a = l(s);
        const b = r(s);
        if (typeof a !== 'number' || typeof b !== 'number') return mismatch(a, b, 'two numbers');
        return b === 0 ? divisionByZero() : a % b;
      };
    // The casts only satisfy the checker: two strings compare the same way at run time.
    case '<':
      return (s) => {
        const a = l(s);
        const b = r(s);
        return ordered(a, b) ? (a as number) < (b as number) : mismatch(a, b, 'two numbers or two strings');
      };
    case '<=':
      return (s) => {
        const a = l(s);
        const b = r(s);
        return ordered(a, b) ? (a as number) <= (b as number) : mismatch(a, b, 'two numbers or two strings');
      };
    case '>':
      return (s) => {
        const a = l(s);
        const b = r(s);
        return ordered(a, b) ? (a as number) > (b as number) : mismatch(a, b, 'two numbers or two strings');
      };
    case '>=':
      return (s) => {
        const a = l(s);
        const b = r(s);
        return ordered(a, b) ? (a as number) >= (b as number) : mismatch(a, b, 'two numbers or two strings');
      };
    case '==':
    case '!=': {
      const negate = node.op === '!=';
      // Against a primitive literal, structural equality is plain identity.
      const { left, right } = node;
      const literal = right.type === 'literal' ? right : left.type === 'literal' ? left : undefined;
      if (literal !== undefined) {
        const other = literal === right ? l : r;
        const v = literal.value;
        return negate ? (s) => other(s) !== v : (s) => other(s) === v;
      }
      return negate ? (s) => !equal(l(s), r(s)) : (s) => equal(l(s), r(s));
    }
    case '&&': {
      const { left, right } = node;
      return (s) => truth(l(s), source, left, '"&&"') && truth(r(s), source, right, '"&&"');
    }
    case '||': {
      const { left, right } = node;
      return (s) => truth(l(s), source, left, '"||"') || truth(r(s), source, right, '"||"');
    }
  }
}

/** Whether `<` and friends may compare these: two numbers or two strings. */
function ordered(a: Value, b: Value): boolean {
  return (typeof a === 'number' && typeof b === 'number') || (typeof a === 'string' && typeof b === 'string');
}

function equal(a: Value, b: Value): boolean {
  return a === b || (typeof a === 'object' && typeof b === 'object' && valuesEqual(a, b));
}

