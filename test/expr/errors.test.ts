import { describe, expect, it } from 'vitest';
import { ExprError, parseExpr } from '../../src/expr/index.js';

function parseError(src: string): ExprError {
  try {
    parseExpr(src);
  } catch (e) {
    if (e instanceof ExprError) return e;
    throw e;
  }
  throw new Error(`expected ${src} to fail`);
}

describe('ExprError', () => {
  it('is an Error whose message adds the position to the detail', () => {
    const e = new ExprError('eval', 'unknown name "fenn"', 'a &&\n  fenn', 7, 4);
    expect(e).toBeInstanceOf(Error);
    expect(e.name).toBe('ExprError');
    expect([e.kind, e.line, e.col, e.offset, e.length, e.source]).toEqual(['eval', 2, 3, 7, 4, 'a &&\n  fenn']);
    expect(e.message).toBe('unknown name "fenn" at 2:3');
  });

  it('excerpts the offending line with carets under the offending text', () => {
    expect(parseError('a + b === c').excerpt()).toBe('a + b === c\n      ^^^');
    const multi = parseError('m.bit == 1 &&\n  left.age > 1000 &&\n  ) ');
    expect(multi.excerpt()).toBe('  ) \n  ^');
  });

  it('puts one caret after the text for errors at the end', () => {
    expect(parseError('x +').excerpt()).toBe('x +\n   ^');
  });

  it('keeps tabs in the padding so the caret lines up', () => {
    expect(parseError('\tx\t$').excerpt()).toBe('\tx\t$\n\t \t^');
  });

  it('clips a span that runs past the end of its line', () => {
    const e = new ExprError('eval', 'bad', 'ab\ncd', 1, 4);
    expect(e.excerpt()).toBe('ab\n ^');
  });

  it('drops the carriage return of CRLF lines', () => {
    expect(parseError('a $\r\nb').excerpt()).toBe('a $\n  ^');
  });
});
