/** Near-spelling suggestions for messages: "unknown node "mil" (did you mean "mill"?)". */

import { editDistance } from '../expr/index.js';

export { editDistance };

/**
 * The candidate nearest to `word` within `max` edits (ties: first in list), or undefined.
 * A short word must also keep at least half its letters, so "foo" does not suggest "xor".
 */
export function closest(word: string, candidates: Iterable<string>, max = 2): string | undefined {
  let best: string | undefined;
  let bestDistance = max + 1;
  for (const c of candidates) {
    if (c === word) continue;
    const d = editDistance(word.toLowerCase(), c.toLowerCase());
    if (d < bestDistance && 2 * d <= word.length) {
      best = c;
      bestDistance = d;
    }
  }
  return best;
}

/** ` (did you mean "x"?)` when a near spelling exists, else the empty string. */
export function didYouMean(word: string, candidates: Iterable<string>): string {
  const near = closest(word, candidates);
  return near === undefined ? '' : ` (did you mean "${near}"?)`;
}

/** `"a", "b" or "c"` for messages. */
export function listWords(words: readonly string[], last = 'or'): string {
  const quoted = words.map((w) => `"${w}"`);
  if (quoted.length <= 1) return quoted.join('');
  return `${quoted.slice(0, -1).join(', ')} ${last} ${quoted[quoted.length - 1]}`;
}
