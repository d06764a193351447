/** "Did you mean" suggestions for unknown names and functions. */

/** Levenshtein distance (insertions, deletions and substitutions each cost 1). */
export function editDistance(a: string, b: string): number {
  if (a === b) return 0;
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      row[j] = Math.min(prev[j] + 1, row[j - 1] + 1, prev[j - 1] + cost);
    }
    prev = row;
  }
  return prev[b.length];
}

/** The closest candidate to `word`, if one is close enough to be a likely typo. */
export function closest(word: string, candidates: Iterable<string>): string | undefined {
  // One- and two-letter words only match by case; longer words tolerate one to three slips.
  const limit = word.length <= 2 ? 0.5 : word.length <= 4 ? 1 : word.length <= 8 ? 2 : 3;
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const c of candidates) {
    const d = c.toLowerCase() === word.toLowerCase() ? 0.5 : editDistance(word, c);
    if (d <= limit && (d < bestDistance || (d === bestDistance && best !== undefined && c < best))) {
      best = c;
      bestDistance = d;
    }
  }
  return best;
}

/** Up to `max` candidates in sorted order, with "and N more" when some are left out. */
export function listSome(candidates: Iterable<string>, max = 10): string {
  const all = [...new Set(candidates)].sort();
  if (all.length === 0) return '(none)';
  const shown = all.slice(0, max).join(', ');
  return all.length > max ? `${shown} and ${all.length - max} more` : shown;
}
