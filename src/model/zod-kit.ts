/**
 * Zod building blocks shared by the program-set and noise-model schemas, and the error map
 * that turns zod's findings into sentences for a person. Every message leaves here encoded
 * with its fix (see `encodeIssue`), so nested validations can pass it on unchanged.
 */
import { z } from 'zod';
import { closest, didYouMean, listWords } from './suggest.js';
import { DURATION_PATTERN, LENGTH_PATTERN, LOSS_PATTERN, SPEED_PATTERN } from './units.js';

/** Whether a schema is built to validate files or to be emitted as JSON Schema. */
export type Mode = 'validate' | 'json';

/** What an issue message carries besides its sentence. */
export interface IssuePayload {
  /** The sentence. */
  readonly m: string;
  /** The fix. */
  readonly f?: string;
  /** An unknown key to point at, inside the mapping the issue is about. */
  readonly k?: string;
  /** The field is missing; the translator names it from the path. */
  readonly missing?: boolean;
}

const MARK = '\u0001';

/** Packs a message and its fix into one zod message string. */
export function encodeIssue(p: IssuePayload): string {
  return MARK + JSON.stringify(p);
}

/** Unpacks a message made by `encodeIssue` (zod's own messages pass through as they are). */
export function decodeIssue(message: string): IssuePayload {
  if (message.startsWith(MARK)) return JSON.parse(message.slice(1)) as IssuePayload;
  return { m: message };
}

/** A short description of a received value: `40`, `"abc"`, `a list`, `a mapping`, `nothing`. */
export function describeValue(v: unknown): string {
  if (v === undefined || v === null) return 'nothing';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'object') return 'a mapping';
  if (typeof v === 'string') return JSON.stringify(v);
  return String(v);
}

const EXPECTED_WORDS: Record<string, string> = {
  string: 'text',
  number: 'a number',
  int: 'a whole number',
  boolean: 'true or false',
  array: 'a list',
  object: 'a mapping',
  tuple: 'a list',
  record: 'a mapping',
};

function descriptionOf(schema: unknown): string | undefined {
  if (schema instanceof z.ZodType) return schema.description;
  return undefined;
}

function lowerNoDot(text: string): string {
  return `${text[0].toLowerCase()}${text.slice(1)}`.replace(/\.$/, '');
}

/** A fix sentence: what to write, plus what the field is for when the schema says so. */
function fixFor(what: string, description: string | undefined): string {
  return description ? `${what} (this field: ${lowerNoDot(description)})` : what;
}

/** The error map used for every validation in model/. */
export const humanErrorMap: z.core.$ZodErrorMap = (iss) => {
  const input = iss.input;
  const description = descriptionOf(iss.schema ?? iss.inst);
  switch (iss.code) {
    case 'invalid_type': {
      if (input === undefined) return encodeIssue({ m: 'missing', missing: true, f: description });
      const want = EXPECTED_WORDS[iss.expected] ?? iss.expected;
      return encodeIssue({ m: `expected ${want}, got ${describeValue(input)}`, f: fixFor(`write ${want} here`, description) });
    }
    case 'too_small': {
      if (iss.origin === 'array') {
        const n = Number(iss.minimum);
        return encodeIssue({ m: `needs at least ${n} ${n === 1 ? 'entry' : 'entries'}, got ${Array.isArray(input) ? input.length : 0}`, f: fixFor(`give at least ${n}`, description) });
      }
      if (iss.origin === 'string') return encodeIssue({ m: 'must not be empty', f: fixFor('write some text', description) });
      const bound = iss.inclusive === false ? `greater than ${iss.minimum}` : `at least ${iss.minimum}`;
      return encodeIssue({ m: `must be ${bound}, got ${describeValue(input)}`, f: fixFor(`use a value ${bound}`, description) });
    }
    case 'too_big': {
      if (iss.origin === 'array') return encodeIssue({ m: `allows at most ${iss.maximum} entries`, f: fixFor(`give at most ${iss.maximum}`, description) });
      const bound = iss.inclusive === false ? `less than ${iss.maximum}` : `at most ${iss.maximum}`;
      return encodeIssue({ m: `must be ${bound}, got ${describeValue(input)}`, f: fixFor(`use a value ${bound}`, description) });
    }
    case 'invalid_value': {
      const allowed = iss.values.map(String);
      if (allowed.length === 1) return encodeIssue({ m: `expected "${allowed[0]}", got ${describeValue(input)}`, f: `write "${allowed[0]}"` });
      const near = typeof input === 'string' ? didYouMean(input, allowed) : '';
      return encodeIssue({ m: `expected one of ${listWords(allowed)}, got ${describeValue(input)}${near}`, f: fixFor(`write one of ${listWords(allowed)}`, description) });
    }
    case 'unrecognized_keys': {
      const owner = iss.inst as unknown as { _zod?: { def?: { shape?: Record<string, unknown> } } };
      const allowed = Object.keys(owner._zod?.def?.shape ?? {});
      const [first, ...rest] = iss.keys;
      const near = closest(first, allowed);
      const m =
        rest.length === 0
          ? `unknown field "${first}"${near ? ` (did you mean "${near}"?)` : ''}`
          : `unknown fields ${listWords(iss.keys, 'and')}`;
      return encodeIssue({ m, k: first, f: allowed.length ? `the fields allowed here are ${listWords(allowed)}` : 'remove it' });
    }
    case 'invalid_format':
    case 'invalid_union':
      return encodeIssue({ m: `${describeValue(input)} is not valid here`, f: description ? `expected: ${lowerNoDot(description)}` : 'see "bellstep schema" for the expected shape' });
    default:
      return undefined;
  }
};

/** A string field whose value must match `pattern`; the message names what was expected. */
function patterned(pattern: string, what: string, example: string, description: string) {
  const re = new RegExp(pattern, 'u');
  return z
    .string({
      error: (iss) =>
        iss.input === undefined ? undefined : encodeIssue({ m: `expected ${what} with a unit such as "${example}", got ${describeValue(iss.input)}`, f: `write it as text with a unit, e.g. "${example}"` }),
    })
    .regex(re, { error: (iss) => encodeIssue({ m: `expected ${what} with a unit such as "${example}", got ${describeValue(iss.input)}`, f: description }) })
    .describe(description);
}

/** A duration such as "250 us". */
export const durationText = () => patterned(DURATION_PATTERN, 'a duration', '250 us', 'A duration with a unit: ns, us (or µs), ms, s or min, e.g. "250 us" or "1.5 s".');
/** A length such as "12 km". */
export const lengthText = () => patterned(LENGTH_PATTERN, 'a length', '12 km', 'A length with a unit: m or km, e.g. "12 km".');
/** A speed such as "200000 km/s". */
export const speedText = () => patterned(SPEED_PATTERN, 'a speed', '200000 km/s', 'A speed with a unit: m/s or km/s, e.g. "200000 km/s".');
/** A fiber attenuation such as "0.2 dB/km". */
export const lossText = () => patterned(LOSS_PATTERN, 'a fiber loss', '0.2 dB/km', 'Fiber attenuation in dB/km, e.g. "0.2 dB/km".');

const PROBABILITY_FIX = 'write a number from 0 to 1, e.g. 0.95';

/** A probability in [0, 1]. */
export const probability = (what = 'A probability') =>
  z
    .number({ error: (iss) => (iss.input === undefined ? undefined : encodeIssue({ m: `expected a probability between 0 and 1, got ${describeValue(iss.input)}`, f: PROBABILITY_FIX })) })
    .min(0, { error: (iss) => encodeIssue({ m: `a probability must be between 0 and 1, got ${describeValue(iss.input)}`, f: PROBABILITY_FIX }) })
    .max(1, { error: (iss) => encodeIssue({ m: `a probability must be between 0 and 1, got ${describeValue(iss.input)}`, f: PROBABILITY_FIX }) })
    .describe(`${what}, between 0 and 1.`);

/**
 * Names every JavaScript object already has (`toString`, `constructor`, `__proto__`, ...).
 * Node ids, rule names and the other names a file chooses become keys of records, where
 * such a name would read the built-in instead of nothing; they are refused as names.
 */
export const RESERVED_NAMES: ReadonlySet<string> = new Set([...Object.getOwnPropertyNames(Object.prototype), 'prototype', 'this']);

/** A name matching `re` and not a reserved name, described for messages. */
export function word(re: RegExp, what: string, example: string) {
  return z
    .string({ error: (iss) => (iss.input === undefined ? undefined : encodeIssue({ m: `expected ${what}, got ${describeValue(iss.input)}`, f: `write ${what}, e.g. ${example}` })) })
    .regex(re, { error: (iss) => encodeIssue({ m: `${describeValue(iss.input)} is not ${what}`, f: `use ${what}, e.g. ${example}` }) })
    .refine((v) => !RESERVED_NAMES.has(v), {
      error: (iss) => encodeIssue({ m: `${describeValue(iss.input)} is a reserved word and cannot be used as ${what}`, f: `pick another name, e.g. ${example}` }),
    })
    .describe(`${what[0].toUpperCase()}${what.slice(1)}, e.g. ${example}.`);
}

/** A positive whole number. */
export const count = (what: string) =>
  z
    .int({ error: (iss) => (iss.input === undefined ? undefined : encodeIssue({ m: `expected a whole number, got ${describeValue(iss.input)}`, f: fixFor('write a whole number of at least 1', what) })) })
    .min(1, { error: (iss) => encodeIssue({ m: `must be at least 1, got ${describeValue(iss.input)}`, f: fixFor('write a whole number of at least 1', what) }) })
    .describe(what);

/** A strict mapping (unknown keys are errors with a did-you-mean). */
export function obj<S extends z.ZodRawShape>(shape: S, description?: string) {
  const o = z.strictObject(shape);
  return description ? o.describe(description) : o;
}

function isMapping(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * A mapping with exactly one key that says what it is (`{have: {...}}`, `{werner: 0.9}`).
 * For JSON Schema it is a plain union; for validation it dispatches on the key, so the
 * errors are those of the intended variant instead of zod's "no union member matched".
 * `whole` lists variants that own the entire mapping (`{if, then, else}`).
 */
export function keyed(
  mode: Mode,
  what: string,
  variants: Record<string, z.ZodType>,
  whole: Record<string, z.ZodType> = {},
  description?: string,
): z.ZodType {
  const names = [...Object.keys(variants), ...Object.keys(whole)];
  if (mode === 'json') {
    const options = [
      ...Object.entries(variants).map(([k, s]) => z.strictObject({ [k]: s })),
      ...Object.values(whole),
    ];
    const u = z.union(options as [z.ZodType, z.ZodType, ...z.ZodType[]]);
    return description ? u.describe(description) : u;
  }
  const oneOf = `one of ${listWords(names)}`;
  return z.unknown().superRefine((value, ctx) => {
    const add = (p: IssuePayload, path: PropertyKey[] = []) => ctx.addIssue({ code: 'custom', message: encodeIssue(p), path, input: value });
    if (!isMapping(value)) {
      add({ m: `expected a ${what} (a mapping whose key is ${oneOf}), got ${describeValue(value)}`, f: `write it as "${names[0]}: ..."` });
      return;
    }
    const keys = Object.keys(value);
    const wholeKey = keys.find((k) => Object.hasOwn(whole, k));
    const known = keys.filter((k) => Object.hasOwn(variants, k));
    let schema: z.ZodType;
    let inner: unknown;
    let prefix: PropertyKey[];
    if (wholeKey !== undefined) {
      schema = whole[wholeKey];
      inner = value;
      prefix = [];
    } else if (known.length === 0) {
      const first = keys[0];
      if (first === undefined) {
        add({ m: `empty ${what}`, f: `write ${oneOf}` });
        return;
      }
      add({ m: `unknown ${what} "${first}"${didYouMean(first, names)}`, k: first, f: `a ${what} is ${oneOf}` });
      return;
    } else if (known.length > 1) {
      add({ m: `one ${what} per list item, but this item has ${listWords(known, 'and')}`, k: known[1], f: 'start each of them on its own line with "- "' });
      return;
    } else if (keys.length > 1) {
      const stray = keys.find((k) => k !== known[0]) as string;
      add({
        m: `"${stray}" is not a ${what}; it looks like a field of "${known[0]}"`,
        k: stray,
        f: `move it inside "${known[0]}:" (indent it under "${known[0]}", or put it in its braces)`,
      });
      return;
    } else {
      schema = variants[known[0]];
      inner = value[known[0]];
      prefix = [known[0]];
    }
    const r = schema.safeParse(inner, { error: humanErrorMap });
    if (!r.success) for (const i of r.error.issues) ctx.addIssue({ code: 'custom', message: i.message, path: [...prefix, ...i.path], input: inner });
  });
}
