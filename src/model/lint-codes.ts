/** Every kind of finding `bellstep check` reports, with what it means; docs/checks.md is generated from it. */

export interface FindingCode {
  readonly code: string;
  /** What the finding says is wrong, in one sentence. */
  readonly means: string;
  /** Whether a run of the program set would stop with an error once the finding's rule fires. */
  readonly stopsRun: boolean;
}

/** The finding codes, in the order the reference lists them. */
export const FINDING_CODES: readonly FindingCode[] = [
  { code: 'rule-dead', means: 'A rule can never fire: it waits for a message no rule sends, for more pairs than its link has slots, for a partner no swap can reach, or its check is the literal false.', stopsRun: false },
  { code: 'message-typo', means: 'A got guard waits for a message kind that differs by a slip from a kind sent to that node: both spellings are named.', stopsRun: false },
  { code: 'message-unawaited', means: 'A message kind is sent to a node where no rule waits for it, so it stays in the inbox.', stopsRun: false },
  { code: 'stage-typo', means: 'A have guard waits for a stage that differs by a slip from a stage the node moves pairs to.', stopsRun: false },
  { code: 'stage-unentered', means: 'A have guard waits for a stage that no rule at the node moves a pair to.', stopsRun: false },
  { code: 'stage-unmatched', means: 'A stage step moves pairs to a stage no have guard at the node takes, so they stay held.', stopsRun: false },
  { code: 'partner-self', means: 'A have guard or a send names the node itself as the other end.', stopsRun: false },
  { code: 'partner-unreachable', means: 'A have guard or a send names a node that no fiber path reaches.', stopsRun: false },
  { code: 'pair-released', means: 'A step acts on a pair the same body already measured, discarded or delivered on every path.', stopsRun: true },
  { code: 'message-field-unknown', means: 'A rule reads a message field that no sender of that kind sets; the nearest field is suggested.', stopsRun: true },
  { code: 'pair-field-unknown', means: 'A rule reads a field of a pair that no rule at the node notes; the nearest field is suggested.', stopsRun: true },
  { code: 'type-mismatch', means: 'A value can never fit where it is used: a pair where a number or a node is needed, text as a bit, the field of a literal, a number other than 0 and 1 as a condition.', stopsRun: true },
  { code: 'number-overflow', means: 'Arithmetic on number literals gives a number too large to hold (Infinity), such as an angle of 1e308 * 10.', stopsRun: true },
  { code: 'division-by-zero', means: 'An expression divides by the literal 0.', stopsRun: true },
  { code: 'rule-loop', means: 'A rule consumes nothing it matches, so once it fires it fires again: at once (a rule-loop error), or each time its gates finish.', stopsRun: true },
];
