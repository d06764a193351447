import { describe, it, expect } from 'vitest';
import { parseExpr } from '../../src/expr/index.js';
import { literalValue, offsetPos, staticNode } from '../../src/model/expressions.js';
import type { Expr } from '../../src/model/types.js';

const at = { file: 'n.yaml', line: 4, col: 10 };
const e = (source: string): Expr => ({ compiled: parseExpr(source), pos: at });
const ids = ['quay', 'mill', 'ridge'];

describe('staticNode', () => {
  it('names the node of a bare node-id name or a string literal of one', () => {
    expect(staticNode(e('mill'), ids)).toBe('mill');
    expect(staticNode(e('"ridge"'), new Set(ids))).toBe('ridge');
    expect(staticNode(e("'quay'"), ids)).toBe('quay');
  });

  it('is undefined for anything computed or unknown', () => {
    expect(staticNode(e('left.partner'), ids)).toBeUndefined();
    expect(staticNode(e('m.from'), ids)).toBeUndefined();
    expect(staticNode(e('fen'), ids)).toBeUndefined();
    expect(staticNode(e('"fen"'), ids)).toBeUndefined();
    expect(staticNode(e('true ? mill : quay'), ids)).toBeUndefined();
    expect(staticNode(e('3'), ids)).toBeUndefined();
  });
});

describe('literalValue and offsetPos', () => {
  it('gives the value of a pure literal only', () => {
    expect(literalValue(e('false'))).toBe(false);
    expect(literalValue(e('0'))).toBe(0);
    expect(literalValue(e('1 == 2'))).toBeUndefined();
  });

  it('maps an offset on one line to a column, and past a newline to a later line', () => {
    expect(offsetPos(at, 'a + b', 4)).toEqual({ file: 'n.yaml', line: 4, col: 14 });
    expect(offsetPos(at, 'a +\n  b', 6)).toEqual({ file: 'n.yaml', line: 5, col: 3 });
  });
});
