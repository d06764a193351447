/**
 * A small JSON Schema (draft 2020-12 subset) validator, written for the tests so the emitted
 * schemas are checked by something other than the library that made them. It refuses
 * keywords it does not know, so it can never pass a document by ignoring a rule.
 */
type Schema = boolean | Record<string, unknown>;

const ANNOTATIONS = new Set(['$schema', '$id', 'title', 'description', 'default', 'examples', '$defs', 'definitions']);
const KNOWN = new Set([
  ...ANNOTATIONS,
  '$ref',
  'type',
  'const',
  'enum',
  'pattern',
  'minimum',
  'maximum',
  'exclusiveMinimum',
  'exclusiveMaximum',
  'minLength',
  'maxLength',
  'minItems',
  'maxItems',
  'items',
  'prefixItems',
  'properties',
  'required',
  'additionalProperties',
  'propertyNames',
  'anyOf',
  'oneOf',
  'allOf',
]);

function typeOf(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'array';
  if (typeof v === 'number') return Number.isInteger(v) ? 'integer' : 'number';
  return typeof v;
}

function typeMatches(want: string, v: unknown): boolean {
  const got = typeOf(v);
  return want === got || (want === 'number' && got === 'integer');
}

/** Problems found validating `value` against `schema` (empty when valid), each with its JSON path. */
export function validateJson(root: Schema, value: unknown): string[] {
  const errors: string[] = [];
  const resolve = (ref: string): Schema => {
    if (ref === '#') return root;
    const m = /^#\/(\$defs|definitions)\/(.+)$/.exec(ref);
    const defs = typeof root === 'object' ? (root[m?.[1] ?? ''] as Record<string, Schema> | undefined) : undefined;
    if (!m || !defs || !(m[2] in defs)) throw new Error(`unresolvable $ref ${ref}`);
    return defs[m[2]];
  };
  const check = (s: Schema, v: unknown, path: string): boolean => {
    const before = errors.length;
    const fail = (msg: string) => errors.push(`${path || '/'}: ${msg}`);
    if (s === true) return true;
    if (s === false) {
      fail('no value allowed');
      return false;
    }
    for (const k of Object.keys(s)) if (!KNOWN.has(k)) throw new Error(`unsupported keyword ${k} at ${path}`);
    if (typeof s.$ref === 'string') check(resolve(s.$ref), v, path);
    if (s.type !== undefined) {
      const types = Array.isArray(s.type) ? (s.type as string[]) : [s.type as string];
      if (!types.some((t) => typeMatches(t, v))) fail(`expected ${types.join('|')}, got ${typeOf(v)}`);
    }
    if ('const' in s && JSON.stringify(s.const) !== JSON.stringify(v)) fail(`expected ${JSON.stringify(s.const)}`);
    if (Array.isArray(s.enum) && !s.enum.some((e) => JSON.stringify(e) === JSON.stringify(v))) fail(`not one of ${JSON.stringify(s.enum)}`);
    if (typeof v === 'string') {
      if (typeof s.pattern === 'string' && !new RegExp(s.pattern, 'u').test(v)) fail(`does not match ${s.pattern}`);
      if (typeof s.minLength === 'number' && v.length < s.minLength) fail('too short');
      if (typeof s.maxLength === 'number' && v.length > s.maxLength) fail('too long');
    }
    if (typeof v === 'number') {
      if (typeof s.minimum === 'number' && v < s.minimum) fail(`below ${s.minimum}`);
      if (typeof s.maximum === 'number' && v > s.maximum) fail(`above ${s.maximum}`);
      if (typeof s.exclusiveMinimum === 'number' && v <= s.exclusiveMinimum) fail(`not above ${s.exclusiveMinimum}`);
      if (typeof s.exclusiveMaximum === 'number' && v >= s.exclusiveMaximum) fail(`not below ${s.exclusiveMaximum}`);
    }
    if (Array.isArray(v)) {
      if (typeof s.minItems === 'number' && v.length < s.minItems) fail(`fewer than ${s.minItems} items`);
      if (typeof s.maxItems === 'number' && v.length > s.maxItems) fail(`more than ${s.maxItems} items`);
      const prefix = (s.prefixItems as Schema[] | undefined) ?? [];
      v.forEach((item, i) => {
        if (i < prefix.length) check(prefix[i], item, `${path}/${i}`);
        else if (s.items !== undefined) check(s.items as Schema, item, `${path}/${i}`);
      });
    }
    if (typeOf(v) === 'object') {
      const obj = v as Record<string, unknown>;
      const props = (s.properties as Record<string, Schema> | undefined) ?? {};
      for (const r of (s.required as string[] | undefined) ?? []) if (!(r in obj)) fail(`missing ${r}`);
      for (const [k, item] of Object.entries(obj)) {
        if (s.propertyNames !== undefined) check(s.propertyNames as Schema, k, `${path}/${k} (name)`);
        if (k in props) check(props[k], item, `${path}/${k}`);
        else if (s.additionalProperties !== undefined) check(s.additionalProperties as Schema, item, `${path}/${k}`);
      }
    }
    const branches = (key: string) => (s[key] as Schema[] | undefined) ?? [];
    const trial = (b: Schema) => {
      const mark = errors.length;
      const ok = check(b, v, path);
      errors.length = mark;
      return ok;
    };
    if (s.anyOf !== undefined && !branches('anyOf').some(trial)) fail('matches no anyOf branch');
    if (s.oneOf !== undefined && branches('oneOf').filter(trial).length !== 1) fail('does not match exactly one oneOf branch');
    for (const b of branches('allOf')) check(b, v, path);
    return errors.length === before;
  };
  check(root, value, '');
  return errors;
}
