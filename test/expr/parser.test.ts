import vm from 'node:vm';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluate, ExprError, makeScope, parseExpr, type ExprNode, type Value } from '../../src/expr/index.js';

const empty = makeScope({});
const run = (src: string, bindings: Record<string, Value> = {}): Value => evaluate(parseExpr(src), makeScope(bindings));

/** The error thrown by `f`, which must be an ExprError. */
function errorOf(f: () => unknown): ExprError {
  try {
    f();
  } catch (e) {
    if (e instanceof ExprError) return e;
    throw e;
  }
  throw new Error('expected an ExprError, but nothing was thrown');
}
const parseError = (src: string): ExprError => errorOf(() => parseExpr(src));

/** JavaScript's own value for a piece of arithmetic: the independent oracle for precedence. */
const jsValue = (src: string): unknown => vm.runInNewContext(src);

function findNode(n: ExprNode, start: number, end: number): ExprNode | undefined {
  if (n.start === start && n.end === end) return n;
  const kids: ExprNode[] =
    n.type === 'binary' ? [n.left, n.right] : n.type === 'unary' ? [n.argument] : n.type === 'conditional' ? [n.test, n.consequent, n.alternate] : [];
  for (const k of kids) {
    const found = findNode(k, start, end);
    if (found) return found;
  }
  return undefined;
}

// Arithmetic printed with parentheses only here and there, so precedence and associativity decide.
const arithmetic = fc.letrec<{ expr: string }>((tie) => ({
  expr: fc.oneof(
    { maxDepth: 6 },
    fc.oneof(fc.integer({ min: 0, max: 40 }).map(String), fc.constantFrom('0.5', '2.25', '1e-3', '1e2', '3.0', '.5')),
    fc.tuple(tie('expr'), fc.constantFrom('+', '-', '*', '/', '%'), tie('expr')).map(([a, op, b]) => `${a} ${op} ${b}`),
    fc.tuple(fc.constantFrom('-', '+'), tie('expr')).map(([op, a]) => `${op} ${a}`),
    tie('expr').map((a) => `(${a})`),
  ),
})).expr;

// Boolean expressions; numbers appear only inside parenthesized comparisons, so every grouping stays boolean.
const logic = fc.letrec<{ expr: string }>((tie) => ({
  expr: fc.oneof(
    { maxDepth: 6 },
    fc.constantFrom('true', 'false'),
    fc
      .tuple(fc.integer({ min: 0, max: 3 }), fc.constantFrom('<', '<=', '>', '>=', '==', '!='), fc.integer({ min: 0, max: 3 }))
      .map(([a, op, b]) => `(${a} ${op} ${b})`),
    fc.tuple(tie('expr'), fc.constantFrom('&&', '||', '==', '!='), tie('expr')).map(([a, op, b]) => `${a} ${op} ${b}`),
    tie('expr').map((a) => `! ${a}`),
    fc.tuple(tie('expr'), tie('expr'), tie('expr')).map(([a, b, c]) => `${a} ? ${b} : ${c}`),
    tie('expr').map((a) => `(${a})`),
  ),
})).expr;

describe('precedence and associativity agree with JavaScript', () => {
  it('on generated arithmetic', () => {
    fc.assert(
      fc.property(arithmetic, (src) => {
        let mine: Value;
        try {
          mine = evaluate(parseExpr(src), empty);
        } catch (e) {
          // JavaScript gives Infinity or NaN where we refuse; check the refused divisor really is zero.
          if (!(e instanceof ExprError) || !e.detail.startsWith('division by zero')) throw e;
          const node = findNode(parseExpr(src).ast, e.offset, e.offset + e.length);
          expect(node?.type).toBe('binary');
          if (node?.type !== 'binary') return;
          expect(Math.abs(jsValue(src.slice(node.right.start, node.right.end)) as number)).toBe(0);
          return;
        }
        expect(mine).toBe(jsValue(src));
      }),
      { numRuns: 2000 },
    );
  });

  it('on generated boolean expressions with ! && || == != and ? :', () => {
    fc.assert(
      fc.property(logic, (src) => {
        expect(evaluate(parseExpr(src), empty)).toBe(jsValue(src));
      }),
      { numRuns: 2000 },
    );
  });

  it('on hand-picked cases', () => {
    for (const src of ['1 - 2 - 3', '2 * 3 % 4', '8 / 4 / 2', '1 + 2 * 3 - 4 / 2', '- 2 * 3', '-(2 + 3) * 4', '1 < 2 == true', 'true ? false ? 1 : 2 : 3', 'false || true && false', '1 + 2 < 4 && 5 > 3']) {
      expect(run(src), src).toBe(jsValue(src));
    }
  });
});

describe('literals', () => {
  it('reads numbers in plain, decimal and exponent form', () => {
    expect(run('42')).toBe(42);
    expect(run('1e-3')).toBe(0.001);
    expect(run('2.5E2')).toBe(250);
    expect(run('.25')).toBe(0.25);
    expect(run('7e+1')).toBe(70);
  });

  it('reads true, false and null', () => {
    expect(run('true')).toBe(true);
    expect(run('false')).toBe(false);
    expect(run('null')).toBe(null);
  });

  it('reads strings in both quotes with the five escapes', () => {
    expect(run(`'waiting'`)).toBe('waiting');
    expect(run(`"waiting"`)).toBe('waiting');
    expect(run(String.raw`'a\\b'`)).toBe('a\\b');
    expect(run(String.raw`'it\'s'`)).toBe("it's");
    expect(run(String.raw`"say \"hi\""`)).toBe('say "hi"');
    expect(run(String.raw`'x\ny\tz'`)).toBe('x\ny\tz');
    expect(run(`"it's"`)).toBe("it's");
    expect(run(`'north-gate'`)).toBe('north-gate');
  });

  it('refuses malformed numbers', () => {
    expect(parseError('3km').detail).toBe('invalid number "3km"');
    expect(parseError('0x10').detail).toBe('invalid number "0x10"');
    expect(parseError('1e999').detail).toContain('too large');
  });
});

describe('names, members, indexing and calls', () => {
  it('keeps a-b a subtraction, so dashed node ids are strings', () => {
    expect(run('a-b', { a: 5, b: 3 })).toBe(2);
    expect(parseExpr('north-gate').names).toEqual(['north', 'gate']);
  });

  it('lists free names and called functions in first-use order without duplicates', () => {
    const c = parseExpr('xor(m.bit, b) == b && age(p) > min(x, m.limit) && pairs(fen) < 2 ? left.partner : xor(q, 1)');
    expect(c.names).toEqual(['m', 'b', 'p', 'x', 'fen', 'left', 'q']);
    expect(c.calls).toEqual(['xor', 'age', 'min', 'pairs']);
  });

  it('does not count field names or literals as names', () => {
    const c = parseExpr('m.pair == true || xs[0].id != null');
    expect(c.names).toEqual(['m', 'xs']);
    expect(c.calls).toEqual([]);
  });

  it('parses calls with zero, one and several arguments', () => {
    const c = parseExpr('f() + g(1) + h(1, 2, 3)');
    expect(c.calls).toEqual(['f', 'g', 'h']);
    const ast = c.ast;
    expect(ast.type).toBe('binary');
  });

  it('records spans as offsets into the source', () => {
    const src = '  m.pair ';
    const ast = parseExpr(src).ast;
    expect(src.slice(ast.start, ast.end)).toBe('m.pair');
  });
});

describe('parse errors point at the offending text', () => {
  const at = (src: string): [string, number, number, number, number] => {
    const e = parseError(src);
    expect(e.kind).toBe('parse');
    expect(e.source).toBe(src);
    return [e.message, e.line, e.col, e.offset, e.length];
  };

  it('on one line', () => {
    expect(at('fen + )')).toEqual(['unexpected ")" at 1:7', 1, 7, 6, 1]);
    expect(at('x +')).toEqual(['unexpected end of expression at 1:4', 1, 4, 3, 0]);
    expect(at('(1 + 2')[0]).toBe('expected ")" to close "(" at 1:1, found end of expression at 1:7');
    expect(at('f(1, 2')[0]).toBe('expected ")" to close "(" at 1:2, found end of expression at 1:7');
    expect(at('f(1,)')[0]).toBe('unexpected ")" after "," at 1:5');
    expect(at('xs[1')[0]).toBe('expected "]" to close "[" at 1:3, found end of expression at 1:5');
    expect(at('1 2')[0]).toBe('unexpected number 2 after a complete expression at 1:3');
    expect(at('new Foo')[0]).toBe('unexpected name "Foo" after a complete expression at 1:5');
    expect(at('m.')[0]).toBe('expected a field name after ".", found end of expression at 1:3');
    expect(at('m.1')[0]).toBe('expected a field name after ".", found number 1 at 1:3');
    expect(at('a ? b')[0]).toBe('expected ":" to close "?" at 1:3, found end of expression at 1:6');
    expect(at('')).toEqual(['empty expression at 1:1', 1, 1, 0, 0]);
    expect(at('   ')[0]).toBe('empty expression at 1:1');
  });

  it('on later lines of a multi-line source', () => {
    const src = 'pairs(quay) > 0 &&\n  fidelity(p) >= 0.9 &&\n  ]';
    expect(at(src)).toEqual(['unexpected "]" at 3:3', 3, 3, src.indexOf(']'), 1]);
    const crlf = 'a &&\r\n  b $';
    expect(at(crlf)).toEqual(['unexpected character "$" at 2:5', 2, 5, crlf.indexOf('$'), 1]);
  });

  it('in strings', () => {
    expect(at(`'abc`)).toEqual(["unterminated string (missing closing ') at 1:1", 1, 1, 0, 4]);
    expect(at(`x == "ab\ncd"`)[0]).toBe('unterminated string (missing closing ") at 1:6');
    const bad = String.raw`'a\qb'`;
    expect(at(bad)).toEqual([String.raw`unknown escape "\q" in string (allowed: \\ \' \" \n \t) at 1:3`, 1, 3, 2, 2]);
  });

  it('for syntax from JavaScript that the language leaves out', () => {
    expect(at('a = 1')[0]).toBe('assignment is not allowed: write "==" to compare at 1:3');
    expect(at('a === 1')[0]).toBe('there is no "===": write "==" (comparisons never convert types) at 1:3');
    expect(at('a !== 1')[0]).toBe('there is no "!==": write "!=" (comparisons never convert types) at 1:3');
    expect(at('(x) => x')[0]).toBe('arrow functions are not part of expressions at 1:5');
    expect(at('`hi ${x}`')[0]).toBe('template strings are not supported: join strings with + at 1:1');
    expect(at('a & b')[0]).toBe('there is no "&": write "&&" at 1:3');
    expect(at('a | b')[0]).toBe('there is no "|": write "||" at 1:3');
    expect(at('2 ** 3')[0]).toBe('there is no "**" operator at 1:3');
    expect(at('a; b')[0]).toBe('only one expression is allowed (no ";") at 1:2');
    expect(at('{a: 1}')[0]).toBe('braces are not part of expressions at 1:1');
    expect(at('a.b(1)')).toEqual(['only a function name can be called (found a call on `a.b`) at 1:4', 1, 4, 3, 1]);
    expect(at('f()(1)')[0]).toBe('only a function name can be called (found a call on `f()`) at 1:4');
    expect(at('(f)(1)')[0]).toBe('only a function name can be called (found a call on `(f)`) at 1:4');
    expect(at('a["x"]')[0]).toBe('fields are read with ".", not with a string index: write .x instead of ["x"] at 1:3');
    expect(at('a++')[0]).toBe('unexpected end of expression at 1:4');
  });

  it('for trees too deep to evaluate safely', () => {
    expect(parseError('('.repeat(100_000) + '1').detail).toContain('nested too deeply');
    expect(parseError('!'.repeat(100_000) + 'true').detail).toContain('nested too deeply');
    expect(parseError('1' + ' + 1'.repeat(100_000)).detail).toContain('nested too deeply');
    // Moderate nesting is fine.
    expect(run('('.repeat(150) + '1' + ')'.repeat(150))).toBe(1);
  });
});
