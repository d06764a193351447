/**
 * Lint of what a rule's body does with what its guards bound: a pair used after the body
 * measured, discarded or delivered it (on every path), fields and values that cannot be
 * (lint-types.ts), and rules that consume nothing they match, so that once they fire they
 * fire again at once, for ever.
 */
import { finding, ruleAtNode, type Facts, type Finding } from './lint-facts.js';
import { FieldIndex } from './lint-fields.js';
import { ExprKinds, stepExpressions, type Bound } from './lint-types.js';
import type { NoiseModel, ProgramSet, Rule, Step } from './types.js';

/** Where a bound pair left the node within the body. */
interface Left {
  readonly how: string;
  readonly line: number;
}

const RELEASING: Readonly<Record<string, string>> = { measure: 'measured', bell_measure: 'Bell-measured', discard: 'discarded', deliver: 'delivered' };

/** The pair names a step acts on (it needs each one held). */
function pairsActedOn(s: Step): readonly string[] {
  switch (s.kind) {
    case 'gate':
      return s.on;
    case 'measure':
      return [s.on];
    case 'bell_measure':
      return s.on;
    case 'stage':
    case 'note':
    case 'correct':
    case 'rebind':
    case 'discard':
    case 'deliver':
      return [s.pair];
    default:
      return [];
  }
}

class BodyCheck {
  constructor(
    private readonly rule: Rule,
    private readonly kinds: ExprKinds,
    private readonly out: Finding[],
  ) {}

  /** Walks a block; returns the pairs surely gone after it. */
  block(steps: readonly Step[], env: Map<string, Bound>, gone: Map<string, Left>): Map<string, Left> {
    let left = new Map(gone);
    for (const s of steps) {
      for (const x of stepExpressions(s)) this.kinds.expect(x.e, env, x.want, x.what);
      if (s.kind === 'if') {
        const a = this.block(s.then, new Map(env), left);
        const b = this.block(s.else, new Map(env), left);
        // gone after the if only when gone on both branches
        left = new Map([...a].filter(([name]) => b.has(name)));
        continue;
      }
      for (const name of pairsActedOn(s)) {
        const was = left.get(name);
        if (was) {
          this.out.push(
            finding(
              'pair-released',
              s.pos,
              `${ruleAtNode(this.rule)} acts on pair "${name}" after it was ${was.how} (line ${was.line}) earlier in the same body, so the pair is no longer held here and the rule stops the run with an error when it fires`,
              `remove this step, or move it before line ${was.line}`,
              this.rule,
            ),
          );
        }
      }
      // values noted now can be read by the steps after this one
      if (s.kind === 'note') {
        const b = env.get(s.pair);
        if (b?.kind === 'pair') for (const k of Object.keys(s.set)) b.noted.add(k);
      }
      const how = RELEASING[s.kind];
      if (how) for (const name of pairsActedOn(s)) if (!left.has(name)) left.set(name, { how, line: s.pos.line });
      if (s.kind === 'measure' && s.as) env.set(s.as, { kind: 'bit' });
      if (s.kind === 'bell_measure') for (const n of s.as) env.set(n, { kind: 'bit' });
    }
    return left;
  }
}

/** Whether any step of the body (in any branch) changes what the rule's guards matched, or takes time. */
function consumes(steps: readonly Step[], stageOf: ReadonlyMap<string, string | undefined>, timed: (s: Step) => boolean): boolean {
  return steps.some((s) => {
    if (s.kind === 'if') return consumes(s.then, stageOf, timed) || consumes(s.else, stageOf, timed);
    if (s.kind in RELEASING || s.kind === 'rebind' || s.kind === 'note') return true;
    // a have by id with no stage takes the pair in any stage, so a move does not free it
    if (s.kind === 'stage') return stageOf.get(s.pair) !== undefined && stageOf.get(s.pair) !== s.to;
    return timed(s);
  });
}

/** A rule that, once it fires, matches the very same things again. */
function loopFinding(rule: Rule, noise: NoiseModel | undefined): Finding | undefined {
  if (rule.when.some((g) => g.kind === 'got')) return undefined;
  const stageOf = new Map<string, string | undefined>();
  for (const g of rule.when) {
    if (g.kind === 'have') for (const n of g.as) stageOf.set(n, g.stage);
    if (g.kind === 'have-id' && g.as) stageOf.set(g.as, g.stage);
  }
  const gates = noise ? (Object.hasOwn(noise.nodes, rule.node) ? noise.nodes[rule.node].gates : noise.defaults.gates) : undefined;
  const durations = (s: Step) => (s.kind === 'gate' ? (s.on.length === 2 ? gates?.two.durationNs : gates?.single.durationNs) : s.kind === 'correct' ? gates?.single.durationNs : 0) ?? 0;
  if (consumes(rule.do, stageOf, () => false)) return undefined;
  const timed = (s: Step): boolean => (s.kind === 'if' ? s.then.some(timed) || s.else.some(timed) : durations(s) > 0);
  const busy = rule.do.some(timed);
  return finding(
    'rule-loop',
    rule.pos,
    busy
      ? `${ruleAtNode(rule)} consumes nothing it matches (it keeps its pairs in their stages and takes no message), so it fires again each time its gates finish, for ever`
      : `${ruleAtNode(rule)} consumes nothing it matches (it keeps its pairs in their stages and takes no message), so once it fires it fires again at once: the run stops with a rule-loop error`,
    'move a pair to another stage ("stage: {pair: p, to: ...}"), measure, discard or deliver it, or wait for a message with a got guard',
    rule,
  );
}

/** The names a rule's guards bind, checking the guards' expressions on the way. */
function guardEnv(rule: Rule, kinds: ExprKinds, nodeIds: ReadonlySet<string>): Map<string, Bound> {
  const env = new Map<string, Bound>();
  for (const g of rule.when) {
    if (g.kind === 'have') {
      kinds.expect(g.partner, env, 'node', '"partner"');
      for (const n of g.as) env.set(n, { kind: 'pair', stage: g.stage, noted: new Set() });
    } else if (g.kind === 'have-id') {
      kinds.expect(g.id, env, 'id', '"id"');
      if (g.as) env.set(g.as, { kind: 'pair', stage: g.stage ?? '*', noted: new Set() });
    } else if (g.kind === 'got') {
      kinds.expect(g.from, env, 'node', '"from"');
      const from = g.from && g.from.compiled.ast.type === 'name' && nodeIds.has(g.from.compiled.ast.name) ? g.from.compiled.ast.name : undefined;
      if (g.as) env.set(g.as, { kind: 'message', msgKind: g.msgKind, ...(from ? { from } : {}) });
    } else kinds.expect(g.expr, env, 'truth', 'the check');
  }
  return env;
}

/** First pass: what the data values of every send are, so that `m.z` can be known to hold text. */
function recordSends(steps: readonly Step[], env: Map<string, Bound>, kinds: ExprKinds, fields: FieldIndex): void {
  for (const s of steps) {
    if (s.kind === 'if') {
      recordSends(s.then, new Map(env), kinds, fields);
      recordSends(s.else, new Map(env), kinds, fields);
      continue;
    }
    if (s.kind === 'send') fields.recordSend(s, new Map(Object.entries(s.data).map(([k, e]) => [k, kinds.kind(e, e.compiled.ast, env)])));
    if (s.kind === 'measure' && s.as) env.set(s.as, { kind: 'bit' });
    if (s.kind === 'bell_measure') for (const n of s.as) env.set(n, { kind: 'bit' });
  }
}

/** Every finding about rule bodies: pairs used after they left, fields and values that cannot be, loops. */
export function lintBodies(ps: ProgramSet, facts: Facts, noise?: NoiseModel): Finding[] {
  const fields = new FieldIndex(ps, facts);
  const out: Finding[] = [];
  // the first pass reports nothing: its findings are those of the second
  for (const program of Object.values(ps.programs)) {
    for (const rule of program.rules) {
      const quiet = new ExprKinds(fields, facts.nodeIds, rule);
      recordSends(rule.do, guardEnv(rule, quiet, facts.nodeIds), quiet, fields);
    }
  }
  for (const program of Object.values(ps.programs)) {
    for (const rule of program.rules) {
      const kinds = new ExprKinds(fields, facts.nodeIds, rule);
      const env = guardEnv(rule, kinds, facts.nodeIds);
      new BodyCheck(rule, kinds, out).block(rule.do, env, new Map());
      out.push(...kinds.out);
      const loop = loopFinding(rule, noise);
      if (loop) out.push(loop);
    }
  }
  return out;
}
