/**
 * The rule interpreter's outer loop: after an event touches a node, its rules are tried in
 * order and the first whose guards hold fires; the scan restarts until none fires. Then
 * wake-ups are scheduled for the moments age guards will change their answer.
 */
import type { Rule } from '../model/types.js';
import { ProgramError } from './errors.js';
import { heapPush } from './heap.js';
import { runSteps } from './fire.js';
import { matchRule, staticNodeOf, type MatchContext } from './match.js';
import type { Net } from './net.js';
import { Bindings, RuleScope } from './scope.js';
import { heldHalf } from './pair-state.js';
import type { EngineEvent, FireRecord, World } from './types.js';

/** A node that fires more than this many times within one event is in a rule loop (docs/format.md). */
export const RULE_LOOP_LIMIT = 1000;

/** Schedules a wake-up for a node at time t, unless one at or before t is already pending. */
export function requestWake(w: World, node: string, t: number, why: string): void {
  const n = w.nodes[node];
  if (n.nextWake !== null && n.nextWake > w.time && n.nextWake <= t) return;
  n.nextWake = t;
  heapPush(w.queue, { time: t, seq: w.seq++, type: 'wake', node, why });
}

function describeBound(ctx: MatchContext): Record<string, string> {
  const out: Record<string, string> = {};
  const pairs = ctx.w.nodes[ctx.node].pairs;
  for (const [name, q] of ctx.scope.bindings.pairs) out[name] = heldHalf(pairs, q)?.id ?? `q${q}`;
  for (const [name, m] of ctx.scope.bindings.messages) out[name] = `${m.kind} from ${m.from}${m.pair ? ` about ${m.pair}` : ''}`;
  return out;
}

const NO_BOUND: Record<string, string> = Object.freeze({}) as Record<string, string>;
const NO_LINES: string[] = Object.freeze([]) as unknown as string[];

/** Tries the node's rules until none fires; with `detail` off, firings record only the rule. */
export function scanNode(net: Net, w: World, node: string, ev: EngineEvent, detail = true): void {
  const rules = net.rules.get(node);
  if (!rules || rules.length === 0) return;
  const state = w.nodes[node];
  let scope = net.scope;
  if (!scope) {
    scope = new RuleScope(net, w, node, new Bindings());
    net.scope = scope;
  } else scope.reset(w, node);
  const ctx: MatchContext = { w, node, scope, nodeIds: net.nodeSet };
  let fires = 0;
  let last: Rule | undefined;
  for (;;) {
    if (state.busyUntil > w.time) {
      requestWake(w, node, state.busyUntil, 'operations done');
      break;
    }
    scope.now = w.time;
    let rule: Rule | undefined;
    for (let i = 0; i < rules.length; i++) {
      if (matchRule(ctx, rules[i])) {
        rule = rules[i];
        break;
      }
    }
    if (!rule) break;
    if (++fires > RULE_LOOP_LIMIT) {
      throw new ProgramError(`rule loop: fired more than ${RULE_LOOP_LIMIT} times within one event (last: ${rule.name}, before it: ${last?.name ?? '-'})`, {
        pos: rule.pos,
        node,
        rule: rule.name,
        fix: 'make the rule consume what its guards match (stage, measure, discard the pair or bind the message), or add a guard that stops it',
      });
    }
    last = rule;
    const fire: FireRecord = { node, rule: rule.name, bound: detail ? describeBound(ctx) : NO_BOUND, actions: detail ? [] : NO_LINES, log: NO_LINES };
    // consume the matched messages before the body runs, so it cannot match them again
    const used = scope.bindings.usedMessages;
    if (used.size > 0) {
      const inbox = state.inbox;
      let k = 0;
      for (let i = 0; i < inbox.length; i++) if (!used.has(inbox[i].id)) inbox[k++] = inbox[i];
      inbox.length = k;
    }
    runSteps({ w, node, scope, nodeIds: net.nodeSet, net, rule, ev, fire, detail }, rule.do);
    if (ev.fires.length === 0) ev.fires = [fire];
    else ev.fires.push(fire);
    state.fired[rule.name] = (state.fired[rule.name] ?? 0) + 1;
    if (scope.now > w.time) state.busyUntil = scope.now;
  }
  scheduleAgeWakes(net, w, node, rules);
}

/**
 * Next moment a pair at the node reaches some rule's `min_age` or `min_wait`, or passes its
 * `max_age` or `max_wait`, so that timed rules fire on time without polling.
 */
function scheduleAgeWakes(net: Net, w: World, node: string, rules: readonly Rule[]): void {
  if (!net.hasAgeGuards(node)) return;
  const pairs = w.nodes[node].pairs;
  if (pairs.length === 0) return;
  let next = Infinity;
  let why = 'age limit';
  for (const rule of rules) {
    for (const g of rule.when) {
      if (g.kind !== 'have' || (g.minAgeNs === undefined && g.maxAgeNs === undefined && g.minWaitNs === undefined && g.maxWaitNs === undefined)) continue;
      const partner = staticNodeOf(g.partner, net.nodeSet) ?? undefined;
      for (const p of pairs) {
        if (p.stage !== g.stage || (partner !== undefined && p.partner !== partner)) continue;
        // each bound: the moment it changes its answer, if that is still to come and sooner
        let t = g.minAgeNs === undefined ? Infinity : p.born + g.minAgeNs;
        if (t > w.time && t < next) {
          next = t;
          why = 'age limit';
        }
        t = g.maxAgeNs === undefined ? Infinity : p.born + g.maxAgeNs + 1;
        if (t > w.time && t < next) {
          next = t;
          why = 'age limit';
        }
        t = g.minWaitNs === undefined ? Infinity : p.entered + g.minWaitNs;
        if (t > w.time && t < next) {
          next = t;
          why = 'stage timer';
        }
        t = g.maxWaitNs === undefined ? Infinity : p.entered + g.maxWaitNs + 1;
        if (t > w.time && t < next) {
          next = t;
          why = 'stage timer';
        }
      }
    }
  }
  if (next !== Infinity) requestWake(w, node, next, why);
}
