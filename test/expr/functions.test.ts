import { describe, expect, it } from 'vitest';
import { baseFunctions, evaluate, ExprError, makeScope, parseExpr, type Value } from '../../src/expr/index.js';

const scope = makeScope({ bits: [1, 0, 1], t: true, f: false });
const run = (src: string): Value => evaluate(parseExpr(src), scope);
const detail = (src: string): string => {
  try {
    run(src);
  } catch (e) {
    if (e instanceof ExprError) return e.detail;
    throw e;
  }
  throw new Error(`expected ${src} to fail`);
};

describe('baseFunctions', () => {
  it('offers exactly the documented functions', () => {
    expect(Object.keys(baseFunctions).sort()).toEqual(['abs', 'floor', 'max', 'min', 'round', 'xor']);
  });

  it('xor takes bits or booleans and gives 0/1', () => {
    const inputs: [string, boolean][] = [['0', false], ['1', true], ['f', false], ['t', true]];
    for (const [a, av] of inputs) {
      for (const [b, bv] of inputs) {
        // Truth table of exclusive or (common practice).
        expect(run(`xor(${a}, ${b})`), `xor(${a}, ${b})`).toBe(av !== bv ? 1 : 0);
      }
    }
    expect(detail('xor(2, 0)')).toBe('xor needs bits (0/1) or true/false, got number 2 in `xor(2, 0)`');
    expect(detail('xor(1)')).toBe('xor() takes 2 arguments, got 1: write xor(a, b)');
  });

  it('min and max take numbers, or one array of numbers', () => {
    expect(run('min(3, -1, 2)')).toBe(-1);
    expect(run('max(3, -1, 2)')).toBe(3);
    expect(run('min(bits)')).toBe(0);
    expect(run('max(0.25)')).toBe(0.25);
    expect(detail('min()')).toBe('min() takes at least 1 argument, got 0: write min(x, more...)');
    expect(detail('max(1, "2")')).toBe('max needs numbers, got string "2" in `max(1, "2")`');
  });

  it('abs, floor and round take one number', () => {
    expect(run('abs(-2.5)')).toBe(2.5);
    expect(run('floor(-2.5)')).toBe(-3);
    expect(run('floor(2.9)')).toBe(2);
    expect(run('round(2.5)')).toBe(3);
    expect(run('round(-2.5)')).toBe(-3);
    expect(run('round(2.4)')).toBe(2);
    expect(run('round(-0.4)')).toBe(0);
    expect(detail('abs(1, 2)')).toBe('abs() takes 1 argument, got 2: write abs(x)');
    expect(detail('round(t)')).toBe('round needs numbers, got true in `round(t)`');
  });
});
