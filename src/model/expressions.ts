/** Expressions read from files: compiled once, located in the file, checked for allowed functions. */
import { ExprError, FUNCTIONS, functionNames, parseExpr, signature, parseTemplate, type Compiled, type ExprNode, type Template } from '../expr/index.js';
import { InputError } from './errors.js';
import { didYouMean } from './suggest.js';
import type { Expr, SourcePos, WrittenText } from './types.js';
import { fieldName, type Path, type SourceDoc } from './yaml-source.js';

/** Functions a node's program may call (from the language's table of functions). */
export const PROGRAM_FUNCTIONS: readonly string[] = functionNames('program');
/** Functions only breakpoints and expectations may call (docs/expressions.md). */
export const DEBUGGER_FUNCTIONS: readonly string[] = FUNCTIONS.filter((f) => f.scope === 'debugger').map((f) => f.name);

/** The node an expression names when it is a bare node id or a string literal of one. */
export function staticNode(e: Expr, nodeIds: ReadonlySet<string> | readonly string[]): string | undefined {
  const ids: ReadonlySet<string> = nodeIds instanceof Set ? nodeIds : new Set(nodeIds as readonly string[]);
  const ast = e.compiled.ast;
  if (ast.type === 'name' && ids.has(ast.name)) return ast.name;
  if (ast.type === 'literal' && typeof ast.value === 'string' && ids.has(ast.value)) return ast.value;
  return undefined;
}

/** The literal value of an expression that is nothing but a literal, else undefined. */
export function literalValue(e: Expr): number | string | boolean | null | undefined {
  return e.compiled.ast.type === 'literal' ? e.compiled.ast.value : undefined;
}

/** The first syntax node (depth first, in source order) that satisfies `pred`. */
export function findNode(ast: ExprNode, pred: (n: ExprNode) => boolean): ExprNode | undefined {
  if (pred(ast)) return ast;
  const children: ExprNode[] = [];
  switch (ast.type) {
    case 'member':
      children.push(ast.object);
      break;
    case 'index':
      children.push(ast.object, ast.index);
      break;
    case 'unary':
      children.push(ast.argument);
      break;
    case 'binary':
      children.push(ast.left, ast.right);
      break;
    case 'conditional':
      children.push(ast.test, ast.consequent, ast.alternate);
      break;
    case 'call':
      children.push(...ast.args);
      break;
    default:
      break;
  }
  for (const c of children) {
    const hit = findNode(c, pred);
    if (hit) return hit;
  }
  return undefined;
}

/** Where offset `offset` of an expression whose text starts at `start` lies in the file. */
export function offsetPos(start: SourcePos, source: string, offset: number): SourcePos {
  const before = source.slice(0, offset);
  const newlines = before.split('\n').length - 1;
  if (newlines === 0) return { ...start, col: start.col + offset };
  // Good enough for multi-line scalars: YAML indentation is not added back.
  return { file: start.file, line: start.line + newlines, col: offset - before.lastIndexOf('\n') };
}

/**
 * Where offset `offset` of an expression's compiled source lies in the file. For a text with
 * role parameters substituted, an offset inside a substituted value points at the parameter
 * as written, and one after it is moved back by the difference in length.
 */
export function exprPos(e: Expr, offset: number): SourcePos {
  const w = e.written;
  if (!w) return offsetPos(e.pos, e.compiled.source, offset);
  let shift = 0;
  for (const edit of w.edits) {
    if (offset < edit.at) break;
    if (offset < edit.at + edit.text.length) return offsetPos(e.pos, w.source, edit.from);
    shift += edit.to - edit.from - edit.text.length;
  }
  return offsetPos(e.pos, w.source, offset + shift);
}

/** Where in the file a name is first read by an expression. */
export function namePos(e: Expr, name: string): SourcePos {
  const hit = findNode(e.compiled.ast, (n) => n.type === 'name' && n.name === name);
  return exprPos(e, hit?.start ?? 0);
}

/**
 * The replacements that put parameter values (`args`, by name) in place of the names read
 * in `asts` (which all point into `source`), or undefined when no parameter is read.
 */
export function substituteParams(source: string, asts: readonly ExprNode[], args: ReadonlyMap<string, string>): WrittenText | undefined {
  const hits: { start: number; end: number; name: string }[] = [];
  for (const ast of asts) {
    findNode(ast, (n) => {
      if (n.type === 'name' && args.has(n.name)) hits.push({ start: n.start, end: n.end, name: n.name });
      return false;
    });
  }
  if (hits.length === 0) return undefined;
  hits.sort((a, b) => a.start - b.start);
  let shift = 0;
  const edits = hits.map((h) => {
    const text = args.get(h.name) as string;
    const edit = { from: h.start, to: h.end, at: h.start + shift, text };
    shift += text.length - (h.end - h.start);
    return edit;
  });
  return { source, edits };
}

/** The text after the replacements of `w`. */
export function applyEdits(w: WrittenText): string {
  let out = '';
  let from = 0;
  for (const e of w.edits) {
    out += w.source.slice(from, e.from) + e.text;
    from = e.to;
  }
  return out + w.source.slice(from);
}

/**
 * Parsed expressions by text: a role's expressions are the same text at every node that plays
 * it, and a compiled expression is a frozen value, so one parse serves them all. Bounded, so a
 * long-lived process that loads many files keeps only the latest texts.
 */
const parsed = new Map<string, Compiled>();
const PARSED_KEPT = 20_000;

function parseShared(source: string): Compiled {
  let c = parsed.get(source);
  if (c === undefined) {
    c = parseExpr(source);
    if (parsed.size >= PARSED_KEPT) parsed.clear();
    parsed.set(source, c);
  }
  return c;
}

/**
 * Compiles expressions of one file and records what is wrong with them. With `args` (a
 * role's parameter values for one node), each expression is compiled as written, then
 * again with the values in place of the parameters, as a hand-written rule would say it.
 */
export class ExprCompiler {
  constructor(
    private readonly src: SourceDoc,
    private readonly errors: InputError[],
    private readonly args?: ReadonlyMap<string, string>,
  ) {}

  /** The substituted text, or undefined when no parameter is read (or it does not parse; that error is recorded). */
  private substituted(
    written: string,
    asts: readonly ExprNode[],
    start: SourcePos,
    path: Path,
    parse: (text: string) => unknown,
  ): { text: string; w: WrittenText } | undefined {
    if (!this.args) return undefined;
    const w = substituteParams(written, asts, this.args);
    if (!w) return undefined;
    const text = applyEdits(w);
    try {
      parse(text);
    } catch (err) {
      if (!(err instanceof ExprError)) throw err;
      this.errors.push(
        InputError.at(start, {
          code: 'expression',
          field: fieldName(path),
          message: `with the parameter values in place, ${JSON.stringify(written)} reads ${JSON.stringify(text)}, which does not parse: ${err.detail}`,
          fix: 'give the parameter a value that fits where it is used (a number can be put in parentheses)',
        }),
      );
      return undefined;
    }
    return { text, w };
  }

  private parseError(err: unknown, start: SourcePos, path: Path, source: string): void {
    if (!(err instanceof ExprError)) throw err;
    this.errors.push(
      InputError.at(offsetPos(start, source, err.offset), {
        code: 'expression',
        field: fieldName(path),
        message: `in expression ${JSON.stringify(source)}: ${err.detail}`,
        fix: / takes .* arguments?, got /.test(err.detail)
          ? 'give the function the arguments it takes (docs/expressions.md lists them)'
          : 'write a valid expression; text inside an expression needs its own quotes, e.g. "\'waiting\'"',
      }),
    );
  }

  /** Checks that a program calls only program functions. */
  private checkCalls(e: Expr, path: Path): void {
    for (const fn of e.compiled.calls) {
      const hit = findNode(e.compiled.ast, (n) => n.type === 'call' && n.callee === fn);
      const pos = exprPos(e, hit?.start ?? 0);
      if (DEBUGGER_FUNCTIONS.includes(fn)) {
        this.errors.push(
          InputError.at(pos, {
            code: 'expression',
            field: fieldName(path),
            message: `${fn}() is a debugger function: it is for breakpoints and expectations, not for node programs`,
            fix: 'a node can only act on what it holds and receives; move this test to --break or --expect',
          }),
        );
      } else if (!PROGRAM_FUNCTIONS.includes(fn)) {
        this.errors.push(
          InputError.at(pos, {
            code: 'expression',
            field: fieldName(path),
            message: `unknown function ${fn}()${didYouMean(fn, PROGRAM_FUNCTIONS)}`,
            fix: `programs may call ${PROGRAM_FUNCTIONS.join(', ')} (see docs/expressions.md)`,
          }),
        );
      }
    }
    this.checkArguments(e, path);
  }

  /** Literal arguments of the wrong kind (`xor(2, 1)`, `age(3)`), found before any run. */
  private checkArguments(e: Expr, path: Path): void {
    const calls: Extract<ExprNode, { type: 'call' }>[] = [];
    findNode(e.compiled.ast, (n) => {
      if (n.type === 'call') calls.push(n);
      return false;
    });
    for (const call of calls) {
      const spec = FUNCTIONS.find((f) => f.name === call.callee);
      if (!spec) continue;
      call.args.forEach((arg, i) => {
        const param = spec.params[Math.min(i, spec.params.length - 1)];
        if (arg.type !== 'literal' || param === undefined) return;
        const v = arg.value;
        const fits =
          param.kind === 'number' ? typeof v === 'number'
          : param.kind === 'bit' ? v === 0 || v === 1 || v === true || v === false
          : param.kind === 'pair' || param.kind === 'pair-id' ? typeof v === 'string'
          : true;
        if (fits) return;
        const want = param.kind === 'number' ? 'a number' : param.kind === 'bit' ? 'a bit (0 or 1) or true/false' : 'a pair (a bound name, or a pair id in quotes)';
        this.errors.push(
          InputError.at(exprPos(e, arg.start), {
            code: 'expression',
            field: fieldName(path),
            message: `${call.callee}() takes ${want} as its ${param.name}, got ${JSON.stringify(v)}`,
            fix: `write ${signature(spec)} with ${want} for ${param.name}`,
          }),
        );
      });
    }
  }

  /** Compiles the string, number or boolean at `path` (a number or boolean is a literal). */
  expr(path: Path, raw: unknown): Expr | undefined {
    const source = typeof raw === 'string' ? raw : String(raw);
    const pos = typeof raw === 'string' ? this.src.textStartAt(path) : this.src.posAt(path);
    let compiled: Compiled;
    try {
      compiled = parseShared(source);
    } catch (err) {
      this.parseError(err, pos, path, source);
      return undefined;
    }
    const e: Expr = { compiled, pos };
    this.checkCalls(e, path);
    const sub = this.substituted(source, [compiled.ast], pos, path, parseShared);
    return sub ? { compiled: parseShared(sub.text), pos, written: sub.w } : e;
  }

  /** Splits a log text into literal parts and expressions (`{expr}` holes). */
  template(path: Path, text: string): (string | Expr)[] | undefined {
    const pos = this.src.textStartAt(path);
    let t: Template;
    try {
      t = parseTemplate(text);
    } catch (err) {
      this.parseError(err, pos, path, text);
      return undefined;
    }
    // Each hole keeps the whole log text as its source, so its offsets start at the text.
    for (const p of t.parts) if (typeof p !== 'string') this.checkCalls({ compiled: p, pos }, path);
    const holes = t.parts.filter((p): p is Compiled => typeof p !== 'string');
    const sub = this.substituted(text, holes.map((h) => h.ast), pos, path, parseTemplate);
    if (!sub) return t.parts.map((p) => (typeof p === 'string' ? p : { compiled: p, pos }));
    return parseTemplate(sub.text).parts.map((p) => (typeof p === 'string' ? p : { compiled: p, pos, written: sub.w }));
  }
}
