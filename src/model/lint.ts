/** Static analysis of a program set: no simulation, only what the program text says (`bellstep check`). */
import { gatherFacts, type Finding } from './lint-facts.js';
import { lintMessages, lintStages } from './lint-flow.js';
import { lintDeadRules, lintReach } from './lint-network.js';
import type { ProgramSet } from './types.js';

export type { Finding } from './lint-facts.js';

/** Every finding of the four lint families, in file order. */
export function lint(ps: ProgramSet): Finding[] {
  const facts = gatherFacts(ps);
  const reach = lintReach(ps, facts);
  // A send to itself or to a node no fiber reaches is reported once, as a reach finding.
  const explained = new Set(reach.map((f) => `${f.file}:${f.line}:${f.col}`));
  const messages = lintMessages(facts).filter((f) => f.code !== 'message-unawaited' || !explained.has(`${f.file}:${f.line}:${f.col}`));
  const all = [...messages, ...lintStages(facts), ...reach, ...lintDeadRules(ps, facts)];
  return all.sort((a, b) => a.file.localeCompare(b.file) || a.line - b.line || a.col - b.col || a.code.localeCompare(b.code));
}
