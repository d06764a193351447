/** Turns a parsed expression into nested closures once, so that repeated evaluation is cheap. */
import { compileBinary, compileUnary, truth, type Run } from './compile-ops.js';
import { evalError, ExprError, snippet } from './errors.js';
import { arityProblem, functionSpec } from './library.js';
import { closest, listSome } from './suggest.js';
import type { Compiled, ExprFunction, ExprNode, Scope, Value } from './types.js';
import { describeValue, isRecord, kindOf } from './values.js';

/** Compiles `compiled` into a function of the scope. Evaluation errors are `ExprError` (kind "eval"). */
export function compileExpr(compiled: Pick<Compiled, 'ast' | 'source'>): (scope: Scope) => Value {
  return build(compiled.ast, compiled.source);
}

function build(node: ExprNode, source: string): Run {
  switch (node.type) {
    case 'literal': {
      const v = node.value;
      return () => v;
    }
    case 'name':
      return buildName(node, source);
    case 'member':
      return buildMember(node, build(node.object, source), source);
    case 'index':
      return buildIndex(node, build(node.object, source), build(node.index, source), source);
    case 'unary':
      return compileUnary(node, build(node.argument, source), source);
    case 'binary':
      return compileBinary(node, build(node.left, source), build(node.right, source), source);
    case 'conditional': {
      const test = build(node.test, source);
      const yes = build(node.consequent, source);
      const no = build(node.alternate, source);
      const t = node.test;
      return (s) => (truth(test(s), source, t, 'the condition of "? :"') ? yes(s) : no(s));
    }
    case 'call':
      return buildCall(node, node.args.map((a) => build(a, source)), source);
  }
}

/** Whether something a scope or record handed over is a value of the language (never a function). */
function isValue(v: unknown): v is Value {
  return v !== undefined && typeof v !== 'function';
}

function buildName(node: Extract<ExprNode, { type: 'name' }>, source: string): Run {
  const { name } = node;
  return (s) => {
    const v: unknown = s.lookup(name);
    if (isValue(v)) return v;
    let detail = `unknown name "${name}"`;
    if (Object.hasOwn(s.functions, name)) detail += ` ("${name}" is a function: write ${name}(...))`;
    else {
      const guess = s.listNames ? closest(name, s.listNames()) : undefined;
      if (guess !== undefined) detail += ` (did you mean "${guess}"?)`;
    }
    throw evalError(source, node, detail);
  };
}

function buildMember(node: Extract<ExprNode, { type: 'member' }>, object: Run, source: string): Run {
  const { property } = node;
  const of = node.object;
  const general = memberOf(node, object, source);
  if (of.type !== 'name') return general;
  const name = of.name;
  return (s) => {
    if (s.member !== undefined) {
      const v = s.member(name, property);
      if (v !== undefined) return v;
    }
    return general(s);
  };
}

function memberOf(node: Extract<ExprNode, { type: 'member' }>, object: Run, source: string): Run {
  const { property } = node;
  const of = node.object;
  return (s) => {
    const o = object(s);
    if (isRecord(o) && Object.hasOwn(o, property)) {
      const v: unknown = o[property];
      if (isValue(v)) return v;
    }
    const what = `\`${snippet(source, of.start, of.end)}\``;
    if (o === null) throw evalError(source, node, `${what} is null, so it has no field "${property}"`);
    if (!isRecord(o)) throw evalError(source, node, `${what} is ${describeValue(o)}, not a record, so it has no field "${property}"`);
    if (Object.hasOwn(o, property)) throw evalError(source, node, `field "${property}" of ${what} holds no value`);
    const fields = Object.keys(o);
    const guess = closest(property, fields);
    const hint = guess !== undefined ? `did you mean "${guess}"? ` : '';
    const list = fields.length ? `its fields: ${listSome(fields, 12)}` : 'it has no fields';
    throw evalError(source, node, `no field "${property}" in ${what} (${hint}${list})`);
  };
}

function buildIndex(node: Extract<ExprNode, { type: 'index' }>, object: Run, index: Run, source: string): Run {
  const of = node.object;
  return (s) => {
    const o = object(s);
    const i = index(s);
    const what = `\`${snippet(source, of.start, of.end)}\``;
    if (!Array.isArray(o)) {
      const hint = isRecord(o) ? ' (read a field of a record with ".name")' : '';
      throw evalError(source, node, `only arrays can be indexed, but ${what} is ${describeValue(o)}${hint}`);
    }
    const list = o as readonly Value[];
    if (typeof i !== 'number' || !Number.isInteger(i)) {
      throw evalError(source, node.index, `an index must be a whole number, got ${describeValue(i)}`);
    }
    if (i < 0 || i >= list.length) {
      throw evalError(source, node.index, `index ${i} is out of range for ${what} (length ${list.length})`);
    }
    return list[i];
  };
}

function buildCall(node: Extract<ExprNode, { type: 'call' }>, args: readonly Run[], source: string): Run {
  const { callee } = node;
  // a tree made by hand (not by the parser) gets the same check of its arguments
  const spec = functionSpec(callee);
  const wrong = spec && arityProblem(spec, args.length);
  if (wrong) {
    return () => {
      throw evalError(source, node, wrong);
    };
  }
  // Scopes usually share one functions table, so remember the last lookup.
  let lastTable: unknown;
  let lastFn: ExprFunction | undefined;
  return (s) => {
    const fns = s.functions;
    let fn: ExprFunction;
    if (fns === lastTable && lastFn !== undefined) fn = lastFn;
    else {
      const found: unknown = Object.hasOwn(fns, callee) ? fns[callee] : undefined;
      if (typeof found !== 'function') throw evalError(source, node, unknownFunction(callee, Object.keys(fns)));
      fn = found as ExprFunction;
      lastTable = fns;
      lastFn = fn;
    }
    const values: Value[] = new Array(args.length);
    for (let i = 0; i < args.length; i++) values[i] = args[i](s);
    let result: unknown;
    try {
      result = fn(values);
    } catch (e) {
      if (e instanceof ExprError) throw e;
      const why = e instanceof Error ? e.message : String(e);
      throw evalError(source, node, `${why} in \`${snippet(source, node.start, node.end)}\``);
    }
    if (!isValue(result)) throw evalError(source, node, `function "${callee}" returned no value (${kindOf(result)})`);
    return result;
  };
}

/** `unknown function "f"`, with a suggestion when one is close and the functions on offer. */
export function unknownFunction(name: string, available: readonly string[]): string {
  const guess = closest(name, available);
  const hint = guess !== undefined ? `; did you mean "${guess}"?` : '';
  return `unknown function "${name}"${hint} (available: ${listSome(available, 10)})`;
}
