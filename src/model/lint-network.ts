/**
 * Lint against the link graph: partners and destinations that are the node itself or that
 * no fiber path reaches, and rules that can never fire (too few slots, a non-neighbour
 * partner with no swapping anywhere, a check that is the literal false).
 */
import { literalValue } from './expressions.js';
import { finding, ruleAtNode, type Facts, type Finding } from './lint-facts.js';
import type { LinkDef, ProgramSet } from './types.js';

/** Link ids by node pair, and which nodes fiber connects (one label per connected part). */
class Graph {
  private readonly byPair = new Map<string, LinkDef>();
  private readonly part = new Map<string, number>();

  constructor(ps: ProgramSet) {
    const adjacent = new Map<string, string[]>();
    for (const n of ps.nodes) adjacent.set(n.id, []);
    for (const l of ps.links) {
      this.byPair.set(l.id, l);
      adjacent.get(l.ends[0])?.push(l.ends[1]);
      adjacent.get(l.ends[1])?.push(l.ends[0]);
    }
    // label the connected parts once, by a search with an index for a queue: linear in the graph
    let label = 0;
    for (const start of adjacent.keys()) {
      if (this.part.has(start)) continue;
      const queue = [start];
      this.part.set(start, label);
      for (let head = 0; head < queue.length; head++) {
        for (const m of adjacent.get(queue[head]) ?? []) {
          if (this.part.has(m)) continue;
          this.part.set(m, label);
          queue.push(m);
        }
      }
      label++;
    }
  }

  link(a: string, b: string): LinkDef | undefined {
    return this.byPair.get(a < b ? `${a}~${b}` : `${b}~${a}`);
  }

  reachable(from: string, to: string): boolean {
    const p = this.part.get(from);
    return p !== undefined && p === this.part.get(to);
  }
}

/** Static partners and destinations must be other nodes that fiber reaches. */
export function lintReach(ps: ProgramSet, facts: Facts): Finding[] {
  const g = new Graph(ps);
  const out: Finding[] = [];
  for (const h of facts.haves) {
    if (h.partner === undefined) continue;
    const where = ruleAtNode(h.rule);
    if (h.partner === h.node) {
      out.push(finding('partner-self', h.guard.pos, `${where} waits for pairs shared with ${h.node} itself, which cannot exist`, "name the node at the pair's other end", h.rule));
    } else if (!g.reachable(h.node, h.partner)) {
      out.push(
        finding(
          'partner-unreachable',
          h.guard.pos,
          `${where} waits for pairs shared with ${h.partner}, but no fiber path joins ${h.node} and ${h.partner}, so no such pair can ever arise`,
          `add links that join ${h.node} to ${h.partner}, or pick a partner in the same network`,
          h.rule,
        ),
      );
    }
  }
  for (const s of facts.sends) {
    if (s.to === undefined) continue;
    const where = ruleAtNode(s.rule);
    if (s.to === s.node) {
      out.push(finding('partner-self', s.step.pos, `${where} sends "${s.step.msgKind}" to ${s.node} itself`, 'messages go to other nodes; keep the value in a note on the pair instead', s.rule));
    } else if (!g.reachable(s.node, s.to)) {
      out.push(
        finding(
          'partner-unreachable',
          s.step.pos,
          `${where} sends "${s.step.msgKind}" to ${s.to}, but messages travel the fiber and no path joins ${s.node} and ${s.to}`,
          `add links that join ${s.node} to ${s.to}, or send to a node in the same network`,
          s.rule,
        ),
      );
    }
  }
  return out;
}

/** Rules whose guards can never all hold, reported at the rule with the guard that blocks it. */
export function lintDeadRules(ps: ProgramSet, facts: Facts): Finding[] {
  const g = new Graph(ps);
  const out: Finding[] = [];
  const stagesIntoLink = new Set(facts.stages.filter((s) => s.step.to === 'link').map((s) => s.node));
  for (const h of facts.haves) {
    if (h.guard.kind !== 'have' || h.partner === undefined || h.partner === h.node) continue;
    const guard = h.guard;
    const dead = (why: string, fix: string) =>
      out.push(finding('rule-dead', h.rule.pos, `${ruleAtNode(h.rule)} can never fire: its have guard (line ${guard.pos.line}) ${why}`, fix, h.rule));
    const link = g.link(h.node, h.partner);
    if (link) {
      // Swapped-in pairs (rebind) or pairs moved back to "link" could add to the count.
      const topUp = stagesIntoLink.has(h.node) || facts.rebinders.has(h.node);
      if (guard.stage === 'link' && guard.count > link.slots && !topUp) {
        dead(
          `needs ${guard.count} pairs with ${h.partner} in stage link, but link ${link.id} has only ${link.slots} slot${link.slots === 1 ? '' : 's'}`,
          `lower count to at most ${link.slots}, or raise the slots of ${link.id} to ${guard.count}`,
        );
      }
    } else if (!facts.anySwap && g.reachable(h.node, h.partner)) {
      dead(
        `needs a pair with ${h.partner}, which is not a neighbour of ${h.node}, and no rule anywhere swaps (bell_measure) or rebinds pairs`,
        `add an entanglement swap at a node between ${h.node} and ${h.partner}, or pick a neighbour as partner`,
      );
    }
  }
  for (const c of facts.checks) {
    const v = literalValue(c.guard.expr);
    if (v === false || v === 0 || v === null) {
      out.push(
        finding(
          'rule-dead',
          c.rule.pos,
          `${ruleAtNode(c.rule)} can never fire: its check (line ${c.guard.pos.line}) is always ${String(v)}`,
          'write the intended condition, or remove the rule',
          c.rule,
        ),
      );
    }
  }
  return out;
}
