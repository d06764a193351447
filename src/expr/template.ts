/** Log-line templates: literal text with `{expr}` holes (docs/expressions.md, "Log lines"). */
import { ExprError } from './errors.js';
import { lex } from './lexer.js';
import { parseRange } from './parser.js';
import type { Compiled, Template } from './types.js';

/**
 * Splits `"kept {p.id} at {now()}"` into text and compiled holes; `{{` and `}}` are literal
 * braces. Each hole's `source` is the whole template text and its offsets point into it, so
 * that parse and evaluation errors alike point into the log line; the hole's own text is
 * `source.slice(ast.start, ast.end)`.
 */
export function parseTemplate(text: string): Template {
  const parts: (string | Compiled)[] = [];
  let literal = '';
  let i = 0;
  while (i < text.length) {
    const c = text[i];
    if (c === '{' && text[i + 1] === '{') {
      literal += '{';
      i += 2;
    } else if (c === '}' && text[i + 1] === '}') {
      literal += '}';
      i += 2;
    } else if (c === '}') {
      throw new ExprError('parse', 'unmatched "}" in log text (write "}}" for a literal brace)', text, i, 1);
    } else if (c === '{') {
      const close = holeEnd(text, i + 1);
      if (close < 0) {
        // Report a broken string inside the hole first: it is the likelier cause.
        lex(text, i + 1, text.length);
        throw new ExprError('parse', 'unclosed "{" in log text (write "{{" for a literal brace)', text, i, 1);
      }
      if (text.slice(i + 1, close).trim() === '') {
        throw new ExprError('parse', 'empty "{}" in log text (put an expression inside, or write "{{}}")', text, i, close + 1 - i);
      }
      if (literal) parts.push(literal);
      literal = '';
      parts.push(parseRange(text, i + 1, close));
      i = close + 1;
    } else {
      literal += c;
      i++;
    }
  }
  if (literal) parts.push(literal);
  return { parts };
}

/** Offset of the "}" closing a hole that starts at `from`, skipping quoted strings; -1 if none. */
function holeEnd(text: string, from: number): number {
  let quote = '';
  for (let i = from; i < text.length; i++) {
    const c = text[i];
    if (quote) {
      if (c === '\\') i++;
      else if (c === quote) quote = '';
    } else if (c === '"' || c === "'") quote = c;
    else if (c === '}') return i;
  }
  return -1;
}
