/** Helpers on expression values: kinds, structural equality and display. */
import type { Value, ValueRecord } from './types.js';

/** Whether a value is a record (a plain object, not an array and not null). */
export function isRecord(v: unknown): v is ValueRecord {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** The kind of a value in words, for messages: "number 2", "string \"x\"", "null", "an array", "a record". */
export function describeValue(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'an array';
  switch (typeof v) {
    case 'number':
      return `number ${formatValue(v)}`;
    case 'string':
      return `string ${JSON.stringify(v.length > 30 ? `${v.slice(0, 29)}…` : v)}`;
    case 'boolean':
      return String(v);
    case 'object':
      return 'a record';
    default:
      return `a ${typeof v}`;
  }
}

/** Short kind name: number, string, boolean, null, array, record. */
export function kindOf(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'array';
  if (typeof v === 'object') return 'record';
  return typeof v;
}

/** `==` of the language: primitives by value without conversion, arrays and records structurally. */
export function valuesEqual(a: Value, b: Value): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  const aArr = Array.isArray(a);
  if (aArr !== Array.isArray(b)) return false;
  if (aArr) {
    const x = a as readonly Value[];
    const y = b as readonly Value[];
    if (x.length !== y.length) return false;
    for (let i = 0; i < x.length; i++) if (!valuesEqual(x[i], y[i])) return false;
    return true;
  }
  const x = a as ValueRecord;
  const y = b as ValueRecord;
  const keys = Object.keys(x);
  if (keys.length !== Object.keys(y).length) return false;
  for (const k of keys) if (!Object.hasOwn(y, k) || !valuesEqual(x[k], y[k])) return false;
  return true;
}

/** A number for display: integers plain, others with up to 6 significant digits. */
function formatNumber(n: number): string {
  if (Object.is(n, -0)) return '0';
  if (Number.isInteger(n) || !Number.isFinite(n)) return String(n);
  const p = n.toPrecision(6);
  // Very large or small values come back in exponent form; drop its trailing zeros.
  const e = p.indexOf('e');
  if (e < 0) return String(Number(p));
  return `${String(Number(p.slice(0, e)))}${p.slice(e)}`;
}

/**
 * A value for display. Numbers: integers plain, others up to 6 significant digits. A string
 * on its own is shown plain; inside an array or record it is quoted, so that `["1"]` and
 * `[1]` look different.
 */
export function formatValue(v: Value): string {
  return format(v, true);
}

function format(v: Value, top: boolean): string {
  if (v === null) return 'null';
  if (typeof v === 'number') return formatNumber(v);
  if (typeof v === 'string') return top ? v : JSON.stringify(v);
  if (typeof v === 'boolean') return String(v);
  if (Array.isArray(v)) return `[${v.map((x: Value) => format(x, false)).join(', ')}]`;
  if (typeof v === 'object') {
    const rec = v as ValueRecord;
    return `{${Object.keys(rec).map((k) => `${k}: ${format(rec[k], false)}`).join(', ')}}`;
  }
  return String(v);
}
