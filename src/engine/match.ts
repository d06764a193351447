/**
 * Guard matching. Guards are tried in order; `have` (count 1) and `got` try their
 * candidates in pick order and backtrack when a later guard fails, so the first binding in
 * that order that satisfies every guard wins. The deepest guard reached is remembered for
 * explanations ("why is this rule not firing?").
 */
import { evaluate, ExprError } from '../expr/index.js';
import type { Value } from '../expr/types.js';
import type { Expr, Guard, HaveGuard, Rule } from '../model/types.js';
import { exprPos, staticNode } from '../model/index.js';
import { ProgramError } from './errors.js';
import type { Bindings, RuleScope } from './scope.js';
import type { Message, PairRecord, World } from './types.js';

/** Search steps allowed per rule attempt before the matcher gives up on that rule. */
const SEARCH_BUDGET = 20_000;

export interface MatchContext {
  readonly w: World;
  readonly node: string;
  readonly scope: RuleScope;
  readonly nodeIds: ReadonlySet<string>;
}

/** Where the search got furthest: the guard that failed and the bindings in force then. */
export interface DeepestFailure {
  guard: number;
  bound: { pairs: Map<string, number>; messages: Map<string, Message>; values: Map<string, Value> };
}

/** Evaluates an expression for a rule, turning expression errors into program errors at the file position. */
export function evalIn(expr: Expr, scope: RuleScope, node: string, rule: string): Value {
  try {
    return evaluate(expr.compiled, scope);
  } catch (e) {
    if (e instanceof ExprError) {
      const pos = exprPos(expr, e.offset);
      throw new ProgramError(`${e.detail} in "${expr.compiled.source}"`, { pos, node, rule });
    }
    throw e;
  }
}

/** Node ids named directly by expressions (`partner: mill`), so guards skip evaluating them. */
const staticNodes = new WeakMap<Expr, string | null>();

/** The node an expression names directly, or null (cached per expression). */
export function staticNodeOf(expr: Expr, nodeIds: ReadonlySet<string>): string | null {
  let v = staticNodes.get(expr);
  if (v === undefined) {
    v = staticNode(expr, nodeIds) ?? null;
    staticNodes.set(expr, v);
  }
  return v;
}

/** A node id from an expression, or a program error saying what it gave instead. */
export function evalNode(expr: Expr, ctx: MatchContext, rule: string): string {
  const fixed = staticNodeOf(expr, ctx.nodeIds);
  if (fixed !== null) return fixed;
  const v = evalIn(expr, ctx.scope, ctx.node, rule);
  if (typeof v === 'string' && ctx.nodeIds.has(v)) return v;
  throw new ProgramError(`"${expr.compiled.source}" gave ${JSON.stringify(v)}, which is not a node id`, {
    pos: expr.pos,
    node: ctx.node,
    rule,
    fix: 'use a node id (e.g. partner: mill) or a field that holds one (e.g. p.partner)',
  });
}

/** A guard's truth value; 0/1 count as false/true. */
export function truthy(v: Value, expr: Expr, node: string, rule: string): boolean {
  if (v === true || v === 1) return true;
  if (v === false || v === 0) return false;
  throw new ProgramError(`"${expr.compiled.source}" gave ${JSON.stringify(v)}, not true or false`, {
    pos: expr.pos,
    node,
    rule,
  });
}

/** Free halves at the node matching a `have` guard's partner, stage and age window, in pick order. */
export function haveCandidates(ctx: MatchContext, g: HaveGuard, partner: string, used: { has(q: number): boolean }, into: PairRecord[] = []): PairRecord[] {
  const now = ctx.scope.now;
  const out = into;
  out.length = 0;
  const pairs = ctx.w.nodes[ctx.node].pairs;
  for (let k = 0; k < pairs.length; k++) {
    const rec = pairs[k];
    if (rec.partner !== partner || rec.stage !== g.stage || used.has(rec.qubit)) continue;
    const age = now - rec.born;
    if (g.minAgeNs !== undefined && age < g.minAgeNs) continue;
    if (g.maxAgeNs !== undefined && age > g.maxAgeNs) continue;
    const waited = now - rec.entered;
    if (g.minWaitNs !== undefined && waited < g.minWaitNs) continue;
    if (g.maxWaitNs !== undefined && waited > g.maxWaitNs) continue;
    out.push(rec);
  }
  if (out.length > 1) out.sort(g.pick === 'newest' ? newestFirst : oldestFirst);
  return out;
}

const oldestFirst = (a: PairRecord, b: PairRecord): number => a.order - b.order;
const newestFirst = (a: PairRecord, b: PairRecord): number => b.order - a.order;

/** Messages in the inbox of the given kind (and sender), oldest first. */
export function gotCandidates(ctx: MatchContext, kind: string, from: string | undefined, used: { has(m: number): boolean }): Message[] {
  return ctx.w.nodes[ctx.node].inbox.filter(
    (m) => m.kind === kind && (from === undefined || m.from === from) && !used.has(m.id),
  );
}

function snapshot(b: Bindings): DeepestFailure['bound'] {
  return { pairs: new Map(b.pairs), messages: new Map(b.messages), values: new Map(b.values) };
}

interface Search {
  ctx: MatchContext;
  rule: Rule;
  deepest?: { value?: DeepestFailure };
  budget: number;
  /** One candidate list per guard, reused from attempt to attempt (a guard's list is only read while its level of the search runs). */
  readonly lists: PairRecord[][];
}

function fail(s: Search, i: number): false {
  const d = s.deepest;
  if (d && (d.value === undefined || i > d.value.guard)) d.value = { guard: i, bound: snapshot(s.ctx.scope.bindings) };
  return false;
}

function bindPair(b: Bindings, name: string | undefined, rec: PairRecord): void {
  b.dirty = true;
  b.usedQubits.add(rec.qubit);
  if (name) b.pairs.set(name, rec.qubit);
}

function unbindPair(b: Bindings, name: string | undefined, rec: PairRecord): void {
  b.usedQubits.delete(rec.qubit);
  if (name) b.pairs.delete(name);
}

// Written without per-call closures: this runs for every rule after every event.
function search(s: Search, i: number): boolean {
  if (--s.budget < 0) return false;
  const guards = s.rule.when;
  if (i === guards.length) return true;
  const { ctx, rule } = s;
  const b = ctx.scope.bindings;
  const g: Guard = guards[i];
  switch (g.kind) {
    case 'have': {
      const partner = evalNode(g.partner, ctx, rule.name);
      while (s.lists.length <= i) s.lists.push([]);
      const cands = haveCandidates(ctx, g, partner, b.usedQubits, s.lists[i]);
      if (cands.length < g.count) return fail(s, i);
      if (g.count === 1) {
        for (const rec of cands) {
          bindPair(b, g.as[0], rec);
          if (search(s, i + 1)) return true;
          unbindPair(b, g.as[0], rec);
        }
        return fail(s, i);
      }
      const chosen = cands.slice(0, g.count);
      for (let k = 0; k < chosen.length; k++) bindPair(b, g.as[k], chosen[k]);
      if (search(s, i + 1)) return true;
      for (let k = 0; k < chosen.length; k++) unbindPair(b, g.as[k], chosen[k]);
      return fail(s, i);
    }
    case 'have-id': {
      const id = evalIn(g.id, ctx.scope, ctx.node, rule.name);
      const pairs = ctx.w.nodes[ctx.node].pairs;
      let rec: PairRecord | undefined;
      for (let k = 0; k < pairs.length; k++) {
        const p = pairs[k];
        if (p.id === id && (g.stage === undefined || p.stage === g.stage) && !b.usedQubits.has(p.qubit)) {
          rec = p;
          break;
        }
      }
      if (!rec) return fail(s, i);
      bindPair(b, g.as, rec);
      if (search(s, i + 1)) return true;
      unbindPair(b, g.as, rec);
      return fail(s, i);
    }
    case 'got': {
      const from = g.from ? evalNode(g.from, ctx, rule.name) : undefined;
      const inbox = ctx.w.nodes[ctx.node].inbox;
      for (let k = 0; k < inbox.length; k++) {
        const m = inbox[k];
        if (m.kind !== g.msgKind || (from !== undefined && m.from !== from) || b.usedMessages.has(m.id)) continue;
        b.dirty = true;
        b.usedMessages.add(m.id);
        if (g.as) b.messages.set(g.as, m);
        if (search(s, i + 1)) return true;
        b.usedMessages.delete(m.id);
        if (g.as) b.messages.delete(g.as);
      }
      return fail(s, i);
    }
    case 'check': {
      if (truthy(evalIn(g.expr, ctx.scope, ctx.node, rule.name), g.expr, ctx.node, rule.name) && search(s, i + 1)) return true;
      return fail(s, i);
    }
  }
}

/**
 * Tries a rule's guards against the node's current state. On success the bindings hold the
 * matched pairs and messages; on failure `deepest` (if given) tells which guard blocked it.
 */
export function matchRule(ctx: MatchContext, rule: Rule, deepest?: { value?: DeepestFailure }): boolean {
  ctx.scope.bindings.clear();
  if (deepest !== undefined) return search({ ctx, rule, deepest, budget: SEARCH_BUDGET, lists: [] }, 0);
  // the engine's own attempts share one search record: matching is synchronous and never nested
  const s = shared;
  s.ctx = ctx;
  s.rule = rule;
  s.budget = SEARCH_BUDGET;
  const ok = search(s, 0);
  return ok;
}

const shared: Search = { ctx: undefined as unknown as MatchContext, rule: undefined as unknown as Rule, budget: 0, lists: [] };
