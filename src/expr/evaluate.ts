/** Evaluation of a parsed expression, compiling it to closures on first use. */
import { compileExpr } from './compile.js';
import type { Compiled, Scope, Value } from './types.js';

const compiledCache = new WeakMap<Compiled, (scope: Scope) => Value>();

/** Evaluates `compiled` in `scope`. Throws `ExprError` (kind "eval") located at the failing sub-expression. */
export function evaluate(compiled: Compiled, scope: Scope): Value {
  if (compiled.run !== undefined) return compiled.run(scope);
  let run = compiledCache.get(compiled);
  if (run === undefined) {
    run = compileExpr(compiled);
    compiledCache.set(compiled, run);
  }
  return run(scope);
}
