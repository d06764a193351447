/** Parameter values of roles: what a node may give (a node id, a number or a quoted string), as expression text. */
import { ExprError, parseExpr } from '../expr/index.js';
import { didYouMean } from './suggest.js';
import { BIND_NAME_RE } from './schema-program.js';

const VALUE_FIX = 'give a node id, a number, or a quoted string such as "\'near\'"';

/**
 * The expression text that stands for a parameter value, as a hand-written rule would say it
 * (`s0`, `'north-gate'` for a node id with a dash, `3`, `(-2)`, `'near'`), or what is wrong.
 */
export function argText(value: unknown, nodeIds: ReadonlySet<string>): string | { message: string; fix: string } {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return { message: `${String(value)} is not a usable number`, fix: 'give a finite number' };
    // parentheses keep a negative value one operand wherever the parameter stands
    return value < 0 ? `(${String(value)})` : String(value);
  }
  if (typeof value !== 'string') return { message: `expected a node id, a number or a quoted string, got ${JSON.stringify(value)}`, fix: VALUE_FIX };
  const text = value.trim();
  if (nodeIds.has(text)) return BIND_NAME_RE.test(text) ? text : `'${text}'`;
  let ast;
  try {
    ast = parseExpr(text).ast;
  } catch (e) {
    if (!(e instanceof ExprError)) throw e;
    return { message: `"${value}" is not a node id, a number or a quoted string (${e.detail})`, fix: VALUE_FIX };
  }
  if (ast.type === 'literal' && (typeof ast.value === 'string' || typeof ast.value === 'number')) return text;
  if (ast.type === 'unary' && ast.op === '-' && ast.argument.type === 'literal' && typeof ast.argument.value === 'number') return `(${text})`;
  if (ast.type === 'name' || /^[a-z][a-z0-9-]*$/.test(text)) {
    return { message: `unknown node "${text}"${didYouMean(text, nodeIds)}`, fix: `name a node declared under "nodes", or quote text: "'${text}'"` };
  }
  return { message: `"${value}" is not a node id, a number or a quoted string`, fix: VALUE_FIX };
}

/** `roles.repeater.rules[0] (at s8, left=s0 right=s16)`: a role's rule, the node and the values. */
export function originText(field: string, node: string, args: readonly (readonly [string, string])[]): string {
  const values = args.map(([k, v]) => `${k}=${v}`).join(' ');
  return `${field} (at ${node}${values ? `, ${values}` : ''})`;
}
