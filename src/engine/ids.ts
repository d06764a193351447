/**
 * Pair ids. A generated pair is `LINK#N` (N counts pairs network-wide, so every elementary
 * pair has its own number). After a swap both far ends compute `join(a, b)`, which gives
 * one id whichever end computes it: `join("mill~quay#3", "mill~ridge#4")` is
 * `quay~ridge#3+4`.
 */

interface ParsedId {
  readonly ends: readonly [string, string];
  readonly tag: string;
}

const ID = /^([a-z][a-z0-9-]*)~([a-z][a-z0-9-]*)#(.+)$/;

/** Splits `a~b#tag` into its ends and tag, or undefined for any other string. */
export function parsePairId(id: string): ParsedId | undefined {
  const m = ID.exec(id);
  if (!m) return undefined;
  return { ends: [m[1], m[2]], tag: m[3] };
}

/** The id of a generated pair. */
export function linkPairId(link: string, serial: number): string {
  return `${link}#${serial}`;
}

function wrap(tag: string): string {
  return tag.includes('+') ? `(${tag})` : tag;
}

/** The shared id of the pair that a swap of pairs `a` and `b` makes; symmetric in a and b. */
export function joinIds(a: string, b: string): string {
  const [lo, hi] = a <= b ? [a, b] : [b, a];
  const pl = parsePairId(lo);
  const ph = parsePairId(hi);
  if (pl && ph) {
    const shared = pl.ends.filter((e) => ph.ends.includes(e));
    if (shared.length === 1) {
      const outer = [pl.ends.find((e) => e !== shared[0])!, ph.ends.find((e) => e !== shared[0])!].sort();
      if (outer[0] !== outer[1]) return `${outer[0]}~${outer[1]}#${wrap(pl.tag)}+${wrap(ph.tag)}`;
    }
  }
  return `(${lo})+(${hi})`;
}

/** The short form shown in narrow panes: `#3+4` for `quay~ridge#3+4`. */
export function shortPairId(id: string): string {
  const hash = id.indexOf('#');
  return hash > 0 && id.indexOf('~') > 0 && id.indexOf('~') < hash ? id.slice(hash) : id;
}
