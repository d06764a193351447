/**
 * Reference tables of the file formats, read from the same zod schemas that validate the
 * files and print `bellstep schema`: every key, whether it is required, and what it is.
 */
import type { z } from 'zod';
import { programJson } from '../../model/schema-program.js';
import { noiseJson } from '../../model/schema-noise.js';

interface Def {
  readonly type: string;
  readonly innerType?: z.ZodType;
  readonly shape?: Record<string, z.ZodType>;
  readonly options?: readonly z.ZodType[];
  readonly valueType?: z.ZodType;
  readonly element?: z.ZodType;
  readonly items?: readonly z.ZodType[];
  readonly entries?: Record<string, string>;
  readonly values?: readonly unknown[];
}

function def(s: z.ZodType): Def {
  return (s as unknown as { _zod: { def: Def } })._zod.def;
}

/** The schema inside optional wrappers. */
function unwrap(s: z.ZodType): z.ZodType {
  let x = s;
  while (def(x).type === 'optional' || def(x).type === 'default') x = def(x).innerType as z.ZodType;
  return x;
}

function optional(s: z.ZodType): boolean {
  return def(s).type === 'optional';
}

/** What values a field takes, in a few words: `one of x, y` for an enum. */
function takes(s: z.ZodType): string {
  const d = def(unwrap(s));
  if (d.type === 'enum') return ` One of ${Object.values(d.entries ?? {}).map((v) => `\`${v}\``).join(', ')}.`;
  return '';
}

/** A field's description (set inside or outside its optional wrapper), and the values it takes. */
function about(s: z.ZodType): string {
  return `${unwrap(s).description ?? s.description ?? ''}${takes(s)}`.trim();
}

/** A table cell: no pipes or newlines. */
function cell(text: string): string {
  return text.replace(/\|/g, '\\|').replace(/\s*\n\s*/g, ' ');
}

/** One row per key of an object schema, with its path prefixed. */
function objectRows(prefix: string, s: z.ZodType, skip: ReadonlySet<string> = new Set()): string[] {
  const shape = def(unwrap(s)).shape ?? {};
  return Object.entries(shape)
    .filter(([k]) => !skip.has(k))
    .map(([k, v]) => `| \`${prefix}${k}\` | ${optional(v) ? 'no' : 'yes'} | ${cell(about(v))} |`);
}

const HEAD = '| key | required | what it is |\n|---|---|---|';

/** The keys of a program set, down to rules (guards and steps have their own tables). */
export function programSetKeys(): string {
  const top = programJson.programSet as z.ZodType;
  const shape = def(unwrap(top)).shape ?? {};
  const listOf = (k: string) => def(unwrap(shape[k])).element as z.ZodType;
  const recordOf = (k: string) => def(unwrap(shape[k])).valueType as z.ZodType;
  const role = recordOf('roles');
  const program = recordOf('programs');
  const rule = def(unwrap(def(unwrap(role)).shape!.rules)).element as z.ZodType;
  const useEntry = def(unwrap(def(unwrap(program)).shape!.use)).element as z.ZodType;
  const withArgs = (def(unwrap(useEntry)).options ?? []).find((o) => def(unwrap(o)).type === 'object') as z.ZodType;
  return [
    HEAD,
    ...objectRows('', top),
    ...objectRows('nodes[].', listOf('nodes')),
    ...objectRows('links[].', listOf('links')),
    ...objectRows('roles.ROLE.', role),
    ...objectRows('programs.NODE.', program),
    ...objectRows('programs.NODE.use[].', withArgs),
    ...objectRows('…rules[].', rule),
  ].join('\n');
}

/** The example of each guard and step, which the docs test loads to show it is accepted. */
export interface ItemDoc {
  readonly example: string;
}

/** One table of the one-key items (guards or steps) of a union schema, each field on a row. */
function itemTable(union: z.ZodType, examples: Readonly<Record<string, ItemDoc>>, what: string): string {
  const rows: string[] = [`| ${what} | field | required | what it is |`, '|---|---|---|---|'];
  for (const option of def(unwrap(union)).options ?? []) {
    const shape = def(unwrap(option)).shape ?? {};
    const keys = Object.keys(shape);
    // a one-key mapping names the item; an item that owns its whole mapping (if) is its keys
    const name = keys.length === 1 ? keys[0] : keys[0];
    if (!(name in examples)) throw new Error(`the reference has no example of the ${what} "${name}"`);
    const body = keys.length === 1 ? shape[name] : option;
    const inner = def(unwrap(body));
    if (inner.type === 'object' && keys.length === 1) {
      rows.push(`| \`${name}\` | | | ${cell(about(body))} E.g. \`${cell(examples[name].example)}\` |`);
      for (const [k, v] of Object.entries(inner.shape ?? {})) rows.push(`| | \`${k}\` | ${optional(v) ? 'no' : 'yes'} | ${cell(about(v))} |`);
    } else if (keys.length > 1) {
      rows.push(`| \`${name}\` | | | ${cell(about(option))} E.g. \`${cell(examples[name].example)}\` |`);
      for (const [k, v] of Object.entries(shape)) rows.push(`| | \`${k}\` | ${optional(v) ? 'no' : 'yes'} | ${cell(about(v))} |`);
    } else {
      rows.push(`| \`${name}\` | (its value) | yes | ${cell(about(body))} E.g. \`${cell(examples[name].example)}\` |`);
    }
  }
  for (const name of Object.keys(examples)) {
    if (!rows.some((r) => r.startsWith(`| \`${name}\` |`))) throw new Error(`the reference has an example of "${name}", which is no ${what}`);
  }
  return rows.join('\n');
}

/** An example of every guard; each must load (test/docs/reference.test.ts). */
export const GUARD_EXAMPLES: Readonly<Record<string, ItemDoc>> = {
  have: { example: 'have: {partner: mill, stage: waiting, min_wait: 3 ms, as: keep}' },
  got: { example: 'got: {from: mill, kind: verdict, as: v}' },
  check: { example: 'check: "v.pair == keep.id"' },
};

/** An example of every step; each must load (test/docs/reference.test.ts). */
export const STEP_EXAMPLES: Readonly<Record<string, ItemDoc>> = {
  gate: { example: 'gate: {op: rx, on: keep, angle: "pi / 2"}' },
  measure: { example: 'measure: {on: probe, basis: z, as: bit}' },
  bell_measure: { example: 'bell_measure: {on: [keep, probe], as: [zb, xb]}' },
  send: { example: 'send: {to: mill, kind: parity, pair: keep.id, data: {bit: 1}}' },
  stage: { example: 'stage: {pair: keep, to: waiting}' },
  note: { example: 'note: {pair: keep, set: {round: 1}}' },
  correct: { example: 'correct: {pair: keep, x: 1, z: 0}' },
  rebind: { example: 'rebind: {pair: keep, partner: mill, id: "join(keep.id, probe.id)"}' },
  discard: { example: 'discard: probe' },
  deliver: { example: 'deliver: keep' },
  log: { example: 'log: "kept {keep.id} for {waited(keep)} ns"' },
  if: { example: 'if: "bit == 1"' },
};

/** The guards with every field. */
export function guardTable(): string {
  return itemTable(programJson.guard as z.ZodType, GUARD_EXAMPLES, 'guard');
}

/** The steps with every field. */
export function stepTable(): string {
  return itemTable(programJson.step as z.ZodType, STEP_EXAMPLES, 'step');
}

/** Every key of a noise model, with its path. */
export function noiseKeys(): string {
  const rows: string[] = [HEAD];
  // `choice`: the keys of this mapping are alternatives (one of werner, bit_flip, ...)
  const walk = (prefix: string, s: z.ZodType, choice = false): void => {
    const d = def(unwrap(s));
    if (d.type === 'object') {
      for (const [k, v] of Object.entries(d.shape ?? {})) {
        rows.push(`| \`${prefix}${k}\` | ${choice ? 'one of these' : optional(v) ? 'no' : 'yes'} | ${cell(about(v))} |`);
        walk(`${prefix}${k}.`, v);
      }
    } else if (d.type === 'record') walk(`${prefix}${prefix.startsWith('links') ? 'LINK' : 'NODE'}.`, d.valueType as z.ZodType);
    else if (d.type === 'array') walk(`${prefix.replace(/\.$/, '')}[].`, d.element as z.ZodType);
    else if (d.type === 'union') {
      // a mapping with one key that says what it is (a pair state, a fault): each variant's keys
      const objects = (d.options ?? []).filter((o) => def(unwrap(o)).type === 'object');
      for (const o of objects) walk(prefix, o, objects.every((x) => Object.keys(def(unwrap(x)).shape ?? {}).length === 1));
    }
  };
  walk('', noiseJson.noise as z.ZodType);
  // keys reached through more than one variant are listed once
  return [...new Set(rows)].join('\n');
}
