import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { baseFunctions, evaluate, ExprError, makeScope, parseExpr, type ExprFunction, type Scope, type Value } from '../../src/expr/index.js';

const scope = makeScope({ m: { pair: 'weir~loft#1' }, x: { y: 1 }, xs: [1, 2] });

function failure(src: string, s: Scope = scope): ExprError {
  try {
    evaluate(parseExpr(src), s);
  } catch (e) {
    if (e instanceof ExprError) return e;
    throw e;
  }
  throw new Error(`expected ${src} to be refused`);
}

describe('names that reach prototypes are refused at parse time', () => {
  for (const name of ['__proto__', 'prototype', 'constructor', 'this']) {
    it(`as a name: ${name}`, () => {
      const e = failure(name);
      expect(e.kind).toBe('parse');
      expect(e.detail).toBe(`name "${name}" is not allowed in expressions`);
    });
    if (name !== 'this') {
      it(`as a field: m.${name}`, () => {
        const e = failure(`m.${name}`);
        expect(e.kind).toBe('parse');
        expect(e.detail).toBe(`field "${name}" is not allowed in expressions`);
        expect([e.offset, e.length]).toEqual([2, name.length]);
      });
    }
  }

  it('refuses this.x and a call named constructor', () => {
    expect(failure('this.x').detail).toBe('name "this" is not allowed in expressions');
    expect(failure('constructor(1)').detail).toBe('name "constructor" is not allowed in expressions');
  });

  it('refuses the classic escape x.constructor.constructor("...")()', () => {
    const e = failure('x.constructor.constructor("return process")()');
    expect(e.kind).toBe('parse');
    expect(e.detail).toBe('field "constructor" is not allowed in expressions');
  });

  it('refuses string-keyed indexing such as a["constructor"]', () => {
    const e = failure('x["constructor"]');
    expect(e.kind).toBe('parse');
    expect(e.detail).toContain('not with a string index');
  });

  it('refuses calling a field, as in m.toString()', () => {
    const e = failure('m.toString()');
    expect(e.kind).toBe('parse');
    expect(e.detail).toBe('only a function name can be called (found a call on `m.toString`)');
  });
});

describe('inherited properties are never read or called', () => {
  for (const name of ['toString', 'hasOwnProperty', 'valueOf']) {
    it(`${name} as a function is unknown`, () => {
      const e = failure(`${name}()`);
      expect(e.kind).toBe('eval');
      expect(e.detail).toMatch(new RegExp(`^unknown function "${name}"`));
    });
    it(`${name} as a name is unknown`, () => {
      const e = failure(name);
      expect(e.kind).toBe('eval');
      expect(e.detail).toBe(`unknown name "${name}"`);
    });
    it(`${name} as a field of a record without it is an error, not a function`, () => {
      const e = failure(`m.${name}`);
      expect(e.kind).toBe('eval');
      expect(e.detail).toBe(`no field "${name}" in \`m\` (its fields: pair)`);
    });
  }

  it('ignores a careless scope that hands back inherited functions', () => {
    const bag: Record<string, unknown> = { a: 1 };
    // A scope written the naive way, reading through the prototype chain.
    const naive: Scope = { lookup: (n) => bag[n] as Value | undefined, functions: baseFunctions };
    expect(evaluate(parseExpr('a'), naive)).toBe(1);
    expect(failure('hasOwnProperty', naive).detail).toBe('unknown name "hasOwnProperty"');
    expect(failure('toString', naive).detail).toBe('unknown name "toString"');
  });

  it('does not read fields from a prototype or fields holding functions', () => {
    const inherited = Object.create({ secret: 42 }) as Record<string, Value>;
    const withFn = { run: () => 1, ok: 2 } as unknown as Value;
    const s = makeScope({ o: inherited, r: withFn });
    expect(failure('o.secret', s).detail).toBe('no field "secret" in `o` (it has no fields)');
    expect(failure('r.run', s).detail).toBe('field "run" of `r` holds no value');
    expect(evaluate(parseExpr('r.ok'), s)).toBe(2);
  });

  it('only calls own properties of scope.functions', () => {
    const fns = Object.create({ evil: () => 'escaped' }) as Record<string, ExprFunction>;
    fns.good = () => 'fine';
    const s = makeScope({}, fns);
    expect(evaluate(parseExpr('good()'), s)).toBe('fine');
    expect(failure('evil()', s).detail).toBe('unknown function "evil" (available: good)');
  });

  it('does not see globals', () => {
    for (const name of ['globalThis', 'process', 'require', 'Math', 'eval', 'Function']) {
      expect(failure(name).detail).toBe(`unknown name "${name}"`);
    }
    expect(failure('eval("1")').detail).toMatch(/^unknown function "eval"/);
    expect(failure('Function("return 1")').detail).toMatch(/^unknown function "Function"/);
  });
});

describe('the sources', () => {
  it('contain no eval( and no Function( anywhere in src/', () => {
    const root = fileURLToPath(new URL('../../src', import.meta.url));
    const offenders: string[] = [];
    let files = 0;
    const visit = (dir: string): void => {
      for (const entry of readdirSync(dir, { withFileTypes: true })) {
        const path = join(dir, entry.name);
        if (entry.isDirectory()) visit(path);
        else if (/\.(ts|tsx|js|mjs)$/.test(entry.name)) {
          files++;
          const text = readFileSync(path, 'utf8');
          if (/\beval\s*\(|\bFunction\s*\(/.test(text)) offenders.push(path);
        }
      }
    };
    visit(root);
    expect(files).toBeGreaterThan(5);
    expect(offenders).toEqual([]);
  });
});
