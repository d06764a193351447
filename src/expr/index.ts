/** The expression language of bellstep: parse once, evaluate safely (docs/expressions.md). */
export type { Compiled, ExprFunction, ExprNode, Scope, Template, Value, ValueRecord } from './types.js';
export { ExprError } from './errors.js';
export { parseExpr, MAX_DEPTH } from './parser.js';
export { compileExpr } from './compile.js';
export { evaluate } from './evaluate.js';
export { parseTemplate } from './template.js';
export { baseFunctions } from './functions.js';
export { makeScope } from './scope.js';
export { formatValue, valuesEqual } from './values.js';
export { closest, editDistance } from './suggest.js';
export { FUNCTIONS, CONSTANTS, functionSpec, functionNames, arity, arityProblem, signature, type FunctionSpec, type ParamSpec, type ArgKind, type FunctionScope } from './library.js';
