/**
 * Lint of what flows between rules: message kinds sent but never awaited (and awaited but
 * never sent), and stages entered but never matched (and expected but never entered).
 * When the two sides differ by a small spelling change, one finding names both spellings.
 */
import { finding, ruleAtNode, ruleWithLine, type Facts, type Finding, type GotFact, type HaveFact, type SendFact, type StageFact } from './lint-facts.js';
import type { Rule } from './types.js';
import { editDistance } from './suggest.js';

/** Near spellings that count as a likely typo. */
const TYPO_DISTANCE = 2;

function line(f: { rule: Rule }): string {
  return ruleWithLine(f.rule);
}

function awaits(g: GotFact, s: SendFact, kind = s.step.msgKind): boolean {
  return g.node === s.to && g.guard.msgKind === kind && (g.from === undefined || g.from === s.node);
}

function reaches(s: SendFact, g: GotFact, kind = g.guard.msgKind): boolean {
  return s.step.msgKind === kind && (s.to === undefined || s.to === g.node) && (g.from === undefined || g.from === s.node);
}

/** Message kinds: every statically addressed send needs a got there, every got a sender. */
export function lintMessages(facts: Facts): Finding[] {
  const out: Finding[] = [];
  // indexed by kind: large networks have thousands of each
  const gotsByKind = groupBy(facts.gots, (g) => g.guard.msgKind);
  const sendsByKind = groupBy(facts.sends, (s) => s.step.msgKind);
  const unawaited = facts.sends.filter((s) => s.to !== undefined && !(gotsByKind.get(s.step.msgKind) ?? []).some((g) => awaits(g, s)));
  const unsent = facts.gots.filter((g) => !(sendsByKind.get(g.guard.msgKind) ?? []).some((s) => reaches(s, g)));
  const explained = new Set<SendFact>();
  for (const g of unsent) {
    const near = unawaited
      .filter((s) => s.to === g.node && (g.from === undefined || g.from === s.node))
      .map((s) => ({ s, d: editDistance(s.step.msgKind, g.guard.msgKind) }))
      .filter((x) => x.d <= TYPO_DISTANCE)
      .sort((a, b) => a.d - b.d)[0];
    if (near) {
      const sent = near.s.step.msgKind;
      for (const s of unawaited) if (s.to === g.node && s.step.msgKind === sent) explained.add(s);
      out.push(
        finding(
          'message-typo',
          g.guard.pos,
          `${g.node} waits for message kind "${g.guard.msgKind}" in ${line(g)}, but ${near.s.node} sends "${sent}" to ${g.node} (line ${near.s.step.pos.line}): probably a typo, and the rule can never fire`,
          `spell the kind the same in both places ("${sent}" or "${g.guard.msgKind}")`,
          g.rule,
        ),
      );
      continue;
    }
    const from = g.from === undefined ? '' : ` from ${g.from}`;
    out.push(
      finding(
        'rule-dead',
        g.rule.pos,
        `${ruleAtNode(g.rule)} can never fire: its got guard (line ${g.guard.pos.line}) waits for message kind "${g.guard.msgKind}"${from}, which no rule sends to ${g.node}`,
        `add a send of "${g.guard.msgKind}" to ${g.node}${g.from ? ` in a rule at ${g.from}` : ''}, or fix the kind`,
        g.rule,
      ),
    );
  }
  for (const s of unawaited) {
    if (explained.has(s)) continue;
    const others = (gotsByKind.get(s.step.msgKind) ?? []).filter((g) => g.node === s.to);
    const why = others.length > 0 ? ` (its got guards for "${s.step.msgKind}" accept only messages from ${others.map((g) => g.from).join(', ')})` : '';
    out.push(
      finding(
        'message-unawaited',
        s.step.pos,
        `${s.node} sends message kind "${s.step.msgKind}" to ${s.to} in ${line(s)}, but no rule at ${s.to} waits for it${why}`,
        `add a rule at ${s.to} with "got: {kind: ${s.step.msgKind}}", or remove the send`,
        s.rule,
      ),
    );
  }
  return out;
}

/** Items grouped by a key, in their order. */
function groupBy<T>(items: readonly T[], key: (t: T) => string): Map<string, T[]> {
  const out = new Map<string, T[]>();
  for (const it of items) {
    const k = key(it);
    const list = out.get(k);
    if (list) list.push(it);
    else out.set(k, [it]);
  }
  return out;
}

function haveStage(h: HaveFact): string | undefined {
  return h.guard.stage;
}

/** Stages: every stage a step enters should be matched by a have there, and every stage a have expects entered. */
export function lintStages(facts: Facts): Finding[] {
  const out: Finding[] = [];
  const nodes = new Set([...facts.stages.map((s) => s.node), ...facts.haves.map((h) => h.node)]);
  const havesAt = groupBy(facts.haves, (h) => h.node);
  const stagesAt = groupBy(facts.stages, (s) => s.node);
  for (const node of nodes) {
    const haves = havesAt.get(node) ?? [];
    const steps = stagesAt.get(node) ?? [];
    // A have by id without a stage takes a pair in any stage, so every stage is matched.
    const matchesAny = haves.some((h) => h.guard.kind === 'have-id' && h.guard.stage === undefined);
    const matched = new Set(haves.map(haveStage).filter((s): s is string => s !== undefined));
    // the stages a node's rules move pairs into; `link` is where generated pairs start
    const entered = new Set(['link', ...steps.map((s) => s.step.to)]);
    const unmatched = matchesAny ? [] : steps.filter((s) => !matched.has(s.step.to));
    const unentered = haves.filter((h) => {
      const st = haveStage(h);
      return st !== undefined && !entered.has(st);
    });
    const explained = new Set<StageFact>();
    for (const h of unentered) {
      const want = haveStage(h) as string;
      const near = unmatched
        .map((s) => ({ s, d: editDistance(s.step.to, want) }))
        .filter((x) => x.d <= TYPO_DISTANCE)
        .sort((a, b) => a.d - b.d)[0];
      if (near) {
        const got = near.s.step.to;
        for (const s of unmatched) if (s.step.to === got) explained.add(s);
        out.push(
          finding(
            'stage-typo',
            h.guard.pos,
            `at ${node}, ${line(h)} waits for pairs in stage "${want}", but ${line(near.s)} moves pairs to stage "${got}": probably a typo, and the rule can never fire`,
            `spell the stage the same in both places ("${got}" or "${want}")`,
            h.rule,
          ),
        );
        continue;
      }
      out.push(
        finding(
          'stage-unentered',
          h.guard.pos,
          `at ${node}, ${line(h)} waits for pairs in stage "${want}", but no rule at ${node} moves a pair there, so the rule can never fire`,
          `add a step "stage: {pair: ..., to: ${want}}" to a rule at ${node}, or expect a stage that is entered (${[...entered].join(', ')})`,
          h.rule,
        ),
      );
    }
    for (const s of unmatched) {
      if (explained.has(s)) continue;
      out.push(
        finding(
          'stage-unmatched',
          s.step.pos,
          `at ${node}, ${line(s)} moves a pair to stage "${s.step.to}", but no have guard at ${node} takes pairs in that stage, so they stay held`,
          `add a rule at ${node} with "have: {partner: ..., stage: ${s.step.to}}", or move the pair to a stage that is used`,
          s.rule,
        ),
      );
    }
  }
  return out;
}
