/**
 * Quantities with units, as written in files and flags: durations (integer nanoseconds),
 * lengths (metres), speeds (m/s) and fiber loss (dB/km). A bare number is never accepted,
 * because "40" could mean 40 ns or 40 s.
 */
import { InputError } from './errors.js';

/** Nanoseconds per duration unit. */
const DURATION_UNITS: Readonly<Record<string, bigint>> = {
  ns: 1n,
  us: 1_000n,
  µs: 1_000n,
  μs: 1_000n,
  ms: 1_000_000n,
  s: 1_000_000_000n,
  min: 60_000_000_000n,
};

/** The units a duration may be written in. */
export const DURATION_UNIT_NAMES: readonly string[] = Object.keys(DURATION_UNITS);

/** Source text of the duration pattern, shared with the JSON Schema. */
export const DURATION_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?\\s*(ns|us|µs|μs|ms|s|min)\\s*$';
/** Source text of the length pattern. */
export const LENGTH_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?\\s*(m|km)\\s*$';
/** Source text of the speed pattern. */
export const SPEED_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?\\s*(m/s|km/s)\\s*$';
/** Source text of the fiber-loss pattern. */
export const LOSS_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?\\s*dB/km\\s*$';

const QUANTITY = /^\s*([0-9]+)(?:\.([0-9]+))?\s*([^\s0-9.][^\s]*)?\s*$/;

interface Quantity {
  readonly whole: string;
  readonly frac: string;
  readonly unit: string;
}

function split(text: string, what: string, example: string, units: string): Quantity {
  const m = QUANTITY.exec(text);
  if (!m) {
    throw new InputError({
      code: 'unit',
      message: `expected ${what} with a unit such as "${example}", got "${text}"`,
      fix: `write a non-negative number followed by one of ${units}, e.g. "${example}"`,
    });
  }
  if (!m[3]) {
    throw new InputError({
      code: 'unit',
      message: `"${text}" has no unit; expected ${what} such as "${example}"`,
      fix: `add one of ${units}, e.g. "${example}"`,
    });
  }
  return { whole: m[1], frac: m[2] ?? '', unit: m[3] };
}

function unknownUnit(q: Quantity, text: string, what: string, example: string, units: string): InputError {
  return new InputError({
    code: 'unit',
    message: `unknown unit "${q.unit}" in ${what} "${text}"`,
    fix: `use one of ${units}, e.g. "${example}"`,
  });
}

/** Parses a duration such as "250 us" or "1.5 s" to whole nanoseconds. */
export function parseDuration(text: string): number {
  const units = 'ns, us (or µs), ms, s, min';
  const q = split(text, 'a duration', '250 us', units);
  if (!Object.hasOwn(DURATION_UNITS, q.unit)) throw unknownUnit(q, text, 'duration', '250 us', units);
  const factor = DURATION_UNITS[q.unit];
  // Exact decimal arithmetic, so "1.005 us" is 1005 ns and not 1004.9999999999999.
  const scale = 10n ** BigInt(q.frac.length);
  const total = BigInt(q.whole + q.frac) * factor;
  if (total % scale !== 0n) {
    throw new InputError({
      code: 'unit',
      message: `"${text}" is not a whole number of nanoseconds`,
      fix: 'simulated time is counted in whole nanoseconds; round the duration or use a smaller unit',
    });
  }
  const ns = total / scale;
  if (ns > BigInt(Number.MAX_SAFE_INTEGER)) {
    throw new InputError({
      code: 'unit',
      message: `"${text}" is too long a duration (more than about 104 days)`,
      fix: 'use a shorter duration',
    });
  }
  return Number(ns);
}

/** A decimal number times a power of ten, computed from the text so that "1.1 km" is exactly 1100 m. */
function scaled(q: Quantity, exponent: number): number {
  return Number(`${q.whole}.${q.frac || '0'}e${exponent}`);
}

/** Parses a length such as "12 km" or "300 m" to metres. */
export function parseLength(text: string): number {
  const units = 'm, km';
  const q = split(text, 'a length', '12 km', units);
  if (q.unit === 'm') return scaled(q, 0);
  if (q.unit === 'km') return scaled(q, 3);
  throw unknownUnit(q, text, 'length', '12 km', units);
}

/** Parses a speed such as "200000 km/s" to metres per second. */
export function parseSpeed(text: string): number {
  const units = 'm/s, km/s';
  const q = split(text, 'a speed', '200000 km/s', units);
  if (q.unit === 'm/s') return scaled(q, 0);
  if (q.unit === 'km/s') return scaled(q, 3);
  throw unknownUnit(q, text, 'speed', '200000 km/s', units);
}

/** Parses a fiber attenuation such as "0.2 dB/km" to dB per km. */
export function parseLoss(text: string): number {
  const units = 'dB/km';
  const q = split(text, 'a fiber loss', '0.2 dB/km', units);
  if (q.unit === 'dB/km') return scaled(q, 0);
  throw unknownUnit(q, text, 'fiber loss', '0.2 dB/km', units);
}

const DISPLAY_UNITS: readonly (readonly [string, number])[] = [
  ['min', 60e9],
  ['s', 1e9],
  ['ms', 1e6],
  ['us', 1e3],
];

/** Formats nanoseconds for display with the largest unit that keeps the number readable, e.g. "250 us", "1.5 ms". */
export function formatDuration(ns: number): string {
  if (ns === 0) return '0 ns';
  const sign = ns < 0 ? '-' : '';
  const abs = Math.abs(ns);
  for (const [unit, size] of DISPLAY_UNITS) {
    if (abs >= size) {
      const value = abs / size;
      // Up to three decimals, trailing zeros dropped: 1.5 ms, 1.234 s, 250 us.
      const text = Number.isInteger(value) ? String(value) : String(Number(value.toFixed(3)));
      return `${sign}${text} ${unit}`;
    }
  }
  return `${sign}${abs} ns`;
}
