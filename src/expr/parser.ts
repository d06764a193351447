/** Recursive-descent parser for the expression language (docs/expressions.md). */
import { ExprError, lineColOf } from './errors.js';
import { lex, type Token } from './lexer.js';
import { compileExpr } from './compile.js';
import { arityProblem, CONSTANTS, functionSpec } from './library.js';
import type { Compiled, ExprNode } from './types.js';

type BinaryOp = Extract<ExprNode, { type: 'binary' }>['op'];

/** Binding strength of each binary operator; higher binds tighter (JavaScript's order). */
const PRECEDENCE: Readonly<Record<string, number>> = {
  '||': 1,
  '&&': 2,
  '==': 3,
  '!=': 3,
  '<': 4,
  '<=': 4,
  '>': 4,
  '>=': 4,
  '+': 5,
  '-': 5,
  '*': 6,
  '/': 6,
  '%': 6,
};

/** Names and fields refused outright, because they lead to prototypes or globals in JavaScript. */
const FORBIDDEN = new Set(['__proto__', 'prototype', 'constructor', 'this']);

/** Deeper trees are refused so that evaluation can never exhaust the stack. */
export const MAX_DEPTH = 200;

/** Parses one expression. Throws `ExprError` (kind "parse") naming the offending text. */
export function parseExpr(source: string): Compiled {
  return parseRange(source, 0, source.length);
}

/** Parses the expression in `source[start, end)`; offsets in the tree and errors refer to all of `source`. */
export function parseRange(source: string, start: number, end: number): Compiled {
  const parser = new Parser(source, lex(source, start, end), start);
  const ast = parser.parseAll();
  const compiled = { source, ast, names: Object.freeze([...parser.names]), calls: Object.freeze([...parser.calls]) };
  // the closures are built once, here, and kept out of sight of comparisons and JSON
  Object.defineProperty(compiled, 'run', { value: compileExpr(compiled), enumerable: false });
  return Object.freeze(compiled);
}

class Parser {
  readonly names = new Set<string>();
  readonly calls = new Set<string>();
  private pos = 0;
  /** Depth of each finished node, so that over-deep trees are refused. */
  private readonly depth = new Map<ExprNode, number>();
  /** Current recursion depth of the parser itself (parentheses, unary chains). */
  private nesting = 0;

  constructor(
    private readonly source: string,
    private readonly tokens: readonly Token[],
    private readonly start: number,
  ) {}

  parseAll(): ExprNode {
    const first = this.peek();
    if (first.kind === 'end') this.fail('empty expression', { start: this.start, end: this.start });
    const node = this.parseConditional();
    const rest = this.peek();
    if (rest.kind !== 'end') this.fail(`unexpected ${describe(rest)} after a complete expression`, rest);
    return node;
  }

  private peek(): Token {
    return this.tokens[this.pos];
  }

  private next(): Token {
    const t = this.tokens[this.pos];
    if (t.kind !== 'end') this.pos++;
    return t;
  }

  private isPunct(text: string): boolean {
    const t = this.peek();
    return t.kind === 'punct' && t.text === text;
  }

  private fail(detail: string, at: { start: number; end: number }): never {
    throw new ExprError('parse', detail, this.source, at.start, at.end - at.start);
  }

  private expect(text: string, opener?: Token): Token {
    const t = this.peek();
    if (t.kind === 'punct' && t.text === text) return this.next();
    const closes = opener ? ` to close "${opener.text}" at ${this.where(opener)}` : '';
    return this.fail(`expected "${text}"${closes}, found ${describe(t)}`, t);
  }

  private where(t: Token): string {
    const { line, col } = lineColOf(this.source, t.start);
    return `${line}:${col}`;
  }

  /** Records a node's depth and refuses trees deeper than MAX_DEPTH. */
  private made<N extends ExprNode>(node: N, ...children: ExprNode[]): N {
    let d = 1;
    for (const c of children) d = Math.max(d, (this.depth.get(c) ?? 1) + 1);
    if (d > MAX_DEPTH) this.fail(`expression is nested too deeply (more than ${MAX_DEPTH} levels)`, node);
    this.depth.set(node, d);
    return node;
  }

  /** Guards the parser's own recursion, which would otherwise overflow on "((((...". */
  private nest(at: Token): void {
    if (++this.nesting > MAX_DEPTH) this.fail(`expression is nested too deeply (more than ${MAX_DEPTH} levels)`, at);
  }

  private parseConditional(): ExprNode {
    this.nest(this.peek());
    const node = this.parseConditionalInner();
    this.nesting--;
    return node;
  }

  private parseConditionalInner(): ExprNode {
    const test = this.parseBinary(1);
    if (!this.isPunct('?')) return test;
    const question = this.next();
    const consequent = this.parseConditional();
    this.expect(':', question);
    const alternate = this.parseConditional();
    return this.made({ type: 'conditional', test, consequent, alternate, start: test.start, end: alternate.end }, test, consequent, alternate);
  }

  private parseBinary(minPrecedence: number): ExprNode {
    let left = this.parseUnary();
    for (;;) {
      const t = this.peek();
      const p = t.kind === 'punct' && Object.hasOwn(PRECEDENCE, t.text) ? PRECEDENCE[t.text] : 0;
      if (p === 0 || p < minPrecedence) return left;
      this.next();
      const right = this.parseBinary(p + 1);
      const op = t.text as BinaryOp;
      left = this.made({ type: 'binary', op, left, right, start: left.start, end: right.end }, left, right);
    }
  }

  private parseUnary(): ExprNode {
    const t = this.peek();
    if (t.kind === 'punct' && (t.text === '-' || t.text === '+' || t.text === '!')) {
      this.next();
      this.nest(t);
      const argument = this.parseUnary();
      this.nesting--;
      const op = t.text;
      return this.made({ type: 'unary', op, argument, start: t.start, end: argument.end }, argument);
    }
    return this.parsePostfix();
  }

  private parsePostfix(): ExprNode {
    let node = this.parsePrimary();
    for (;;) {
      if (this.isPunct('.')) {
        this.next();
        const prop = this.peek();
        if (prop.kind !== 'name') this.fail(`expected a field name after ".", found ${describe(prop)}`, prop);
        this.next();
        if (FORBIDDEN.has(prop.text)) this.fail(`field "${prop.text}" is not allowed in expressions`, prop);
        node = this.made({ type: 'member', object: node, property: prop.text, start: node.start, end: prop.end }, node);
      } else if (this.isPunct('[')) {
        const open = this.next();
        const index = this.parseConditional();
        if (index.type === 'literal' && typeof index.value === 'string') {
          this.fail(`fields are read with ".", not with a string index: write .${index.value} instead of [${this.text(index)}]`, index);
        }
        const close = this.expect(']', open);
        node = this.made({ type: 'index', object: node, index, start: node.start, end: close.end }, node, index);
      } else if (this.isPunct('(')) {
        this.fail(`only a function name can be called (found a call on \`${this.text(node)}\`)`, this.peek());
      } else {
        return node;
      }
    }
  }

  private parsePrimary(): ExprNode {
    const t = this.next();
    if (t.kind === 'number' || t.kind === 'string') {
      return this.made({ type: 'literal', value: t.value as number | string, start: t.start, end: t.end });
    }
    if (t.kind === 'name') {
      if (t.text === 'true' || t.text === 'false') return this.made({ type: 'literal', value: t.text === 'true', start: t.start, end: t.end });
      if (t.text === 'null') return this.made({ type: 'literal', value: null, start: t.start, end: t.end });
      const constant = CONSTANTS.find((k) => k.name === t.text);
      if (constant && !this.isPunct('(')) return this.made({ type: 'literal', value: constant.value, start: t.start, end: t.end });
      if (FORBIDDEN.has(t.text)) this.fail(`name "${t.text}" is not allowed in expressions`, t);
      if (this.isPunct('(')) return this.parseCall(t);
      this.names.add(t.text);
      return this.made({ type: 'name', name: t.text, start: t.start, end: t.end });
    }
    if (t.kind === 'punct' && t.text === '(') {
      const inner = this.parseConditional();
      const close = this.expect(')', t);
      // Widen the span to the parentheses so that messages quote "(a + b) / c" whole.
      const node = { ...inner, start: t.start, end: close.end };
      this.depth.set(node, this.depth.get(inner) ?? 1);
      return node;
    }
    if (t.kind === 'end') return this.fail('unexpected end of expression', t);
    return this.fail(`unexpected ${describe(t)}`, t);
  }

  private parseCall(callee: Token): ExprNode {
    const open = this.next();
    const args: ExprNode[] = [];
    if (!this.isPunct(')')) {
      for (;;) {
        args.push(this.parseConditional());
        if (!this.isPunct(',')) break;
        this.next();
        if (this.isPunct(')')) this.fail('unexpected ")" after ","', this.peek());
      }
    }
    const close = this.expect(')', open);
    // the number of arguments is part of the language, so it is checked here, wherever the call is
    const spec = functionSpec(callee.text);
    const wrong = spec && arityProblem(spec, args.length);
    if (wrong) throw new ExprError('parse', wrong, this.source, callee.start, close.end - callee.start);
    this.calls.add(callee.text);
    return this.made({ type: 'call', callee: callee.text, args, start: callee.start, end: close.end }, ...args);
  }

  private text(node: ExprNode): string {
    return this.source.slice(node.start, node.end);
  }
}

function describe(t: Token): string {
  switch (t.kind) {
    case 'end':
      return 'end of expression';
    case 'punct':
      return `"${t.text}"`;
    case 'name':
      return `name "${t.text}"`;
    case 'number':
      return `number ${t.text}`;
    case 'string':
      return `string ${t.text}`;
  }
}
