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

/** Whether c (a char code) may start a node id ([a-z]) or continue one ([a-z0-9-]). */
function nameChar(c: number, first: boolean): boolean {
  return (c >= 97 && c <= 122) || (!first && ((c >= 48 && c <= 57) || c === 45));
}

/** End of a node id starting at i (the index of the first char that does not belong), or -1 if none starts there. */
function nameEnd(s: string, i: number): number {
  if (i >= s.length || !nameChar(s.charCodeAt(i), true)) return -1;
  let k = i + 1;
  while (k < s.length && nameChar(s.charCodeAt(k), false)) k++;
  return k;
}

/** Whether a tag is one or more characters with no line break (what `.+` matches). */
function validTag(s: string, from: number): boolean {
  if (from >= s.length) return false;
  for (let k = from; k < s.length; k++) {
    const c = s.charCodeAt(k);
    if (c === 10 || c === 13 || c === 0x2028 || c === 0x2029) return false;
  }
  return true;
}

/** Where the parts of `a~b#tag` are: the end of the first name and of the second (-1 when `id` is no such id). */
const cut = new Int32Array(2);

function cutId(id: string): boolean {
  // the grammar of /^([a-z][a-z0-9-]*)~([a-z][a-z0-9-]*)#(.+)$/, scanned by hand: ids are
  // parsed on every swap, and a regular expression with captures costs more than the swap's bookkeeping
  const a = nameEnd(id, 0);
  if (a < 0 || id.charCodeAt(a) !== 126) return false;
  const b = nameEnd(id, a + 1);
  if (b < 0 || id.charCodeAt(b) !== 35 || !validTag(id, b + 1)) return false;
  cut[0] = a;
  cut[1] = b;
  return true;
}

/** Splits `a~b#tag` into its ends and tag, or undefined for any other string. */
export function parsePairId(id: string): ParsedId | undefined {
  if (!cutId(id)) return undefined;
  return { ends: [id.slice(0, cut[0]), id.slice(cut[0] + 1, cut[1])], tag: id.slice(cut[1] + 1) };
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
  // both ends of a swap (and both messages a swap sends) ask for the same join in a row
  if (a === lastA && b === lastB) return lastJoin;
  const out = join(a, b);
  lastA = a;
  lastB = b;
  lastJoin = out;
  return out;
}

let lastA = '';
let lastB = '';
let lastJoin = '';

function join(a: string, b: string): string {
  const lo = a <= b ? a : b;
  const hi = a <= b ? b : a;
  if (cutId(lo)) {
    const l0 = lo.slice(0, cut[0]);
    const l1 = lo.slice(cut[0] + 1, cut[1]);
    const lt = cut[1] + 1;
    if (cutId(hi)) {
      const h0 = hi.slice(0, cut[0]);
      const h1 = hi.slice(cut[0] + 1, cut[1]);
      const ht = cut[1] + 1;
      // the one end both pairs share is where the swap happened; the other two are the outer ends
      const shared0 = l0 === h0 || l0 === h1;
      const shared1 = l1 === h0 || l1 === h1;
      if (shared0 !== shared1) {
        const s = shared0 ? l0 : l1;
        const x = shared0 ? l1 : l0;
        const tags = `${wrap(lo.slice(lt))}+${wrap(hi.slice(ht))}`;
        // an id whose two ends are one node has no other end, which reads as "undefined", as
        // it always has: recorded replays keep their ids
        if (h0 === s && h1 === s) return `${x}~undefined#${tags}`;
        const y = h0 === s ? h1 : h0;
        if (x !== y) return x < y ? `${x}~${y}#${tags}` : `${y}~${x}#${tags}`;
      }
    }
  }
  return `(${lo})+(${hi})`;
}

/** The short form shown in narrow panes: `#3+4` for `quay~ridge#3+4`. */
export function shortPairId(id: string): string {
  const hash = id.indexOf('#');
  return hash > 0 && id.indexOf('~') > 0 && id.indexOf('~') < hash ? id.slice(hash) : id;
}
