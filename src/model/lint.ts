/** Static analysis of a program set: no simulation, only what the program text says (`bellstep check`). */
import { findingRule, gatherFacts, type Finding } from './lint-facts.js';
import { lintMessages, lintStages } from './lint-flow.js';
import { lintDeadRules, lintReach } from './lint-network.js';
import type { ProgramSet } from './types.js';

export { findingRule, type Finding } from './lint-facts.js';

/** Every finding of the four lint families, in file order. */
export function lint(ps: ProgramSet): Finding[] {
  const facts = gatherFacts(ps);
  const reach = lintReach(ps, facts);
  // A send to itself or to a node no fiber reaches is reported once, as a reach finding.
  // A role's send is one place in the file for every node that plays it, so the node is part of the key.
  const key = (f: Finding) => `${f.file}:${f.line}:${f.col}:${findingRule(f)?.node ?? ''}`;
  const explained = new Set(reach.map(key));
  const messages = lintMessages(facts).filter((f) => f.code !== 'message-unawaited' || !explained.has(key(f)));
  const all = [...messages, ...lintStages(facts), ...reach, ...lintDeadRules(ps, facts)];
  return all.sort((a, b) => a.file.localeCompare(b.file) || a.line - b.line || a.col - b.col || a.code.localeCompare(b.code));
}
