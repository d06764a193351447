/**
 * The library's options checked as the CLI checks its flags, with the option's own name in
 * every message: a bad option is an InputError, never a crash halfway through a run.
 */
import { InputError } from '../model/errors.js';
import { parseDuration } from '../model/units.js';

function bad(field: string, message: string, fix: string): InputError {
  return new InputError({ code: 'usage', field, message, fix });
}

/** A seed: a whole number, 0 or more. */
export function seedOption(v: unknown, field = 'seed'): number | undefined {
  if (v === undefined) return undefined;
  if (typeof v !== 'number' || !Number.isSafeInteger(v) || v < 0) throw bad(field, `expected a whole number, 0 or more, got ${JSON.stringify(v)}`, `write e.g. {${field}: 7}`);
  return v;
}

/** A duration: text with a unit as the CLI takes it ('5ms', '250 us'), or whole nanoseconds. */
export function durationOption(v: unknown, field: string): number | undefined {
  if (v === undefined) return undefined;
  if (typeof v === 'number') {
    if (!Number.isSafeInteger(v) || v < 0) throw bad(field, `expected whole nanoseconds, 0 or more, got ${v}`, `write e.g. {${field}: '5ms'} or {${field}: 5000000}`);
    return v;
  }
  if (typeof v !== 'string') throw bad(field, `expected a duration such as '5ms', got ${JSON.stringify(v)}`, `write e.g. {${field}: '5ms'}`);
  try {
    return parseDuration(v);
  } catch (e) {
    if (e instanceof InputError) throw bad(field, e.message, e.fix ?? `write e.g. {${field}: '5ms'}`);
    throw e;
  }
}

/** A count: a whole number, 1 or more. */
export function countOption(v: unknown, field: string): number | undefined {
  if (v === undefined) return undefined;
  if (typeof v !== 'number' || !Number.isSafeInteger(v) || v < 1) throw bad(field, `expected a whole number, 1 or more, got ${JSON.stringify(v)}`, `write e.g. {${field}: 1000}`);
  return v;
}

/** A list of expression texts. */
export function textsOption(v: unknown, field: string): string[] {
  if (v === undefined) return [];
  if (!Array.isArray(v) || v.some((x) => typeof x !== 'string')) throw bad(field, 'expected a list of expressions as text', `write e.g. {${field}: ['delivered() >= 2']}`);
  return [...v];
}
