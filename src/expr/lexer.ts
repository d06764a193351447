/** Splits expression text into tokens, refusing anything outside the language with a hint. */
import { ExprError } from './errors.js';

/** One token; `start`/`end` are offsets into the whole source text. */
export interface Token {
  readonly kind: 'number' | 'string' | 'name' | 'punct' | 'end';
  /** Raw source text of the token. */
  readonly text: string;
  /** Decoded value of a number or string token. */
  readonly value?: number | string;
  readonly start: number;
  readonly end: number;
}

const PUNCT = ['==', '!=', '<=', '>=', '&&', '||', '(', ')', '[', ']', '.', ',', '?', ':', '+', '-', '*', '/', '%', '!', '<', '>'];

/** Character sequences from other languages that get a specific hint instead of "unexpected". */
const REFUSED: readonly (readonly [string, string])[] = [
  ['===', 'there is no "===": write "==" (comparisons never convert types)'],
  ['!==', 'there is no "!==": write "!=" (comparisons never convert types)'],
  ['=>', 'arrow functions are not part of expressions'],
  ['**', 'there is no "**" operator'],
  ['=', 'assignment is not allowed: write "==" to compare'],
  ['&', 'there is no "&": write "&&"'],
  ['|', 'there is no "|": write "||"'],
  ['`', 'template strings are not supported: join strings with +'],
  [';', 'only one expression is allowed (no ";")'],
  ['{', 'braces are not part of expressions'],
  ['}', 'braces are not part of expressions'],
];

/** Entries grouped by first character, longest first, so the lexer tries only a few per position. */
function byFirstChar<T>(items: readonly T[], text: (item: T) => string): ReadonlyMap<string, readonly T[]> {
  const map = new Map<string, T[]>();
  for (const item of items) {
    const key = text(item)[0];
    map.set(key, [...(map.get(key) ?? []), item].sort((a, b) => text(b).length - text(a).length));
  }
  return map;
}
const PUNCT_AT = byFirstChar(PUNCT, (p) => p);
const REFUSED_AT = byFirstChar(REFUSED, ([text]) => text);

const ESCAPES: Readonly<Record<string, string>> = { '\\': '\\', "'": "'", '"': '"', n: '\n', t: '\t' };

const isDigit = (c: string): boolean => c >= '0' && c <= '9';
const isNameStart = (c: string): boolean => (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c === '_';
const isNameChar = (c: string): boolean => isNameStart(c) || isDigit(c);

/**
 * Tokens of `source[start, end)`, ending with an `end` token.
 *
 * Names are `[A-Za-z_][A-Za-z0-9_]*`. Node ids may contain "-" (`north-gate`), but a name
 * cannot, because `a-b` must stay a subtraction: a node id with a dash is written as a
 * string (`'north-gate'`).
 */
export function lex(source: string, start = 0, end = source.length): Token[] {
  const tokens: Token[] = [];
  const fail = (detail: string, at: number, length: number): never => {
    throw new ExprError('parse', detail, source, at, length);
  };
  let i = start;
  while (i < end) {
    const c = source[i];
    if (c === ' ' || c === '\t' || c === '\n' || c === '\r') {
      i++;
      continue;
    }
    const from = i;
    const prev = tokens[tokens.length - 1];
    // ".5" is a number only where an operand may start; after an operand "." is member access.
    const operandEnded = prev !== undefined && (prev.kind !== 'punct' || prev.text === ')' || prev.text === ']');
    if (isDigit(c) || (c === '.' && i + 1 < end && isDigit(source[i + 1]) && !operandEnded)) {
      while (i < end && isDigit(source[i])) i++;
      if (source[i] === '.' && i + 1 < end && isDigit(source[i + 1])) {
        i++;
        while (i < end && isDigit(source[i])) i++;
      }
      if ((source[i] === 'e' || source[i] === 'E') && i + 1 < end) {
        let j = i + 1;
        if (source[j] === '+' || source[j] === '-') j++;
        if (j < end && isDigit(source[j])) {
          i = j;
          while (i < end && isDigit(source[i])) i++;
        }
      }
      if (i < end && (isNameChar(source[i]) || (source[i] === '.' && isDigit(source[i + 1] ?? '')))) {
        let j = i;
        while (j < end && (isNameChar(source[j]) || source[j] === '.')) j++;
        fail(`invalid number "${source.slice(from, j)}"`, from, j - from);
      }
      const text = source.slice(from, i);
      const value = Number(text);
      if (!Number.isFinite(value)) fail(`number "${text}" is too large`, from, i - from);
      // "1e-400" would silently be 0: a number too small to hold is as wrong as one too large
      if (value === 0 && /[1-9]/.test(text.replace(/[eE].*$/, ''))) fail(`number "${text}" is too small: it rounds to 0`, from, i - from);
      tokens.push({ kind: 'number', text, value, start: from, end: i });
      continue;
    }
    if (isNameStart(c)) {
      while (i < end && isNameChar(source[i])) i++;
      tokens.push({ kind: 'name', text: source.slice(from, i), start: from, end: i });
      continue;
    }
    if (c === '"' || c === "'") {
      i = lexString(source, from, end, tokens, fail);
      continue;
    }
    const refused = REFUSED_AT.get(c)?.find(([text]) => source.startsWith(text, i) && i + text.length <= end);
    const punct = PUNCT_AT.get(c)?.find((p) => source.startsWith(p, i) && i + p.length <= end);
    // "!==" and "===" must be refused before "!=" and "==" match; "=" only when no "==" or "<=" etc.
    if (refused && (!punct || refused[0].length > punct.length)) fail(refused[1], i, refused[0].length);
    if (punct) {
      tokens.push({ kind: 'punct', text: punct, start: i, end: i + punct.length });
      i += punct.length;
      continue;
    }
    const cp = source.codePointAt(i) ?? 0;
    const ch = String.fromCodePoint(cp);
    fail(`unexpected character "${ch}"`, i, ch.length);
  }
  tokens.push({ kind: 'end', text: '', start: end, end });
  return tokens;
}

function lexString(
  source: string,
  from: number,
  end: number,
  tokens: Token[],
  fail: (detail: string, at: number, length: number) => never,
): number {
  const quote = source[from];
  let i = from + 1;
  let value = '';
  for (;;) {
    if (i >= end || source[i] === '\n') {
      return fail(`unterminated string (missing closing ${quote})`, from, i - from);
    }
    const c = source[i];
    if (c === quote) break;
    if (c === '\\') {
      const next = i + 1 < end ? source[i + 1] : '';
      const decoded = Object.hasOwn(ESCAPES, next) ? ESCAPES[next] : undefined;
      if (decoded === undefined) {
        fail(`unknown escape "\\${next}" in string (allowed: \\\\ \\' \\" \\n \\t)`, i, next ? 2 : 1);
      }
      value += decoded;
      i += 2;
      continue;
    }
    value += c;
    i++;
  }
  tokens.push({ kind: 'string', text: source.slice(from, i + 1), value, start: from, end: i + 1 });
  return i + 1;
}
