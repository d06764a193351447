import { describe, expect, it } from 'vitest';
import { baseFunctions, evaluate, ExprError, makeScope, parseExpr, type ExprFunction, type Value } from '../../src/expr/index.js';

const bindings: Record<string, Value> = {
  m: { pair: 'mill~quay#3', bit: 1, from: 'mill', data: { z: 0, x: 1 }, none: null },
  left: { id: 'fen~mill#7', partner: 'fen', stage: 'link', age: 1500 },
  xs: [10, 20, 30],
  fen: 'fen',
  mill: 'mill',
  b0: 0,
  b1: 1,
  two: 2,
  t: true,
  f: false,
  nothing: null,
  label: 'kiln',
};
const scope = makeScope(bindings);
const run = (src: string): Value => evaluate(parseExpr(src), scope);

function evalError(src: string, s = scope): ExprError {
  try {
    evaluate(parseExpr(src), s);
  } catch (e) {
    if (e instanceof ExprError) {
      expect(e.kind).toBe('eval');
      return e;
    }
    throw e;
  }
  throw new Error(`expected ${src} to fail`);
}

describe('arithmetic', () => {
  it('computes + - * / % on numbers', () => {
    expect(run('7 + 2')).toBe(9);
    expect(run('7 - 2')).toBe(5);
    expect(run('7 * 2')).toBe(14);
    expect(run('7 / 2')).toBe(3.5);
    expect(run('7 % 2')).toBe(1);
    expect(run('-7 % 2')).toBe(-1);
    expect(run('-two')).toBe(-2);
    expect(run('+two')).toBe(2);
  });

  it('joins two strings with +', () => {
    expect(run(`label + '-' + fen`)).toBe('kiln-fen');
  });

  it('refuses mixed or non-number operands instead of converting', () => {
    expect(evalError(`label + 1`).detail).toBe('"+" needs two numbers or two strings, got string "kiln" and number 1 in `label + 1`');
    expect(evalError(`'3' * 2`).detail).toBe('"*" needs two numbers, got string "3" and number 2 in `\'3\' * 2`');
    expect(evalError(`t - 1`).detail).toBe('"-" needs two numbers, got true and number 1 in `t - 1`');
    expect(evalError(`nothing + 1`).detail).toContain('got null and number 1');
    expect(evalError(`-label`).detail).toBe('"-" needs a number, got string "kiln" in `-label`');
    expect(evalError(`+t`).detail).toBe('"+" needs a number, got true in `+t`');
  });

  it('refuses division and modulo by zero', () => {
    const d = evalError('xs[0] / (two - 2)');
    expect(d.detail).toBe('division by zero in `xs[0] / (two - 2)`');
    expect([d.offset, d.length]).toEqual([0, 'xs[0] / (two - 2)'.length]);
    expect(evalError('5 % b0').detail).toBe('division by zero in `5 % b0`');
  });
});

describe('comparison and equality', () => {
  it('orders two numbers or two strings', () => {
    expect(run('1 < 2')).toBe(true);
    expect(run('2 <= 2')).toBe(true);
    expect(run('1 > 2')).toBe(false);
    expect(run('2 >= 3')).toBe(false);
    expect(run(`'fen' < 'mill'`)).toBe(true);
    expect(run(`'b' >= 'a'`)).toBe(true);
  });

  it('refuses ordering mixed kinds', () => {
    expect(evalError(`'10' < 9`).detail).toBe('"<" needs two numbers or two strings, got string "10" and number 9 in `\'10\' < 9`');
    expect(evalError(`nothing >= 0`).detail).toContain('got null and number 0');
  });

  it('compares primitives by value without conversion', () => {
    expect(run(`m.from == mill`)).toBe(true);
    expect(run(`1 == '1'`)).toBe(false);
    expect(run(`1 != '1'`)).toBe(true);
    expect(run(`b1 == true`)).toBe(false);
    expect(run(`nothing == null`)).toBe(true);
    expect(run(`b0 == null`)).toBe(false);
    expect(run(`0.1 + 0.2 == 0.3`)).toBe(0.1 + 0.2 === 0.3);
  });

  it('compares arrays and records structurally', () => {
    const s = makeScope({ a: [1, { k: 'v' }], b: [1, { k: 'v' }], c: [1, { k: 'w' }], r: { x: 1, y: 2 }, q: { y: 2, x: 1 }, p: { x: 1 } });
    const ev = (src: string): Value => evaluate(parseExpr(src), s);
    expect(ev('a == b')).toBe(true);
    expect(ev('a == c')).toBe(false);
    expect(ev('r == q')).toBe(true);
    expect(ev('r != p')).toBe(true);
    expect(ev('a == r')).toBe(false);
  });
});

describe('logic', () => {
  it('takes booleans and the bits 0 and 1, and returns booleans', () => {
    expect(run('t && f')).toBe(false);
    expect(run('t || f')).toBe(true);
    expect(run('!f')).toBe(true);
    expect(run('b1 && t')).toBe(true);
    expect(run('b0 || b1')).toBe(true);
    expect(run('!b0')).toBe(true);
    expect(run('b1 ? "one" : "zero"')).toBe('one');
  });

  it('short-circuits && and ||', () => {
    // The right side would fail if evaluated.
    expect(run('f && missing')).toBe(false);
    expect(run('t || missing')).toBe(true);
    expect(run('b0 && 1 / 0 > 0')).toBe(false);
    expect(run('t ? 1 : missing')).toBe(1);
    expect(run('f ? missing : 2')).toBe(2);
  });

  it('refuses other values as truth values, pointing at the operand', () => {
    const e = evalError('t && two');
    expect(e.detail).toBe('"&&" needs true/false (or a bit 0/1), got number 2 from `two`');
    expect([e.offset, e.length]).toEqual([5, 3]);
    expect(evalError(`label || t`).detail).toBe('"||" needs true/false (or a bit 0/1), got string "kiln" from `label`');
    expect(evalError(`!nothing`).detail).toBe('"!" needs true/false (or a bit 0/1), got null from `nothing`');
    expect(evalError(`xs ? 1 : 2`).detail).toBe('the condition of "? :" needs true/false (or a bit 0/1), got an array from `xs`');
  });
});

describe('names, fields and indexing', () => {
  it('reads names, fields and array elements', () => {
    expect(run('m.pair')).toBe('mill~quay#3');
    expect(run('m.data.x')).toBe(1);
    expect(run('left.partner == fen')).toBe(true);
    expect(run('xs[2]')).toBe(30);
    expect(run('xs[b1 + 1]')).toBe(30);
    expect(run('m.none')).toBe(null);
  });

  it('reports an unknown name with a suggestion when one is close', () => {
    const e = evalError('fenn == fen');
    expect(e.detail).toBe('unknown name "fenn" (did you mean "fen"?)');
    expect([e.line, e.col, e.offset, e.length]).toEqual([1, 1, 0, 4]);
    expect(evalError('ridge').detail).toBe('unknown name "ridge"');
  });

  it('says when an unknown name is a function that needs parentheses', () => {
    expect(evalError('abs').detail).toBe('unknown name "abs" ("abs" is a function: write abs(...))');
  });

  it('reports a missing field, listing the available ones', () => {
    const e = evalError('t && left.partnr == fen');
    expect(e.detail).toBe('no field "partnr" in `left` (did you mean "partner"? its fields: age, id, partner, stage)');
    expect([e.offset, e.length]).toEqual([5, 'left.partnr'.length]);
    expect(evalError('makeup.x', makeScope({ makeup: {} })).detail).toBe('no field "x" in `makeup` (it has no fields)');
  });

  it('says what was null or not a record', () => {
    expect(evalError('m.none.id').detail).toBe('`m.none` is null, so it has no field "id"');
    expect(evalError('xs.length').detail).toBe('`xs` is an array, not a record, so it has no field "length"');
    expect(evalError('label.length').detail).toBe('`label` is string "kiln", not a record, so it has no field "length"');
    expect(evalError('two.x').detail).toBe('`two` is number 2, not a record, so it has no field "x"');
  });

  it('checks indexes', () => {
    expect(evalError('m[0]').detail).toBe('only arrays can be indexed, but `m` is a record (read a field of a record with ".name")');
    expect(evalError('label[0]').detail).toBe('only arrays can be indexed, but `label` is string "kiln"');
    const range = evalError('xs[3]');
    expect(range.detail).toBe('index 3 is out of range for `xs` (length 3)');
    expect([range.offset, range.length]).toEqual([3, 1]);
    expect(evalError('xs[-1]').detail).toBe('index -1 is out of range for `xs` (length 3)');
    expect(evalError('xs[0.5]').detail).toBe('an index must be a whole number, got number 0.5');
    expect(evalError('xs[label]').detail).toBe('an index must be a whole number, got string "kiln"');
  });

  it('locates errors on later lines by line and column', () => {
    const src = 'm.bit == 1 &&\n  left.age > 1000 &&\n    fenn';
    const e = evalError(src);
    expect([e.line, e.col]).toEqual([3, 5]);
    expect(e.message).toBe('unknown name "fenn" (did you mean "fen"?) at 3:5');
  });
});

describe('calls', () => {
  it('calls functions the scope provides, with evaluated arguments in order', () => {
    const seen: Value[][] = [];
    const record: ExprFunction = (args) => {
      seen.push([...args]);
      return args.length;
    };
    const s = makeScope({ p: { id: 'x' } }, { ...baseFunctions, record });
    expect(evaluate(parseExpr('record(1, p.id, "s", true, null) + record()'), s)).toBe(5);
    expect(seen).toEqual([[1, 'x', 's', true, null], []]);
  });

  it('reports an unknown function with the available ones and a suggestion', () => {
    const s = makeScope({}, { ...baseFunctions, fidelity: () => 1, delivered: () => 0 });
    expect(evalError('fidelty(p)', s).detail).toBe(
      'unknown function "fidelty"; did you mean "fidelity"? (available: abs, delivered, fidelity, floor, max, min, round, xor)',
    );
    expect(evalError('ridge()', s).detail).toBe('unknown function "ridge" (available: abs, delivered, fidelity, floor, max, min, round, xor)');
  });

  it('lists at most ten functions', () => {
    const many: Record<string, ExprFunction> = {};
    for (let i = 0; i < 14; i++) many[`f${String(i).padStart(2, '0')}`] = () => i;
    expect(evalError('g()', makeScope({}, many)).detail).toBe(
      'unknown function "g" (available: f00, f01, f02, f03, f04, f05, f06, f07, f08, f09 and 4 more)',
    );
  });

  it('turns an error thrown by a function into an ExprError at the call', () => {
    const e = evalError('1 + xor(2, 1)');
    expect(e.detail).toBe('xor needs bits (0/1) or true/false, got number 2 in `xor(2, 1)`');
    expect([e.offset, e.length]).toEqual([4, 'xor(2, 1)'.length]);
  });

  it('refuses a function result that is not a value', () => {
    const s = makeScope({}, { hollow: (() => undefined) as unknown as ExprFunction });
    expect(evalError('hollow()', s).detail).toBe('function "hollow" returned no value (undefined)');
  });
});
