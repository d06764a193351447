import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { baseFunctions, compileExpr, evaluate, ExprError, makeScope, parseExpr, type Value } from '../../src/expr/index.js';
import { walk, WalkerError } from './reference-walker.js';

const scope = makeScope(
  {
    n: 3,
    z: 0,
    b: 1,
    s: 'fen',
    t: true,
    u: null,
    xs: [2, 'vale', [1, 0]],
    r: { k: 2, label: 'ridge', inner: { q: 1 }, none: null },
  },
  { ...baseFunctions, pick: (args) => (args.length > 0 ? args[args.length - 1] : null) },
);

// Expressions over every kind of value, fully parenthesized; many of them are meant to fail.
const mixed = fc.letrec<{ expr: string }>((tie) => ({
  expr: fc.oneof(
    { maxDepth: 5 },
    fc.constantFrom('n', 'z', 'b', 's', 't', 'u', 'xs', 'r', 'nope', '0', '1', '2', '0.5', "'fen'", "'vale'", 'true', 'false', 'null'),
    fc.constantFrom('r.k', 'r.label', 'r.inner.q', 'r.none', 'r.missing', 'u.k', 'xs.k', 's.k'),
    fc.tuple(tie('expr')).map(([i]) => `xs[${i}]`),
    fc.tuple(fc.constantFrom('-', '+', '!'), tie('expr')).map(([op, a]) => `(${op}${a})`),
    fc
      .tuple(tie('expr'), fc.constantFrom('+', '-', '*', '/', '%', '<', '<=', '>', '>=', '==', '!=', '&&', '||'), tie('expr'))
      .map(([a, op, c]) => `(${a} ${op} ${c})`),
    fc.tuple(tie('expr'), tie('expr'), tie('expr')).map(([a, c, d]) => `(${a} ? ${c} : ${d})`),
    fc
      .tuple(fc.constantFrom('min', 'max', 'xor', 'abs', 'round', 'pick', 'nope'), fc.array(tie('expr'), { maxLength: 3 }))
      .map(([f, args]) => `${f}(${args.join(', ')})`),
  ),
})).expr;

type Outcome = { value: Value } | { error: [number, number] };

function outcome(f: () => Value): Outcome {
  try {
    return { value: f() };
  } catch (e) {
    if (e instanceof ExprError) {
      expect(e.kind).toBe('eval');
      expect(e.detail.length).toBeGreaterThan(0);
      return { error: [e.offset, e.length] };
    }
    if (e instanceof WalkerError) return { error: [e.offset, e.length] };
    throw e;
  }
}

describe('compileExpr', () => {
  it('agrees with evaluate and with a plain tree walker, values and error positions alike', () => {
    let failures = 0;
    let values = 0;
    fc.assert(
      fc.property(mixed, (src) => {
        let compiled;
        try {
          compiled = parseExpr(src);
        } catch (e) {
          // The generator can write xs['vale'], which the parser rightly refuses.
          if (e instanceof ExprError && e.detail.includes('not with a string index')) return;
          // or min(), which the parser refuses by the table of functions
          if (e instanceof ExprError && / takes .* arguments?, got /.test(e.detail)) return;
          throw e;
        }
        const viaWalk = outcome(() => walk(compiled.ast, scope));
        expect(outcome(() => compileExpr(compiled)(scope))).toStrictEqual(viaWalk);
        expect(outcome(() => evaluate(compiled, scope))).toStrictEqual(viaWalk);
        if ('error' in viaWalk) failures++;
        else values++;
      }),
      { numRuns: 3000 },
    );
    // Both branches must be well exercised for the agreement to mean something.
    expect(failures).toBeGreaterThan(300);
    expect(values).toBeGreaterThan(300);
  });

  it('gives a reusable function that reads the scope it is handed', () => {
    const run = compileExpr(parseExpr('pairs + 1'));
    expect(run(makeScope({ pairs: 1 }))).toBe(2);
    expect(run(makeScope({ pairs: 41 }))).toBe(42);
  });

  it('looks functions up in the scope of each call', () => {
    const c = parseExpr('now() * 2');
    expect(evaluate(c, makeScope({}, { now: () => 5 }))).toBe(10);
    expect(evaluate(c, makeScope({}, { now: () => 7 }))).toBe(14);
  });

  it('reads bindings from a Map scope too', () => {
    expect(evaluate(parseExpr('a + b'), makeScope(new Map<string, Value>([['a', 1], ['b', 2]])))).toBe(3);
  });
});
