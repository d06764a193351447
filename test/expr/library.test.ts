/** The table of functions: the parser and evaluator check arities from it, and `pi` is a constant. */
import { describe, expect, it } from 'vitest';
import { arity, baseFunctions, compileExpr, evaluate, ExprError, FUNCTIONS, makeScope, parseExpr, signature } from '../../src/expr/index.js';
import { runCli } from '../helpers/run-cli.js';
import { SWAP_NET } from '../engine/scenarios.js';

function parseError(src: string): ExprError {
  try {
    parseExpr(src);
  } catch (e) {
    if (e instanceof ExprError) return e;
    throw e;
  }
  throw new Error(`expected ${src} not to parse`);
}

describe('the table of functions', () => {
  it('refuses every function called with too few or too many arguments, at the call', () => {
    for (const f of FUNCTIONS) {
      const { min, max } = arity(f);
      const args = (n: number) => Array.from({ length: n }, () => '1').join(', ');
      if (min > 0) expect(parseError(`2 + ${f.name}(${args(min - 1)})`).col, f.name).toBe(5);
      if (max !== Infinity) expect(parseError(`${f.name}(${args(max + 1)})`).detail, f.name).toContain(`write ${signature(f)}`);
      expect(() => parseExpr(`${f.name}(${args(min)})`), f.name).not.toThrow();
    }
  });

  it('gives the same refusal when a tree is evaluated without the parser', () => {
    const ast = { type: 'call' as const, callee: 'xor', args: [{ type: 'literal' as const, value: 1, start: 4, end: 5 }], start: 0, end: 6 };
    expect(() => compileExpr({ source: 'xor(1)', ast })(makeScope({}, baseFunctions))).toThrow(/xor\(\) takes 2 arguments, got 1/);
  });

  it('has pi, a constant a program and a breakpoint can use', async () => {
    expect(evaluate(parseExpr('pi / 2'), makeScope({}))).toBe(Math.PI / 2);
    const net = SWAP_NET.replace('- bell_measure:', '- gate: {op: rx, on: a, angle: "pi / 2"}\n          - bell_measure:');
    const r = await runCli(['run', 'n.net.yaml', '--events', '20', '--expect', 'pi > 3.14'], { 'n.net.yaml': net });
    expect(r.code, r.stderr).toBe(0);
    const bound = SWAP_NET.replace('as: [zb, xb]', 'as: [pi, xb]');
    const b = await runCli(['check', 'n.net.yaml'], { 'n.net.yaml': bound });
    expect(b.code).toBe(2);
    expect(b.stderr).toContain('"pi" is a constant of expressions and cannot be bound');
  });
});
