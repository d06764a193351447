/** Static analysis of a program set: no simulation, only what the program text says (`bellstep check`). */
import { findingRule, gatherFacts, type Finding } from './lint-facts.js';
import { lintMessages, lintStages } from './lint-flow.js';
import { lintBodies } from './lint-body.js';
import { lintDeadRules, lintReach } from './lint-network.js';
import type { NoiseModel, ProgramSet } from './types.js';

export { findingRule, type Finding } from './lint-facts.js';

/** Findings that mean their rule can never fire. */
const NEVER_FIRES = new Set(['rule-dead', 'partner-self', 'partner-unreachable', 'stage-typo', 'stage-unentered', 'message-typo']);

/** Every finding of the lint families, in file order; the noise model tells how long gates take. */
export function lint(ps: ProgramSet, noise?: NoiseModel): Finding[] {
  const facts = gatherFacts(ps);
  const reach = lintReach(ps, facts);
  // A send to itself or to a node no fiber reaches is reported once, as a reach finding.
  // A role's send is one place in the file for every node that plays it, so the node is part of the key.
  const key = (f: Finding) => `${f.file}:${f.line}:${f.col}:${findingRule(f)?.node ?? ''}`;
  const explained = new Set(reach.map(key));
  const messages = lintMessages(facts).filter((f) => f.code !== 'message-unawaited' || !explained.has(key(f)));
  // a role's rule is one text for every node that plays it: one finding per place and node
  const seen = new Set<string>();
  const bodies = lintBodies(ps, facts, noise).filter((f) => {
    const k = `${key(f)}:${f.code}:${f.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
  const others = [...messages, ...lintStages(facts), ...reach, ...lintDeadRules(ps, facts)];
  // a rule that can never fire cannot loop either: saying so would only add noise
  const neverFires = new Set(others.filter((f) => NEVER_FIRES.has(f.code)).map((f) => findingRule(f)));
  const all = [...others, ...bodies.filter((f) => f.code !== 'rule-loop' || !neverFires.has(findingRule(f)))];
  return all.sort((a, b) => a.file.localeCompare(b.file) || a.line - b.line || a.col - b.col || a.code.localeCompare(b.code));
}
