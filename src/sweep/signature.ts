/**
 * Failure signatures (docs/cli.md): a failure with its seed-specific detail taken out, so
 * that seeds that fail the same way share one string and count as one bug. Each signature
 * comes with plain words built from the same normalised parts, so the words depend on the
 * signature alone and merged shards carry the same explanation as one whole sweep.
 */
import type { StallEntry } from '../engine/index.js';
import type { ExpectationResult } from '../session/summary.js';

/** A signature and the sentence that explains it. */
export interface Diagnosis {
  readonly signature: string;
  readonly explanation: string;
}

/** Placeholders that stand for what differs from seed to seed. */
export const PLACEHOLDERS = { pair: '#*', time: 'T', count: 'N' } as const;

const NAME = '[a-z][a-z0-9-]*';
// a pair id is LINK#N, and a swapped pair joins numbers with "+": quay~ridge#3+4
const FULL_ID = new RegExp(`\\b(${NAME}~${NAME})#[0-9]+(?:\\+[0-9]+)*`, 'g');
const SHORT_ID = /#[0-9]+(?:\+[0-9]+)*/g;
// a list of ids ("#1, #2 and 3 more") is as long as the seed made it: keep its first item
const ID_LIST = new RegExp(`((?:${NAME}~${NAME})?#\\*)(?:, (?:${NAME}~${NAME})?#\\*)*(?: and [0-9]+ more)?`, 'g');
const DURATION = /(?<![\w.])[0-9]+(?:\.[0-9]+)?(?:e[-+]?[0-9]+)? ?(?:ns|us|µs|ms|s|min)\b/g;
// digits inside a name (site s2, pair kiln~weir) are not counts, nor are placeholders, nor the
// count a guard asks for ("waits for 2 pairs"), which is the program's, not the seed's
const NUMBER = /(?<![\w.~#*-])(?<!waits for )-?[0-9]+(?:\.[0-9]+)?(?:e[-+]?[0-9]+)?(?![\w.])/gi;

/**
 * Replaces pair ids with `LINK#*`, durations with `T` and other numbers (counts, fidelities,
 * measured bits) with `N`, and collapses lists of pair ids to their first item.
 */
export function normaliseDetail(text: string): string {
  return text
    .replace(FULL_ID, `$1${PLACEHOLDERS.pair}`)
    .replace(SHORT_ID, PLACEHOLDERS.pair)
    .replace(ID_LIST, '$1')
    .replace(DURATION, PLACEHOLDERS.time)
    .replace(/\bholds one\b/g, `holds ${PLACEHOLDERS.count}`)
    .replace(NUMBER, PLACEHOLDERS.count)
    .replace(/\s+/g, ' ')
    .trim();
}

const LEGEND = `(${PLACEHOLDERS.pair}, ${PLACEHOLDERS.time} and ${PLACEHOLDERS.count} stand for the pair ids, times and counts that differ from seed to seed.)`;

// a placeholder stands alone between spaces or punctuation; "The" or "N." in prose do not count
const USES_PLACEHOLDER = /#\*|(?<![\w])[TN](?![\w(])/;

function withLegend(text: string): string {
  return USES_PLACEHOLDER.test(text) ? `${text} ${LEGEND}` : text;
}

/**
 * A stalled run: each node's waiting rules with the failing guard (numbered from 1, as
 * people count) and the normalised reason, in the network's node order.
 */
export function diagnoseStall(stall: Readonly<Record<string, readonly StallEntry[]>>): Diagnosis {
  const parts: string[] = [];
  const sentences: string[] = [];
  for (const [node, entries] of Object.entries(stall)) {
    for (const e of entries) {
      const reason = normaliseDetail(e.reason);
      parts.push(`${node}.${e.rule} g${e.guard + 1}: ${reason}`);
      sentences.push(`At ${node}, rule "${e.rule}" is stuck at guard ${e.guard + 1} (${e.text}): ${reason}.`);
    }
  }
  const signature = parts.length ? `stall | ${parts.join(' | ')}` : 'stall | no node has a waiting rule';
  const explanation = withLegend(
    `The run stalls: no event can happen while nodes still hold pairs or messages. ${sentences.join(' ') || 'No node runs rules, so nothing can consume what is held.'}`,
  );
  return { signature, explanation };
}

/** A run that ended normally but whose expectations do not all hold; only the expressions count, not their values. */
export function diagnoseExpectations(results: readonly ExpectationResult[]): Diagnosis {
  const failed = results.filter((r) => !r.ok).map((r) => r.expr);
  return {
    signature: `expect | ${failed.join(' | ')}`,
    explanation: `The run ends without a stall, but ${failed.length === 1 ? 'this expectation does' : 'these expectations do'} not hold at its end: ${failed.join('; ')}.`,
  };
}

/** A run that stopped on an error at run time: a program error (a rule loop, a bad expression) at `where`, or a breakpoint that cannot be evaluated. */
export function diagnoseRunError(where: string, message: string): Diagnosis {
  const detail = normaliseDetail(message);
  return {
    signature: `error | ${where}: ${detail}`,
    explanation: withLegend(`The program stops with an error at run time, at ${where}: ${detail}.`),
  };
}

/** A seed whose worker crashed or failed inside bellstep: a bug in bellstep or a run too big for memory. */
export function diagnoseCrash(message: string): Diagnosis {
  const detail = normaliseDetail(message);
  return {
    signature: `crash | ${detail}`,
    explanation: withLegend(
      `bellstep itself failed on this seed (${detail}). If it ran out of memory, give the run a limit with --until or --events; otherwise re-run the seed with bellstep run --seed to get a crash report.`,
    ),
  };
}
