import { describe, expect, it } from 'vitest';
import { formatValue, valuesEqual } from '../../src/expr/index.js';

describe('formatValue', () => {
  it('shows integers plainly', () => {
    expect(formatValue(42)).toBe('42');
    expect(formatValue(-7)).toBe('-7');
    expect(formatValue(0)).toBe('0');
    expect(formatValue(-0)).toBe('0');
    expect(formatValue(5000000)).toBe('5000000');
  });

  it('shows other numbers with up to 6 significant digits', () => {
    expect(formatValue(1 / 3)).toBe('0.333333');
    expect(formatValue(2 / 3)).toBe('0.666667');
    expect(formatValue(0.1 + 0.2)).toBe('0.3');
    expect(formatValue(0.93)).toBe('0.93');
    expect(formatValue(123456.789)).toBe('123457');
    expect(formatValue(0.000012345678)).toBe('0.0000123457');
    expect(formatValue(1234567.5)).toBe('1.23457e+6');
    expect(formatValue(2.5e-9)).toBe('2.5e-9');
  });

  it('shows strings plainly, booleans and null as words', () => {
    expect(formatValue('mill~quay#3')).toBe('mill~quay#3');
    expect(formatValue(true)).toBe('true');
    expect(formatValue(null)).toBe('null');
  });

  it('shows arrays and records, quoting strings inside them', () => {
    expect(formatValue([1, 'a', true, null])).toBe('[1, "a", true, null]');
    expect(formatValue({ id: 'x', bell: [0.9, 0.1 / 3] })).toBe('{id: "x", bell: [0.9, 0.0333333]}');
    expect(formatValue([])).toBe('[]');
    expect(formatValue({})).toBe('{}');
  });
});

describe('valuesEqual', () => {
  it('compares primitives without conversion', () => {
    expect(valuesEqual(1, 1)).toBe(true);
    expect(valuesEqual(1, '1')).toBe(false);
    expect(valuesEqual(0, false)).toBe(false);
    expect(valuesEqual(null, null)).toBe(true);
    expect(valuesEqual(null, 0)).toBe(false);
  });

  it('compares nested arrays and records by content', () => {
    expect(valuesEqual([1, { a: [2] }], [1, { a: [2] }])).toBe(true);
    expect(valuesEqual([1, 2], [1, 2, 3])).toBe(false);
    expect(valuesEqual({ a: 1 }, { a: 1, b: 2 })).toBe(false);
    expect(valuesEqual({ a: 1, b: 2 }, { b: 2, a: 1 })).toBe(true);
    expect(valuesEqual([], {})).toBe(false);
  });
});
