/**
 * "Why is this rule not firing?", guard by guard, in words a person can act on. The stall
 * report, the session's explanations and the TUI's rules pane all read this.
 */
import { evaluate, formatValue } from '../expr/index.js';
import type { ExprNode, Value } from '../expr/types.js';
import { formatDuration } from '../model/units.js';
import type { Guard, Rule } from '../model/types.js';
import { slotStarvation } from './explain-slots.js';
import { shortPairId } from './ids.js';
import { evalIn, evalNode, gotCandidates, haveCandidates, matchRule, type DeepestFailure, type MatchContext } from './match.js';
import type { Net } from './net.js';
import { heldHalf } from './pair-state.js';
import { Bindings, RuleScope } from './scope.js';
import type { Message, World } from './types.js';

export type GuardState = 'holds' | 'fails' | 'unreached';

export interface GuardStatus {
  readonly index: number;
  readonly kind: Guard['kind'];
  /** The guard as written, in one short line. */
  readonly text: string;
  readonly state: GuardState;
  /** For the failing guard: what it waits for and what is there instead. */
  readonly reason?: string;
}

export interface RuleExplanation {
  readonly node: string;
  readonly rule: string;
  /** The rule's guards all hold right now. */
  readonly ready: boolean;
  /** The node is busy with earlier operations until this time (ns). */
  readonly busyUntil?: number;
  readonly guards: readonly GuardStatus[];
  /** The failing guard's reason, or a note that the rule is ready. */
  readonly summary: string;
}

/** One line describing a guard as written. */
export function guardText(g: Guard): string {
  switch (g.kind) {
    case 'have': {
      const parts = [`partner ${g.partner.compiled.source}`, `stage ${g.stage}`];
      if (g.count !== 1) parts.push(`count ${g.count}`);
      if (g.pick !== 'oldest') parts.push(`pick ${g.pick}`);
      if (g.minAgeNs !== undefined) parts.push(`min_age ${formatDuration(g.minAgeNs)}`);
      if (g.maxAgeNs !== undefined) parts.push(`max_age ${formatDuration(g.maxAgeNs)}`);
      if (g.minWaitNs !== undefined) parts.push(`min_wait ${formatDuration(g.minWaitNs)}`);
      if (g.maxWaitNs !== undefined) parts.push(`max_wait ${formatDuration(g.maxWaitNs)}`);
      return `have ${parts.join(', ')}${g.as.length ? ` as ${g.as.join(', ')}` : ''}`;
    }
    case 'have-id':
      return `have id ${g.id.compiled.source}${g.stage ? `, stage ${g.stage}` : ''}${g.as ? ` as ${g.as}` : ''}`;
    case 'got':
      return `got ${g.msgKind}${g.from ? ` from ${g.from.compiled.source}` : ''}${g.as ? ` as ${g.as}` : ''}`;
    case 'check':
      return `check ${g.expr.compiled.source}`;
  }
}

function list(ids: readonly string[], max = 4): string {
  const shown = ids.slice(0, max).map(shortPairId);
  return ids.length > max ? `${shown.join(', ')} and ${ids.length - max} more` : shown.join(', ');
}

function describeMessage(m: Message): string {
  return `${m.kind} from ${m.from}${m.pair ? ` about ${m.pair}` : ''}`;
}

function restore(b: Bindings, snap: DeepestFailure['bound']): void {
  b.clear();
  b.dirty = true;
  for (const [k, v] of snap.pairs) {
    b.pairs.set(k, v);
    b.usedQubits.add(v);
  }
  for (const [k, v] of snap.messages) {
    b.messages.set(k, v);
    b.usedMessages.add(v.id);
  }
  for (const [k, v] of snap.values) b.values.set(k, v);
}

/** Names and fields read by an expression, with their current values, for a failed check. */
function readings(ast: ExprNode, scope: RuleScope, source: string): string[] {
  const out = new Map<string, string>();
  const visit = (n: ExprNode): void => {
    if (n.type === 'member' || n.type === 'name') {
      const text = source.slice(n.start, n.end);
      if (!out.has(text)) {
        try {
          const v: Value = evaluate({ source: text, ast: n, names: [], calls: [] }, scope);
          if (n.type === 'member' || typeof v !== 'string' || v !== text) out.set(text, formatValue(v));
        } catch {
          // a part that cannot be read is left out; the check's own error names it
        }
      }
      if (n.type === 'member') visit(n.object);
      return;
    }
    const children: ExprNode[] =
      n.type === 'unary' ? [n.argument]
      : n.type === 'binary' ? [n.left, n.right]
      : n.type === 'conditional' ? [n.test, n.consequent, n.alternate]
      : n.type === 'call' ? [...n.args]
      : n.type === 'index' ? [n.object, n.index]
      : [];
    children.forEach(visit);
  };
  visit(ast);
  return [...out].map(([k, v]) => `${k} = ${v}`);
}

function inflightNote(w: World, to: string, kind: string, from: string | undefined): string {
  const flying = [...w.inflight.values()].filter((m) => m.to === to && m.kind === kind && (from === undefined || m.from === from));
  if (flying.length === 0) return `no ${kind} is in flight to ${to}`;
  const soonest = Math.min(...flying.map((m) => m.arrives));
  return `${flying.length} ${kind} in flight, the first arriving in ${formatDuration(soonest - w.time)}`;
}

/** Why the guard at `i` fails, given the bindings in force when the search reached it. */
function reasonFor(net: Net, ctx: MatchContext, rule: Rule, i: number): string {
  const g = rule.when[i];
  const pairs = Object.values(ctx.w.nodes[ctx.node].pairs);
  const where = { node: ctx.node, rule: rule.name };
  const used = ctx.scope.bindings.usedQubits;
  switch (g.kind) {
    case 'have': {
      const partner = evalNode(g.partner, ctx, rule.name);
      const withPartner = pairs.filter((p) => p.partner === partner && !used.has(p.qubit));
      const inStage = withPartner.filter((p) => p.stage === g.stage).sort((a, b) => a.order - b.order);
      const ok = haveCandidates(ctx, g, partner, used);
      const want = g.count === 1 ? 'a pair' : `${g.count} pairs`;
      let text = `waits for ${want} with ${partner} in stage "${g.stage}"`;
      if (inStage.length >= g.count && ok.length < g.count) {
        const young = inStage.filter((p) => g.minAgeNs !== undefined && ctx.scope.now - p.born < g.minAgeNs);
        const old = inStage.filter((p) => g.maxAgeNs !== undefined && ctx.scope.now - p.born > g.maxAgeNs);
        if (young.length) text += `; ${list(young.map((p) => p.id))} is ${formatDuration(ctx.scope.now - young[0].born)} old, younger than min_age ${formatDuration(g.minAgeNs!)}`;
        if (old.length) text += `; ${list(old.map((p) => p.id))} is older than max_age ${formatDuration(g.maxAgeNs!)}`;
        const fresh = inStage.filter((p) => g.minWaitNs !== undefined && ctx.scope.now - p.entered < g.minWaitNs);
        const stale = inStage.filter((p) => g.maxWaitNs !== undefined && ctx.scope.now - p.entered > g.maxWaitNs);
        if (fresh.length) {
          const first = fresh[0];
          const due = formatDuration(first.entered + g.minWaitNs!);
          // a stage step runs at the node's local time, which may be ahead of the event's
          const since = first.entered > ctx.scope.now ? `enters stage "${g.stage}" at ${formatDuration(first.entered)}, once the node's operations are done` : `entered stage "${g.stage}" ${formatDuration(ctx.scope.now - first.entered)} ago`;
          text += `; ${list(fresh.map((p) => p.id))} ${since}, less than min_wait ${formatDuration(g.minWaitNs!)} (due at ${due})`;
        }
        if (stale.length) text += `; ${list(stale.map((p) => p.id))} has been in stage "${g.stage}" longer than max_wait ${formatDuration(g.maxWaitNs!)}`;
        return text;
      }
      text += inStage.length ? `; holds ${inStage.length}: ${list(inStage.map((p) => p.id))}` : `; holds none`;
      const other = withPartner.filter((p) => p.stage !== g.stage);
      if (other.length) text += `; with ${partner} in other stages: ${other.map((p) => `${shortPairId(p.id)} (${p.stage})`).join(', ')}`;
      const taken = pairs.filter((p) => p.partner === partner && p.stage === g.stage && used.has(p.qubit));
      if (taken.length) text += `; ${list(taken.map((p) => p.id))} already bound by an earlier guard`;
      // the root cause when no pair can come: the link to the partner has no free slot at an end
      const starved = slotStarvation(net, ctx.w, ctx.node, partner);
      if (starved) text += `; ${starved}`;
      return text;
    }
    case 'have-id': {
      const id = evalIn(g.id, ctx.scope, where.node, where.rule);
      const same = pairs.filter((p) => p.id === id);
      const stage = g.stage ? ` in stage "${g.stage}"` : '';
      if (same.length && g.stage) return `waits for pair ${formatValue(id)}${stage}; it is held in stage "${same[0].stage}"`;
      if (same.length) return `waits for pair ${formatValue(id)}; it is already bound by an earlier guard`;
      const peers = pairs.filter((p) => g.stage === undefined || p.stage === g.stage).map((p) => p.id);
      return `waits for pair ${formatValue(id)}${stage}; this node does not hold it${peers.length ? `; it holds ${list(peers)}${stage}` : ''}`;
    }
    case 'got': {
      const from = g.from ? evalNode(g.from, ctx, rule.name) : undefined;
      const src = from ? ` from ${from}` : '';
      const inbox = ctx.w.nodes[ctx.node].inbox;
      const sameKind = gotCandidates(ctx, g.msgKind, undefined, new Set());
      let text = `waits for ${/^[aeiou]/i.test(g.msgKind) ? 'an' : 'a'} "${g.msgKind}" message${src}`;
      if (sameKind.length) text += `; the inbox holds ${sameKind.length} from ${[...new Set(sameKind.map((m) => m.from))].join(', ')}`;
      else if (inbox.length) text += `; the inbox holds ${inbox.slice(0, 3).map(describeMessage).join(', ')}${inbox.length > 3 ? ', ...' : ''}`;
      else text += '; the inbox is empty';
      text += `; ${inflightNote(ctx.w, ctx.node, g.msgKind, from)}`;
      const lost = ctx.w.lost.filter((m) => m.to === ctx.node && m.kind === g.msgKind && (from === undefined || m.from === from));
      if (lost.length) {
        const m = lost[lost.length - 1];
        text += `; one was lost: ${m.from} sent it at ${formatDuration(m.sent)}${m.pair ? ` about ${m.pair}` : ''} (${m.dropped})`;
      }
      return text;
    }
    case 'check': {
      const shown = readings(g.expr.compiled.ast, ctx.scope, g.expr.compiled.source);
      const pairMsg = matchPairAbout(ctx, g.expr.compiled.source);
      if (pairMsg) return pairMsg;
      return `check "${g.expr.compiled.source}" is false${shown.length ? ` (${shown.join(', ')})` : ''}`;
    }
  }
}

/**
 * The common coordination failure: a check that a message is about a bound pair. Phrased
 * the way people say it: which message it waits for, and what the inbox holds instead.
 */
function matchPairAbout(ctx: MatchContext, source: string): string | undefined {
  const m = /^\s*(\w+)\.pair\s*==\s*(\w+)\.id\s*$|^\s*(\w+)\.id\s*==\s*(\w+)\.pair\s*$/.exec(source);
  if (!m) return undefined;
  const msgName = m[1] ?? m[4];
  const pairName = m[2] ?? m[3];
  const msg = ctx.scope.bindings.messages.get(msgName);
  const q = ctx.scope.bindings.pairs.get(pairName);
  const rec = q !== undefined ? heldHalf(ctx.w.nodes[ctx.node].pairs, q) : undefined;
  if (!msg || !rec) return undefined;
  const all = gotCandidates(ctx, msg.kind, msg.from, new Set());
  const abouts = [...new Set(all.map((x) => x.pair ?? 'no pair'))];
  return (
    `waits for ${/^[aeiou]/i.test(msg.kind) ? 'an' : 'a'} "${msg.kind}" message from ${msg.from} about pair ${rec.id}; ` +
    `the inbox holds ${all.length === 1 ? 'one' : all.length} about ${abouts.join(', ')}`
  );
}

/** Explains one rule of one node against a world, guard by guard. */
export function explainRule(net: Net, w: World, node: string, rule: Rule): RuleExplanation {
  const scope = new RuleScope(net, w, node, new Bindings());
  const ctx: MatchContext = { w, node, scope, nodeIds: net.nodeSet };
  const deepest: { value?: DeepestFailure } = {};
  const busyUntil = w.nodes[node].busyUntil > w.time ? w.nodes[node].busyUntil : undefined;
  let ready: boolean;
  let reason: string;
  try {
    ready = matchRule(ctx, rule, deepest);
    if (ready) reason = 'all guards hold';
    else {
      restore(scope.bindings, deepest.value!.bound);
      reason = reasonFor(net, ctx, rule, deepest.value!.guard);
    }
  } catch (e) {
    ready = false;
    reason = `cannot be evaluated: ${e instanceof Error ? e.message : String(e)}`;
    deepest.value ??= { guard: 0, bound: { pairs: new Map(), messages: new Map(), values: new Map() } };
  }
  const failing = ready ? rule.when.length : (deepest.value?.guard ?? 0);
  const guards = rule.when.map((g, index) => ({
    index,
    kind: g.kind,
    text: guardText(g),
    state: (index < failing ? 'holds' : index === failing ? 'fails' : 'unreached') as GuardState,
    reason: index === failing ? reason : undefined,
  }));
  const summary = busyUntil !== undefined ? `node busy until ${formatDuration(busyUntil)}; then: ${reason}` : reason;
  return { node, rule: rule.name, ready, busyUntil, guards, summary };
}

/** Every rule of a node, explained. */
export function explainNode(net: Net, w: World, node: string): RuleExplanation[] {
  return (net.rules.get(node) ?? []).map((r) => explainRule(net, w, node, r));
}

/** A waiting rule in a stall report (docs/cli.md): the failing guard and why. */
export interface StallEntry {
  rule: string;
  guard: number;
  kind: Guard['kind'];
  text: string;
  reason: string;
  /** For a rule that came from a role: `roles.repeater.rules[0] (at s8, left=s0 right=s16)`. */
  from?: string;
}

/** The stall report: each node with a program, mapped to its waiting rules. */
export function stallReport(net: Net, w: World): Record<string, StallEntry[]> {
  const out: Record<string, StallEntry[]> = {};
  for (const node of net.nodeIds) {
    const rules = net.rules.get(node) ?? [];
    if (rules.length === 0) continue;
    out[node] = explainNode(net, w, node)
      .map((e, i) => ({ e, from: rules[i].from }))
      .filter(({ e }) => !e.ready)
      .map(({ e, from }) => {
        const g = e.guards.find((x) => x.state === 'fails')!;
        const entry: StallEntry = { rule: e.rule, guard: g.index, kind: g.kind, text: g.text, reason: g.reason ?? e.summary };
        if (from) entry.from = from.text;
        return entry;
      });
  }
  return out;
}
