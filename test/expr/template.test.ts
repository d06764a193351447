import { describe, expect, it } from 'vitest';
import { baseFunctions, evaluate, ExprError, makeScope, parseTemplate, type Compiled, type Value } from '../../src/expr/index.js';

const scope = makeScope({ p: { id: 'mill~quay#12' }, n: 3 }, { ...baseFunctions, now: () => 1500 });

/** The template with every hole replaced by its value, to compare with the intended line. */
function render(text: string): string {
  return parseTemplate(text)
    .parts.map((part) => (typeof part === 'string' ? part : String(evaluate(part, scope) as Value)))
    .join('');
}

function templateError(text: string): ExprError {
  try {
    parseTemplate(text);
  } catch (e) {
    if (e instanceof ExprError) return e;
    throw e;
  }
  throw new Error(`expected ${text} to be refused`);
}

describe('parseTemplate', () => {
  it('splits text and holes in order', () => {
    const { parts } = parseTemplate('kept {p.id} at {now()}');
    expect(parts.length).toBe(4);
    expect(parts[0]).toBe('kept ');
    expect(parts[2]).toBe(' at ');
    const hole = parts[1] as Compiled;
    expect(hole.source.slice(hole.ast.start, hole.ast.end)).toBe('p.id');
    expect(hole.names).toEqual(['p']);
    expect((parts[3] as Compiled).calls).toEqual(['now']);
    expect(render('kept {p.id} at {now()}')).toBe('kept mill~quay#12 at 1500');
  });

  it('keeps holes whose strings contain braces, and spaces inside holes', () => {
    expect(render(`{ '}' + '{' } and { n + 1 }`)).toBe('}{ and 4');
  });

  it('reads {{ and }} as literal braces', () => {
    expect(parseTemplate('set {{a}} is {n}').parts[0]).toBe('set {a} is ');
    expect(render('{{{n}}}')).toBe('{3}');
    expect(parseTemplate('{{}}').parts).toEqual(['{}']);
  });

  it('gives plain text as one part and empty text as none', () => {
    expect(parseTemplate('no holes here').parts).toEqual(['no holes here']);
    expect(parseTemplate('').parts).toEqual([]);
  });

  it('refuses unmatched, unclosed and empty braces, with offsets into the whole text', () => {
    const lone = templateError('done } now');
    expect([lone.detail, lone.offset, lone.col]).toEqual(['unmatched "}" in log text (write "}}" for a literal brace)', 5, 6]);
    const open = templateError('kept {p.id');
    expect([open.detail, open.offset, open.length]).toEqual(['unclosed "{" in log text (write "{{" for a literal brace)', 5, 1]);
    const hollow = templateError('x { } y');
    expect([hollow.detail, hollow.offset, hollow.length]).toEqual(['empty "{}" in log text (put an expression inside, or write "{{}}")', 2, 3]);
  });

  it('reports errors inside a hole at their place in the whole text', () => {
    const e = templateError('kept {p.id +} ok');
    expect(e.kind).toBe('parse');
    expect(e.source).toBe('kept {p.id +} ok');
    expect([e.message, e.offset]).toEqual(['unexpected end of expression at 1:13', 12]);
    const s = templateError(`kept {'abc}`);
    expect(s.message).toBe(`unterminated string (missing closing ') at 1:7`);
    const deep = templateError('line one\nline {n ) 2}');
    expect([deep.line, deep.col, deep.detail]).toEqual([2, 9, 'unexpected ")" after a complete expression']);
  });

  it('reports evaluation errors of a hole at their place in the whole text', () => {
    const { parts } = parseTemplate('kept {p.id} for {fenn}');
    try {
      evaluate(parts[3] as Compiled, scope);
      expect.unreachable();
    } catch (e) {
      if (!(e instanceof ExprError)) throw e;
      expect([e.kind, e.detail, e.offset, e.col]).toEqual(['eval', 'unknown name "fenn"', 17, 18]);
    }
  });
});
