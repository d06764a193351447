/**
 * What an expectation saw: the values of the parts it compared, so that a failing line
 * reads `FAIL min_fidelity_delivered() > 0.8 (min_fidelity_delivered() = 0.77)` instead of
 * a bare `false`.
 */
import { evaluate, ExprError, formatValue } from '../expr/index.js';
import type { Compiled, ExprNode, Scope, Value } from '../expr/types.js';

/** One part of an expectation and its value at the end of the run. */
export interface Seen {
  readonly expr: string;
  readonly value: Value;
}

const COMPARISONS = new Set(['<', '<=', '>', '>=', '==', '!=']);

/** The parts worth showing: the operands of comparisons (through `&&`, `||` and `!`), else the whole. */
function parts(ast: ExprNode, out: ExprNode[]): void {
  if (ast.type === 'binary' && COMPARISONS.has(ast.op)) {
    for (const side of [ast.left, ast.right]) if (side.type !== 'literal') out.push(side);
  } else if (ast.type === 'binary' && (ast.op === '&&' || ast.op === '||')) {
    parts(ast.left, out);
    parts(ast.right, out);
  } else if (ast.type === 'unary' && ast.op === '!') {
    parts(ast.argument, out);
  } else if (ast.type !== 'literal') out.push(ast);
}

/** The values of the compared parts of `compiled` in `scope`; a part that cannot be evaluated shows why. */
export function observe(compiled: Compiled, scope: Scope): Seen[] {
  const found: ExprNode[] = [];
  parts(compiled.ast, found);
  const out: Seen[] = [];
  const seen = new Set<string>();
  for (const node of found) {
    const text = compiled.source.slice(node.start, node.end).trim();
    if (seen.has(text)) continue;
    seen.add(text);
    let value: Value;
    try {
      value = evaluate({ source: compiled.source, ast: node, names: [], calls: [] }, scope);
    } catch (e) {
      value = `error: ${e instanceof ExprError ? e.detail : e instanceof Error ? e.message : String(e)}`;
    }
    out.push({ expr: text, value });
  }
  return out;
}

/** `a = 1, b = 2`: what an expectation saw, for one line of text. */
export function sawText(saw: readonly Seen[]): string {
  return saw.map((s) => `${s.expr} = ${formatValue(s.value)}`).join(', ');
}
