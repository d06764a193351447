import { describe, it, expect } from 'vitest';
import { parseExpr } from '../../src/expr/index.js';
import { applyEdits, exprPos, literalValue, offsetPos, staticNode, substituteParams } from '../../src/model/expressions.js';
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

describe('role parameters put into expression text', () => {
  const written = 'x.far == left && right + 1 > left';
  const args = new Map([['left', 'north'], ['right', '(-2)']]);
  const w = substituteParams(written, [parseExpr(written).ast], args)!;
  const text = applyEdits(w);
  const sub: Expr = { compiled: parseExpr(text), pos: at, written: w };

  it('replaces the names that are parameters, and nothing else (not fields, not other names)', () => {
    expect(text).toBe('x.far == north && (-2) + 1 > north');
    expect(substituteParams('x.left + y', [parseExpr('x.left + y').ast], args)).toBeUndefined();
  });

  it('maps positions in the new text back to the text as written', () => {
    const col = (source: string, needle: string, nth = 0) => at.col + source.split(needle, nth + 1).join(needle).length;
    // before any replacement: unchanged
    expect(exprPos(sub, 0)).toEqual({ ...at, col: at.col });
    // inside a value: the parameter's own position
    expect(exprPos(sub, text.indexOf('north') + 2).col).toBe(col(written, 'left'));
    expect(exprPos(sub, text.indexOf('(-2)') + 1).col).toBe(col(written, 'right'));
    // after replacements of other lengths: the same token as written
    expect(exprPos(sub, text.indexOf('+ 1')).col).toBe(col(written, '+ 1'));
    expect(exprPos(sub, text.lastIndexOf('north')).col).toBe(col(written, 'left', 1));
    expect(exprPos(sub, text.length).col).toBe(at.col + written.length);
  });
});
