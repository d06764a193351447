/** What the program text says about messages, stages and pairs, gathered once for the lint checks. */
import { staticNode } from './expressions.js';
import type { CheckGuard, GotGuard, HaveGuard, HaveIdGuard, ProgramSet, Rule, SendStep, SourcePos, StageStep, Step } from './types.js';

/** A static-analysis finding: what is wrong, where, and what to do. */
export interface Finding {
  /** Stable kebab-case code, e.g. `message-unawaited`. */
  readonly code: string;
  readonly file: string;
  readonly line: number;
  readonly col: number;
  readonly message: string;
  readonly fix: string;
}

export interface SendFact {
  readonly node: string;
  readonly rule: Rule;
  readonly step: SendStep;
  /** The destination when the program names it outright. */
  readonly to?: string;
}
export interface GotFact {
  readonly node: string;
  readonly rule: Rule;
  readonly guard: GotGuard;
  /** The only accepted sender when the program names it outright. */
  readonly from?: string;
}
export interface HaveFact {
  readonly node: string;
  readonly rule: Rule;
  readonly guard: HaveGuard | HaveIdGuard;
  /** The partner when the program names it outright (have-by-partner only). */
  readonly partner?: string;
}
export interface StageFact {
  readonly node: string;
  readonly rule: Rule;
  readonly step: StageStep;
}
export interface CheckFact {
  readonly node: string;
  readonly rule: Rule;
  readonly guard: CheckGuard;
}

export interface Facts {
  readonly nodeIds: ReadonlySet<string>;
  readonly sends: readonly SendFact[];
  readonly gots: readonly GotFact[];
  readonly haves: readonly HaveFact[];
  readonly stages: readonly StageFact[];
  readonly checks: readonly CheckFact[];
  /** Nodes with a rule that rebinds a pair. */
  readonly rebinders: ReadonlySet<string>;
  /** Whether any rule anywhere swaps or rebinds, so pairs with non-neighbours can arise. */
  readonly anySwap: boolean;
}

/** Every step of a block, branches included, in source order. */
export function allSteps(steps: readonly Step[]): Step[] {
  const out: Step[] = [];
  for (const s of steps) {
    out.push(s);
    if (s.kind === 'if') out.push(...allSteps(s.then), ...allSteps(s.else));
  }
  return out;
}

/** Reads the facts the lint checks work from. */
export function gatherFacts(ps: ProgramSet): Facts {
  const nodeIds = new Set(ps.nodes.map((n) => n.id));
  const sends: SendFact[] = [];
  const gots: GotFact[] = [];
  const haves: HaveFact[] = [];
  const stages: StageFact[] = [];
  const checks: CheckFact[] = [];
  const rebinders = new Set<string>();
  let anySwap = false;
  for (const program of Object.values(ps.programs)) {
    const node = program.node;
    for (const rule of program.rules) {
      for (const g of rule.when) {
        if (g.kind === 'got') gots.push({ node, rule, guard: g, ...(g.from ? optional('from', staticNode(g.from, nodeIds)) : {}) });
        else if (g.kind === 'have') haves.push({ node, rule, guard: g, ...optional('partner', staticNode(g.partner, nodeIds)) });
        else if (g.kind === 'have-id') haves.push({ node, rule, guard: g });
        else checks.push({ node, rule, guard: g });
      }
      for (const s of allSteps(rule.do)) {
        if (s.kind === 'send') sends.push({ node, rule, step: s, ...optional('to', staticNode(s.to, nodeIds)) });
        else if (s.kind === 'stage') stages.push({ node, rule, step: s });
        else if (s.kind === 'rebind') {
          rebinders.add(node);
          anySwap = true;
        } else if (s.kind === 'bell_measure') anySwap = true;
      }
    }
  }
  return { nodeIds, sends, gots, haves, stages, checks, rebinders, anySwap };
}

function optional<K extends string>(key: K, value: string | undefined): Partial<Record<K, string>> {
  return value === undefined ? {} : ({ [key]: value } as Record<K, string>);
}

// Which rule each finding is about, kept beside the findings so their JSON keys stay as they are.
const aboutRule = new WeakMap<Finding, Rule>();

/** A finding located at `pos`, about `rule`. */
export function finding(code: string, pos: SourcePos, message: string, fix: string, rule: Rule): Finding {
  const f: Finding = { code, file: pos.file, line: pos.line, col: pos.col, message, fix };
  aboutRule.set(f, rule);
  return f;
}

/** The rule a finding is about (the debugger shows findings under their rule). */
export function findingRule(f: Finding): Rule | undefined {
  return aboutRule.get(f);
}

/** `rule "swap" at s8`, or for a rule a role made, `rule "swap" from roles.repeater.rules[0] (at s8, left=s0 right=s16)`. */
export function ruleAtNode(rule: Rule): string {
  return rule.from ? `rule "${rule.name}" from ${rule.from.text}` : `rule "${rule.name}" at ${rule.node}`;
}

/** `rule "swap" (line 14)`, followed by the role entry for a rule a role made. */
export function ruleWithLine(rule: Rule): string {
  return `rule "${rule.name}" (line ${rule.pos.line})${rule.from ? ` from ${rule.from.text}` : ''}`;
}
