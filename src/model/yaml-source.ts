/**
 * A parsed YAML file that still knows where everything came from: values are read from
 * plain JavaScript, positions from the YAML syntax tree, both addressed by the same path.
 */
import { isMap, isPair, isScalar, isSeq, LineCounter, parseDocument, visit, type Document, type Node, type Pair, type Scalar, type YAMLMap } from 'yaml';
import { InputError, InputErrors } from './errors.js';
import type { SourcePos } from './types.js';

/** One step of a path into a YAML value: a mapping key or a list index. */
export type PathPart = string | number;
export type Path = readonly PathPart[];

/**
 * The most marks that start YAML entries (`:` `-` `,` `[` `{`, counted anywhere in the text)
 * a file may hold. Parsing keeps a syntax tree with positions, about a kilobyte per entry,
 * so a file within the size limit but made of tiny entries could exhaust memory; this bound
 * keeps a parse under a few hundred megabytes, far beyond any real network.
 */
export const MAX_YAML_MARKS = 400_000;
/** The deepest nesting of lists and mappings a file may have (real files nest about 12 deep). */
export const MAX_YAML_DEPTH = 64;

/** Counts the marks of MAX_YAML_MARKS, stopping once past `limit`. */
function countMarks(text: string, limit: number): number {
  let n = 0;
  for (let i = 0; i < text.length && n <= limit; i++) {
    const c = text.charCodeAt(i);
    // : - , [ {
    if (c === 58 || c === 45 || c === 44 || c === 91 || c === 123) n++;
  }
  return n;
}

/** The first collection nested deeper than `max`, found without recursion. */
function tooDeep(root: unknown, max: number): Node | undefined {
  const stack: [unknown, number][] = [[root, 0]];
  while (stack.length > 0) {
    const [node, depth] = stack.pop()!;
    if (isMap(node) || isSeq(node)) {
      if (depth > max) return node as Node;
      for (const item of node.items) {
        if (isPair(item)) stack.push([item.value, depth + 1]);
        else stack.push([item, depth + 1]);
      }
    }
  }
  return undefined;
}

/** Keys that could reach JavaScript object internals if they ever became property names. */
const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/** Dotted field name for messages, e.g. `programs.mill.rules[1].when[0].got.kind`. */
export function fieldName(path: Path): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out ? `.${part}` : part;
  }
  return out;
}

const YAML_FIXES: Partial<Record<string, string>> = {
  DUPLICATE_KEY: 'each key may appear once in a mapping; remove or rename one of them',
  TAB_AS_INDENT: 'YAML is indented with spaces, never tabs',
  BAD_INDENT: 'line the entries of a list or mapping up at the same indentation',
  MULTIPLE_DOCS: 'keep one document per file (remove the extra "---")',
  MISSING_CHAR: 'close the bracket, brace or quote that was opened',
};

/** The mapping key written at `offset` (yaml reports only its first character). */
function keyText(text: string, offset: number): string {
  const m = /^(?:"((?:[^"\\]|\\.)*)"|'([^']*)'|([^:\n,{}]+))/.exec(text.slice(offset));
  return (m?.[1] ?? m?.[2] ?? m?.[3] ?? '').trim();
}

/** The path of the mapping holding the key that starts at `offset`, and the key. */
function duplicateAt(node: unknown, offset: number, path: readonly PathPart[]): { path: Path; key: string } | undefined {
  if (isMap(node)) {
    for (const pair of node.items) {
      if (!isScalar(pair.key)) continue;
      const key = String(pair.key.value);
      if (pair.key.range?.[0] === offset) return { path, key };
      const inner = duplicateAt(pair.value, offset, [...path, key]);
      if (inner) return inner;
    }
  } else if (isSeq(node)) {
    for (let i = 0; i < node.items.length; i++) {
      const inner = duplicateAt(node.items[i], offset, [...path, i]);
      if (inner) return inner;
    }
  }
  return undefined;
}

/** A message for a key written twice in one mapping, when the file kind knows better than "duplicate key". */
export type DuplicateKeyHook = (doc: Document.Parsed, mapping: Path, key: string) => { message: string; fix: string } | undefined;

/** A YAML problem that belongs to the whole file (shown at its first line). */
function wholeFileError(file: string, message: string, fix: string): InputErrors {
  return new InputErrors([new InputError({ code: 'yaml', file, line: 1, col: 1, message, fix })]);
}

/** A YAML document with its line index and its value as plain data. */
export class SourceDoc {
  private constructor(
    readonly file: string,
    readonly text: string,
    readonly doc: Document.Parsed,
    private readonly lines: LineCounter,
    /** The document as plain data (mappings as objects, lists as arrays). */
    readonly value: unknown,
  ) {}

  /** Parses `text`; YAML syntax errors, an empty file, a non-mapping top level and forbidden keys throw. */
  static parse(file: string, text: string, onDuplicate?: DuplicateKeyHook): SourceDoc {
    const marks = countMarks(text, MAX_YAML_MARKS);
    if (marks > MAX_YAML_MARKS) {
      throw wholeFileError(
        file,
        `the file has more than ${MAX_YAML_MARKS.toLocaleString('en-US')} YAML entries (marks ":", "-", ",", "[" and "{"), more than bellstep loads`,
        'check that this is the right file; a network this large is better written with roles, which state shared rules once',
      );
    }
    const lines = new LineCounter();
    const doc = parseDocument(text, { lineCounter: lines, prettyErrors: false, uniqueKeys: true, version: '1.2' });
    const at = (offset: number): SourcePos => ({ file, ...lines.linePos(offset) });
    const problems = [...doc.errors, ...doc.warnings];
    if (problems.length > 0) {
      throw new InputErrors(
        problems.map((e) => {
          const key = e.code === 'DUPLICATE_KEY' ? keyText(text, e.pos[0]) : '';
          const message = e.code === 'DUPLICATE_KEY' && key ? `duplicate key "${key}"` : `YAML: ${e.message}`;
          const fix = YAML_FIXES[e.code] ?? 'check the YAML syntax here (indentation, quotes, brackets, a missing ":")';
          const dup = e.code === 'DUPLICATE_KEY' ? duplicateAt(doc.contents, e.pos[0], []) : undefined;
          const better = dup && onDuplicate?.(doc, dup.path, dup.key);
          // the parser's own recursion gives out on very deep nesting
          if (/call stack/i.test(e.message)) {
            return InputError.at(at(e.pos[0]), { code: 'yaml', message: `the file is nested too deeply to read (more than ${MAX_YAML_DEPTH} levels of lists and mappings)`, fix: 'flatten it; no bellstep file needs deep nesting' });
          }
          return InputError.at(at(e.pos[0]), {
            code: e.code === 'DUPLICATE_KEY' ? 'duplicate' : 'yaml',
            ...(dup ? { field: fieldName([...dup.path, dup.key]) } : {}),
            message: better?.message ?? message,
            fix: better?.fix ?? fix,
          });
        }),
      );
    }
    if (doc.contents === null || (isScalar(doc.contents) && doc.contents.value === null)) {
      throw new InputErrors([
        new InputError({ code: 'format', file, line: 1, col: 1, message: 'the file is empty', fix: 'start the file with its "format:" line' }),
      ]);
    }
    if (!isMap(doc.contents)) {
      const got = isSeq(doc.contents) ? 'a list' : 'a single value';
      throw new InputErrors([
        InputError.at(at(doc.contents.range?.[0] ?? 0), {
          code: 'format',
          message: `expected a mapping of keys (format, ...) at the top of the file, got ${got}`,
          fix: 'write the file as "key: value" lines starting with "format:"',
        }),
      ]);
    }
    const deep = tooDeep(doc.contents, MAX_YAML_DEPTH);
    if (deep) {
      throw new InputErrors([
        InputError.at(at(deep.range?.[0] ?? 0), {
          code: 'yaml',
          message: `nested more than ${MAX_YAML_DEPTH} levels of lists and mappings deep`,
          fix: 'flatten it; no bellstep file needs deep nesting (an "if" inside an "if" inside ... can be one "if" with "&&")',
        }),
      ]);
    }
    SourceDoc.refuseForbiddenKeys(doc, at);
    SourceDoc.refuseUnholdableNumbers(doc, text, at);
    let value: unknown;
    try {
      value = doc.toJS({ maxAliasCount: 100 });
    } catch (err) {
      throw wholeFileError(file, `YAML: ${err instanceof Error ? err.message : String(err)}`, 'use fewer aliases (*name); write the values out instead');
    }
    return new SourceDoc(file, text, doc, lines, value);
  }

  private static refuseForbiddenKeys(doc: Document.Parsed, at: (offset: number) => SourcePos): void {
    const errors: InputError[] = [];
    visit(doc, {
      Pair(_, pair) {
        const key = pair.key;
        if (isScalar(key) && FORBIDDEN_KEYS.has(String(key.value))) {
          errors.push(
            InputError.at(at(key.range?.[0] ?? 0), {
              code: 'schema',
              message: `the key "${String(key.value)}" is not allowed`,
              fix: 'rename or remove it: bellstep refuses keys that name JavaScript object internals',
            }),
          );
        } else if (key !== null && !isScalar(key)) {
          errors.push(
            InputError.at(at((key as Node).range?.[0] ?? 0), {
              code: 'schema',
              message: 'a mapping key must be a plain word, not a list or mapping',
              fix: 'write the key as a name',
            }),
          );
        }
      },
    });
    if (errors.length > 0) throw new InputErrors(errors);
  }

  /** Numbers written with digits that a double cannot hold: "1e-400" (it would be 0) or "1e400". */
  private static refuseUnholdableNumbers(doc: Document.Parsed, text: string, at: (offset: number) => SourcePos): void {
    const errors: InputError[] = [];
    visit(doc, {
      Scalar(_, node) {
        if (typeof node.value !== 'number' || !node.range) return;
        const written = text.slice(node.range[0], node.range[1]).trim();
        const mantissa = written.replace(/[eE].*$/, '');
        let why: string | undefined;
        if (node.value === 0 && /[1-9]/.test(mantissa)) why = 'too small: it rounds to 0';
        else if (!Number.isFinite(node.value) && /[0-9]/.test(written)) why = 'too large to hold';
        if (why) {
          errors.push(InputError.at(at(node.range[0]), { code: 'schema', message: `the number ${written} is ${why}`, fix: 'write a number between about 1e-300 and 1e300 (or 0)' }));
        }
      },
    });
    if (errors.length > 0) throw new InputErrors(errors);
  }

  /** The position of an offset into the text. */
  at(offset: number): SourcePos {
    return { file: this.file, ...this.lines.linePos(offset) };
  }

  /** Each mapping's pairs by key (the first of equal keys), built on first use: a path lookup costs the same in a file of any size. */
  private readonly keyIndex = new WeakMap<object, Map<string, Pair>>();

  private pairOf(map: YAMLMap, key: string): Pair | undefined {
    let index = this.keyIndex.get(map);
    if (index === undefined) {
      index = new Map();
      for (const p of map.items) {
        if (!isPair(p) || !isScalar(p.key)) continue;
        const k = String(p.key.value);
        if (!index.has(k)) index.set(k, p);
      }
      this.keyIndex.set(map, index);
    }
    return index.get(key);
  }

  /** The deepest syntax node along `path`, and whether the whole path was found. */
  nodeAt(path: Path): { node: Node; exact: boolean } {
    let node = this.doc.contents as Node;
    for (const part of path) {
      let next: Node | undefined;
      if (isMap(node)) {
        const pair = this.pairOf(node, String(part));
        // A key with no value ("name:") has no value node: point at the key.
        if (pair) next = (pair.value as Node | null) ?? (pair.key as Node);
      } else if (isSeq(node) && typeof part === 'number') {
        next = (node.items[part] as Node | undefined) ?? undefined;
      }
      if (!next) return { node, exact: false };
      node = next;
    }
    return { node, exact: true };
  }

  /** Where the value at `path` starts (or its nearest existing parent, when it is missing). */
  posAt(path: Path): SourcePos {
    return this.at(this.nodeAt(path).node.range?.[0] ?? 0);
  }

  /** Where the key `key` of the mapping at `path` starts. */
  keyPosAt(path: Path, key: string): SourcePos {
    const { node, exact } = this.nodeAt(path);
    if (exact && isMap(node)) {
      const pair = this.pairOf(node, key);
      const k = pair?.key as Node | undefined;
      if (k?.range) return this.at(k.range[0]);
    }
    return this.at(node.range?.[0] ?? 0);
  }

  /** Where the text of the string at `path` begins, past an opening quote or a block indicator. */
  textStartAt(path: Path): SourcePos {
    const { node, exact } = this.nodeAt(path);
    const start = node.range?.[0] ?? 0;
    if (!exact || !isScalar(node)) return this.at(start);
    const type = (node as Scalar).type;
    if (type === 'QUOTE_DOUBLE' || type === 'QUOTE_SINGLE') return this.at(start + 1);
    if (type === 'BLOCK_LITERAL' || type === 'BLOCK_FOLDED') {
      const eol = this.text.indexOf('\n', start);
      if (eol < 0) return this.at(start);
      let i = eol + 1;
      while (this.text[i] === ' ') i++;
      return this.at(i);
    }
    return this.at(start);
  }
}
