/** Expressions read from files: compiled once, located in the file, checked for allowed functions. */
import { ExprError, parseExpr, parseTemplate, type Compiled, type ExprNode } from '../expr/index.js';
import { InputError } from './errors.js';
import { didYouMean } from './suggest.js';
import type { Expr, SourcePos } from './types.js';
import { fieldName, type Path, type SourceDoc } from './yaml-source.js';

/** Functions a node's program may call. */
export const PROGRAM_FUNCTIONS: readonly string[] = ['xor', 'min', 'max', 'abs', 'floor', 'round', 'join', 'age', 'now'];
/** Functions only breakpoints and expectations may call (FORMAT.md §3). */
export const DEBUGGER_FUNCTIONS: readonly string[] = [
  'fidelity',
  'bell',
  'pairs',
  'inflight',
  'delivered',
  'min_fidelity_delivered',
  'fired',
  'stalled',
  'time',
  'event',
];

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

/** Where in the file a name is first read by an expression. */
export function namePos(e: Expr, name: string): SourcePos {
  const hit = findNode(e.compiled.ast, (n) => n.type === 'name' && n.name === name);
  return offsetPos(e.pos, e.compiled.source, hit?.start ?? 0);
}

/** Compiles expressions of one file and records what is wrong with them. */
export class ExprCompiler {
  constructor(
    private readonly src: SourceDoc,
    private readonly errors: InputError[],
  ) {}

  private parseError(err: unknown, start: SourcePos, path: Path, source: string): void {
    if (!(err instanceof ExprError)) throw err;
    this.errors.push(
      InputError.at(offsetPos(start, source, err.offset), {
        code: 'expression',
        field: fieldName(path),
        message: `in expression ${JSON.stringify(source)}: ${err.detail}`,
        fix: 'write a valid expression; text inside an expression needs its own quotes, e.g. "\'waiting\'"',
      }),
    );
  }

  /** Checks that a program calls only program functions. */
  private checkCalls(e: Expr, path: Path): void {
    for (const fn of e.compiled.calls) {
      const hit = findNode(e.compiled.ast, (n) => n.type === 'call' && n.callee === fn);
      const pos = offsetPos(e.pos, e.compiled.source, hit?.start ?? 0);
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
            fix: `programs may call ${PROGRAM_FUNCTIONS.join(', ')}`,
          }),
        );
      }
    }
  }

  /** Compiles the string, number or boolean at `path` (a number or boolean is a literal). */
  expr(path: Path, raw: unknown): Expr | undefined {
    const source = typeof raw === 'string' ? raw : String(raw);
    const pos = typeof raw === 'string' ? this.src.textStartAt(path) : this.src.posAt(path);
    let compiled: Compiled;
    try {
      compiled = parseExpr(source);
    } catch (err) {
      this.parseError(err, pos, path, source);
      return undefined;
    }
    const e: Expr = { compiled, pos };
    this.checkCalls(e, path);
    return e;
  }

  /** Splits a log text into literal parts and expressions (`{expr}` holes). */
  template(path: Path, text: string): (string | Expr)[] | undefined {
    const pos = this.src.textStartAt(path);
    try {
      const t = parseTemplate(text);
      return t.parts.map((p) => {
        if (typeof p === 'string') return p;
        // Each hole keeps the whole log text as its source, so its offsets start at the text.
        const e: Expr = { compiled: p, pos };
        this.checkCalls(e, path);
        return e;
      });
    } catch (err) {
      this.parseError(err, pos, path, text);
      return undefined;
    }
  }
}
