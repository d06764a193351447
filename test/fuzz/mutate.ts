/**
 * Mutations of a program set or noise model, as a person editing the file might make them
 * by mistake: a line deleted, duplicated or moved, a number or a unit changed, a name
 * swapped for another name of the file or misspelt. Driven by a seeded generator, so a
 * failing case can be replayed from its seed.
 */

/** A small seeded generator (mulberry32): the same seed gives the same mutations. */
export function generator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const pick = <T>(rnd: () => number, items: readonly T[]): T => items[Math.floor(rnd() * items.length)];

const NUMBERS = ['0', '1', '2', '-1', '0.5', '3', '1e-400', '1e400', '999999', '0.0', '7', '64', '1e-9', '1.5'];
const UNITS = ['ns', 'us', 'ms', 's', 'min', 'm', 'km', 'km/s', 'm/s', 'dB/km', ''];
const WORDS = /[A-Za-z_][A-Za-z0-9_-]*/g;
const KEYWORDS = ['link', 'waiting', 'oldest', 'newest', 'z', 'x', 'y', 'true', 'false', 'null', 'stage', 'partner', 'as', 'count', 'min_age', 'max_age', 'min_wait', 'max_wait', 'id', 'kind', 'from', 'to', 'pair', 'data'];

/** The kinds of change, each a function of the lines and the generator. */
const MUTATIONS: readonly ((lines: string[], rnd: () => number) => string)[] = [
  function deleteLine(lines, rnd) {
    lines.splice(Math.floor(rnd() * lines.length), 1);
    return 'delete a line';
  },
  function duplicateLine(lines, rnd) {
    const i = Math.floor(rnd() * lines.length);
    lines.splice(i, 0, lines[i]);
    return `duplicate line ${i + 1}`;
  },
  function moveLine(lines, rnd) {
    const i = Math.floor(rnd() * lines.length);
    const [l] = lines.splice(i, 1);
    lines.splice(Math.floor(rnd() * lines.length), 0, l);
    return `move line ${i + 1}`;
  },
  function changeNumber(lines, rnd) {
    const i = Math.floor(rnd() * lines.length);
    const hits = [...lines[i].matchAll(/-?[0-9]+(\.[0-9]+)?(e-?[0-9]+)?/g)];
    if (hits.length === 0) return 'nothing';
    const h = pick(rnd, hits);
    const to = pick(rnd, NUMBERS);
    lines[i] = lines[i].slice(0, h.index) + to + lines[i].slice((h.index ?? 0) + h[0].length);
    return `number ${h[0]} → ${to} on line ${i + 1}`;
  },
  function changeUnit(lines, rnd) {
    const i = Math.floor(rnd() * lines.length);
    const hits = [...lines[i].matchAll(/([0-9])\s*(ns|us|µs|ms|s|min|km\/s|m\/s|km|m|dB\/km)\b/g)];
    if (hits.length === 0) return 'nothing';
    const h = pick(rnd, hits);
    const to = pick(rnd, UNITS);
    const at = (h.index ?? 0) + h[1].length;
    lines[i] = `${lines[i].slice(0, at)} ${to}${lines[i].slice((h.index ?? 0) + h[0].length)}`;
    return `unit ${h[2]} → ${to || '(none)'} on line ${i + 1}`;
  },
  function swapName(lines, rnd) {
    const all = [...new Set(lines.join('\n').match(WORDS) ?? [])];
    const i = Math.floor(rnd() * lines.length);
    const hits = [...lines[i].matchAll(WORDS)];
    if (hits.length === 0) return 'nothing';
    const h = pick(rnd, hits);
    const to = rnd() < 0.3 ? pick(rnd, KEYWORDS) : pick(rnd, all);
    lines[i] = lines[i].slice(0, h.index) + to + lines[i].slice((h.index ?? 0) + h[0].length);
    return `name ${h[0]} → ${to} on line ${i + 1}`;
  },
  function swapValue(lines, rnd) {
    // a value from anywhere in the file put under another key: a pair where a node belongs, text as an angle...
    const VALUE = /(\b[a-z_]+): ("[^"]*"|[^,{}[\]\s][^,{}\]]*)/g;
    const all = lines.flatMap((l) => [...l.matchAll(VALUE)].map((m) => m[2]));
    const i = Math.floor(rnd() * lines.length);
    const hits = [...lines[i].matchAll(VALUE)];
    if (hits.length === 0 || all.length === 0) return 'nothing';
    const h = pick(rnd, hits);
    const to = pick(rnd, all);
    const at = (h.index ?? 0) + h[1].length + 2;
    lines[i] = lines[i].slice(0, at) + to + lines[i].slice(at + h[2].length);
    return `${h[1]}: ${h[2]} → ${to} on line ${i + 1}`;
  },
  function misspell(lines, rnd) {
    const i = Math.floor(rnd() * lines.length);
    const hits = [...lines[i].matchAll(WORDS)].filter((m) => m[0].length > 2);
    if (hits.length === 0) return 'nothing';
    const h = pick(rnd, hits);
    const k = 1 + Math.floor(rnd() * (h[0].length - 1));
    const to = h[0].slice(0, k) + h[0].slice(k + 1);
    lines[i] = lines[i].slice(0, h.index) + to + lines[i].slice((h.index ?? 0) + h[0].length);
    return `misspell ${h[0]} → ${to} on line ${i + 1}`;
  },
];

/** `text` with 1 to 3 random mutations, and what they were. */
export function mutate(text: string, rnd: () => number): { text: string; what: string[] } {
  const lines = text.split('\n');
  const n = 1 + Math.floor(rnd() * 3);
  const what: string[] = [];
  for (let k = 0; k < n; k++) what.push(pick(rnd, MUTATIONS)(lines, rnd));
  return { text: lines.join('\n'), what };
}
