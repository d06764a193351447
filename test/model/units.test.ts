import { describe, it, expect } from 'vitest';
import { InputError } from '../../src/model/errors.js';
import { formatDuration, parseDuration, parseLength, parseLoss, parseSpeed } from '../../src/model/units.js';

function unitError(fn: () => unknown): InputError {
  try {
    fn();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('parseDuration', () => {
  it.each([
    ['40 ns', 40],
    ['250 us', 250 * 1e3],
    ['250us', 250 * 1e3],
    ['3 µs', 3 * 1e3],
    ['12 ms', 12 * 1e6],
    ['1.5 s', 1.5 * 1e9],
    ['2 min', 2 * 60 * 1e9],
    ['0 ns', 0],
    ['  7 ms  ', 7 * 1e6],
  ])('reads %s as whole nanoseconds', (text, ns) => {
    expect(parseDuration(text)).toBe(ns);
  });

  it('keeps decimal fractions exact where float arithmetic would not', () => {
    // 1.005 * 1000 is 1004.9999999999999 in binary floating point
    expect(1.005 * 1000).not.toBe(1005);
    expect(parseDuration('1.005 us')).toBe(1005);
    expect(parseDuration('1.005 ms')).toBe(1_005_000);
    expect(parseDuration('0.001 s')).toBe(1_000_000);
  });

  it('refuses a duration that is not a whole number of nanoseconds', () => {
    expect(unitError(() => parseDuration('1.5 ns')).message).toContain('not a whole number of nanoseconds');
    expect(unitError(() => parseDuration('0.0001 us')).message).toContain('whole number');
  });

  it('refuses a bare number, a negative and an unknown unit with a sentence naming the problem', () => {
    expect(unitError(() => parseDuration('40')).message).toContain('has no unit');
    expect(unitError(() => parseDuration('-3 ms')).message).toContain('expected a duration');
    expect(unitError(() => parseDuration('3 hours')).message).toContain('unknown unit "hours"');
    expect(unitError(() => parseDuration('3 constructor')).message).toContain('unknown unit');
    expect(unitError(() => parseDuration('40')).code).toBe('unit');
  });

  it('refuses a duration past the safe integer range of nanoseconds', () => {
    expect(unitError(() => parseDuration('200000 min')).message).toContain('too long');
  });
});

describe('parseLength, parseSpeed, parseLoss', () => {
  it('converts lengths to metres', () => {
    expect(parseLength('12 km')).toBe(12_000);
    expect(parseLength('300 m')).toBe(300);
    expect(parseLength('1.1km')).toBe(1_100);
    expect(unitError(() => parseLength('12 mi')).message).toContain('unknown unit "mi"');
    expect(unitError(() => parseLength('12')).message).toContain('has no unit');
  });

  it('converts speeds to metres per second', () => {
    // light in fiber, about 200,000 km/s (common practice)
    expect(parseSpeed('200000 km/s')).toBe(2e8);
    expect(parseSpeed('3 m/s')).toBe(3);
    expect(unitError(() => parseSpeed('5 km/h')).message).toContain('unknown unit');
  });

  it('reads fiber loss in dB/km', () => {
    expect(parseLoss('0.2 dB/km')).toBe(0.2);
    expect(parseLoss('0.25dB/km')).toBe(0.25);
    expect(unitError(() => parseLoss('0.2 dB')).message).toContain('unknown unit "dB"');
  });
});

describe('formatDuration', () => {
  it.each([
    [0, '0 ns'],
    [40, '40 ns'],
    [250_000, '250 us'],
    [1_500_000, '1.5 ms'],
    [12_000_000, '12 ms'],
    [1_234_000_000, '1.234 s'],
    [120e9, '2 min'],
  ])('formats %d ns as %s', (ns, text) => {
    expect(formatDuration(ns)).toBe(text);
  });

  it('round-trips through parseDuration for whole values', () => {
    for (const ns of [7, 250_000, 1_500_000, 3e9, 60e9]) expect(parseDuration(formatDuration(ns))).toBe(ns);
  });
});
