/**
 * Checks a breakpoint, watch or expectation against the network before anything runs:
 * every function is one the debugger offers, with arguments of the right kind (node ids
 * that exist, rule names of that node), and every name is a node id or, in a breakpoint, a
 * pair variable. A mistake is an input error at its column, with the nearest known name.
 */
import { closest, ExprError, functionNames, functionSpec, signature, type ArgKind, type FunctionSpec } from '../expr/index.js';
import type { Compiled, ExprNode } from '../expr/types.js';
import type { Net } from '../engine/index.js';
import { InputError } from '../model/errors.js';

/** Functions breakpoints, watches and expectations may call: the debugger's and the general ones. */
export const ALLOWED_CALLS: ReadonlySet<string> = new Set(functionNames('debugger'));

export interface DebugExprOptions {
  /** The flag or command the text came from, e.g. `--expect`. */
  readonly field: string;
  /** What the text is, for messages: `breakpoint`, `expectation`, `watch`. */
  readonly what: string;
  /** Whether names that are not node ids may stand for held pairs (breakpoints and watches). */
  readonly pairVars: boolean;
}

type Call = Extract<ExprNode, { type: 'call' }>;

/** "a" or "an" before a word. */
function article(word: string): string {
  return /^[aeiou]/i.test(word) ? 'an' : 'a';
}

/** An input error at `node` of the text, with its column and an excerpt under the fix. */
function located(spec: string, node: { start: number; end: number }, detail: string, fix: string, field: string): InputError {
  const e = new ExprError('parse', detail, spec, node.start, node.end - node.start);
  return new InputError({ code: 'usage', field, message: `${detail} at column ${e.col} of "${spec}"`, fix: `${fix}\n${e.excerpt()}` });
}

function children(n: ExprNode): readonly ExprNode[] {
  switch (n.type) {
    case 'member':
      return [n.object];
    case 'index':
      return [n.object, n.index];
    case 'unary':
      return [n.argument];
    case 'binary':
      return [n.left, n.right];
    case 'conditional':
      return [n.test, n.consequent, n.alternate];
    case 'call':
      return n.args;
    default:
      return [];
  }
}

/** Every node of the tree in source order, each with the call and parameter it is an argument of. */
function walk(ast: ExprNode, visit: (n: ExprNode, argOf?: { call: Call; kind: ArgKind; index: number }) => void): void {
  const go = (n: ExprNode, argOf?: { call: Call; kind: ArgKind; index: number }): void => {
    visit(n, argOf);
    if (n.type === 'call') {
      const spec = functionSpec(n.callee);
      n.args.forEach((a, i) => {
        const param = spec?.params[Math.min(i, spec.params.length - 1)];
        go(a, param ? { call: n, kind: param.kind, index: i } : undefined);
      });
      return;
    }
    for (const c of children(n)) go(c);
  };
  go(ast);
}

const PROGRAM_ONLY_FIX: Record<string, string> = {
  age: 'a breakpoint sees the whole network, not one node: use time(), or fidelity(p) for a pair',
  now: 'use time(), the simulated time',
  waited: 'a breakpoint sees the whole network, not one node: use time()',
};

/**
 * Checks `compiled` (parsed from `spec`) against the network; returns the names that stand
 * for held pairs. Throws an InputError at the first mistake.
 */
export function checkDebugExpr(net: Net, spec: string, compiled: Compiled, opts: DebugExprOptions): string[] {
  const { field } = opts;
  const pairVars = new Set<string>();
  const fail = (node: { start: number; end: number }, detail: string, fix: string): never => {
    throw located(spec, node, detail, fix, field);
  };
  const nodeList = net.nodeIds.join(', ');
  const unknownNode = (node: ExprNode, name: string): never => {
    const near = closest(name, net.nodeIds);
    return fail(node, `unknown node "${name}"${near ? ` (did you mean "${near}"?)` : ''}`, `name a node of the network: ${nodeList}`);
  };
  walk(compiled.ast, (n, argOf) => {
    if (n.type === 'call') {
      if (!ALLOWED_CALLS.has(n.callee)) {
        const f = functionSpec(n.callee);
        if (f?.scope === 'program') fail(n, `${n.callee}() is a function of node programs, not of ${article(opts.what)} ${opts.what}`, PROGRAM_ONLY_FIX[n.callee] ?? 'see docs/expressions.md');
        const near = closest(n.callee, [...ALLOWED_CALLS]);
        fail(n, `unknown function "${n.callee}"${near ? ` (did you mean "${near}"?)` : ''}`, `${article(opts.what)} ${opts.what} may call: ${[...ALLOWED_CALLS].join(', ')}`);
      }
      return;
    }
    if (argOf) checkArgument(n, argOf);
    else if (n.type === 'name' && !net.nodeSet.has(n.name)) {
      if (!opts.pairVars) unknownName(n);
      pairVars.add(n.name);
    }
  });
  // a pair variable may only be what fidelity() or bell() is asked about
  for (const v of pairVars) {
    let misplaced: ExprNode | undefined;
    walk(compiled.ast, (n, argOf) => {
      if (misplaced || n.type !== 'name' || n.name !== v) return;
      if (!argOf || argOf.kind !== 'pair-id') misplaced = n;
    });
    if (misplaced) unknownName(misplaced as Extract<ExprNode, { type: 'name' }>);
  }
  if (pairVars.size > 2) {
    fail(compiled.ast, `too many free names (${[...pairVars].join(', ')}); at most two can range over pairs`, 'use pair ids in quotes, e.g. fidelity("mill~quay#3")');
  }
  return [...pairVars];

  function unknownName(n: Extract<ExprNode, { type: 'name' }>): never {
    const near = closest(n.name, net.nodeIds);
    const rule = [...net.rules.values()].some((rs) => rs.some((r) => r.name === n.name));
    const hint = rule ? `; "${n.name}" is a rule name: write it in quotes, as in fired(NODE, "${n.name}")` : '';
    const pairs = opts.pairVars ? '; any other name stands for a held pair and may only be the argument of fidelity() or bell()' : '';
    return fail(n, `unknown name "${n.name}"${near ? ` (did you mean "${near}"?)` : ''}${hint}`, `names are node ids (${nodeList})${pairs}`);
  }

  function checkArgument(n: ExprNode, argOf: { call: Call; kind: ArgKind; index: number }): void {
    const f = functionSpec(argOf.call.callee) as FunctionSpec;
    const call = signature(f);
    const literal = n.type === 'literal' ? n.value : undefined;
    switch (argOf.kind) {
      case 'node':
        if (n.type === 'name' && !net.nodeSet.has(n.name)) unknownNode(n, n.name);
        if (typeof literal === 'string' && !net.nodeSet.has(literal)) unknownNode(n, literal);
        if (n.type === 'literal' && typeof literal !== 'string' && literal !== null) fail(n, `${f.name}() takes a node here, got ${JSON.stringify(literal)}`, `write ${call} with a node id, e.g. ${net.nodeIds[0]}`);
        return;
      case 'rule': {
        const nodeArg = argOf.call.args[0];
        const node = nodeArg?.type === 'name' ? nodeArg.name : nodeArg?.type === 'literal' && typeof nodeArg.value === 'string' ? nodeArg.value : undefined;
        const rules = node !== undefined ? (net.rules.get(node) ?? []).map((r) => r.name) : undefined;
        const name = n.type === 'name' ? n.name : typeof literal === 'string' ? literal : undefined;
        if (n.type === 'name') {
          const known = rules?.includes(n.name);
          fail(n, `${f.name}() takes a rule name in quotes${known ? `: write "${n.name}"` : `, got the name ${n.name}`}`, `write e.g. ${f.name}(${node ?? 'mill'}, "${known ? n.name : (rules?.[0] ?? 'swap')}")`);
        }
        if (name !== undefined && rules !== undefined && !rules.includes(name)) {
          const near = closest(name, rules);
          fail(n, `${node} has no rule "${name}"${near ? ` (did you mean "${near}"?)` : ''}`, `rules of ${node}: ${rules.join(', ') || 'none'}`);
        }
        if (n.type === 'literal' && typeof literal !== 'string') fail(n, `${f.name}() takes a rule name in quotes, got ${JSON.stringify(literal)}`, `write ${call}`);
        return;
      }
      case 'pair-id':
        if (n.type === 'name' && !net.nodeSet.has(n.name)) {
          if (!opts.pairVars) unknownName(n);
          pairVars.add(n.name);
        }
        if (n.type === 'literal' && typeof literal !== 'string') fail(n, `${f.name}() takes a pair id, got ${JSON.stringify(literal)}`, `write e.g. ${f.name}("mill~quay#3")`);
        return;
      case 'stage':
      case 'kind':
      case 'text':
        if (n.type === 'name' && !net.nodeSet.has(n.name)) fail(n, `${f.name}() takes a ${argOf.kind} name in quotes here, got the name ${n.name}`, `write "${n.name}"`);
        if (n.type === 'literal' && typeof literal !== 'string') fail(n, `${f.name}() takes a ${argOf.kind} name in quotes here, got ${JSON.stringify(literal)}`, `write ${call}`);
        return;
      case 'number':
      case 'bit': {
        const want = argOf.kind === 'number' ? 'numbers' : 'bits (0/1 or true/false)';
        const ok = argOf.kind === 'number' ? typeof literal === 'number' : literal === 0 || literal === 1 || literal === true || literal === false;
        if (n.type === 'literal' && !ok) fail(n, `${f.name}() takes ${want}, got ${JSON.stringify(literal)}`, `write ${call}`);
        if (n.type === 'name' && net.nodeSet.has(n.name)) fail(n, `${f.name}() takes ${want}, got the node ${n.name}`, `write ${call}`);
        if (n.type === 'name') unknownName(n);
        return;
      }
      case 'pair':
        return;
    }
  }
}
