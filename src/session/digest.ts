/**
 * Per-event digests for replay files. A digest chains the previous digest with what the
 * event touched: the clock, the generator, the counters, and the full state of every
 * touched node, its pairs' clusters (density matrices bit for bit) and links. A world
 * that differs after some event either differs in what that event touched or already
 * differed before it, so the first differing digest marks the first divergent event.
 * The hash is a 2×32-bit multiplicative mix, not cryptographic: it only has to notice change.
 */
import type { EngineEvent, World } from '../engine/index.js';

/** Char codes of the hex digits 0-9a-f. */
const HEX_CODES = Array.from('0123456789abcdef', (c) => c.charCodeAt(0));

/** Decimal digits of a number, least significant first (scratch for `tagged`). */
const DIGITS = new Int32Array(24);

const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, '0'));

class Hasher {
  private a = 0;
  private b = 0;
  private readonly f64 = new Float64Array(1);
  private readonly u32 = new Uint32Array(this.f64.buffer);

  reset(): this {
    this.a = 0x811c9dc5 | 0;
    this.b = 0x9e3779b9 | 0;
    return this;
  }

  int(x: number): void {
    this.a = Math.imul(this.a ^ (x | 0), 0x01000193);
    this.b = Math.imul(this.b ^ (x | 0), 0x5bd1e995);
    this.b ^= this.b >>> 15;
  }

  num(x: number): void {
    if (Number.isInteger(x) && Math.abs(x) < 2 ** 31) {
      this.int(x);
      return;
    }
    this.f64[0] = x;
    this.int(this.u32[0]);
    this.int(this.u32[1]);
  }

  str(s: string): void {
    this.int(s.length);
    // the same steps as `int` per character, in the second digest's loop (strings are most of what a digest hashes)
    ha = this.a;
    hb = this.b;
    mixChars(s);
    this.a = ha;
    this.b = hb;
  }

  /** The same as `str(prefix + n)` for a one-letter prefix and a whole number n ≥ 0, without building the string. */
  tagged(prefix: string, n: number): void {
    let k = 0;
    let x = n;
    do {
      DIGITS[k++] = 48 + (x % 10);
      x = Math.floor(x / 10);
    } while (x > 0);
    this.int(k + 1);
    this.int(prefix.charCodeAt(0));
    while (k > 0) this.int(DIGITS[--k]);
  }

  floats(data: Float64Array): void {
    const words = new Uint32Array(data.buffer, data.byteOffset, data.length * 2);
    this.int(words.length);
    let a = this.a;
    let b = this.b;
    for (let i = 0; i < words.length; i++) {
      const x = words[i] | 0;
      a = Math.imul(a ^ x, 0x01000193);
      b = Math.imul(b ^ x, 0x5bd1e995);
      b ^= b >>> 15;
    }
    this.a = a;
    this.b = b;
  }

  /** The same as `str` of the 16 hex digits of two 32-bit halves, without building the string. */
  hexText(hi: number, lo: number): void {
    this.int(16);
    for (let s = 28; s >= 0; s -= 4) this.int(HEX_CODES[(hi >>> s) & 15]);
    for (let s = 28; s >= 0; s -= 4) this.int(HEX_CODES[(lo >>> s) & 15]);
  }

  get halves(): [number, number] {
    return [this.a >>> 0, this.b >>> 0];
  }

  hex(): string {
    const a = this.a;
    const b = this.b;
    return (
      HEX[(a >>> 24) & 255] + HEX[(a >>> 16) & 255] + HEX[(a >>> 8) & 255] + HEX[a & 255] +
      HEX[(b >>> 24) & 255] + HEX[(b >>> 16) & 255] + HEX[(b >>> 8) & 255] + HEX[b & 255]
    );
  }
}

/** The digest of the world after `ev`, chained to the previous event's digest. */
// one hasher for all digests: digests are computed one at a time, and this saves allocations
const shared = new Hasher();

export function eventDigest(prev: string, ev: EngineEvent, w: World): string {
  const h = shared.reset();
  h.str(prev);
  hashEvent(h, ev, w);
  return h.hex();
}

/** The digest after `ev` as two 32-bit halves, chained to the previous digest's halves (the same digest as `eventDigest`). */
export function eventDigestHalves(prevHi: number, prevLo: number, ev: EngineEvent, w: World): [number, number] {
  const h = shared.reset();
  h.hexText(prevHi, prevLo);
  hashEvent(h, ev, w);
  return h.halves;
}

// scratch lists for one digest at a time (digests are computed one after another)
const clusterList: number[] = [];
const linkList: string[] = [];
/** Each link's `used` keys, sorted (they are its two ends), so a digest does not sort them every time. */
const usedKeys = new WeakMap<object, string[]>();

function addOnce<T>(list: T[], x: T): void {
  for (let i = 0; i < list.length; i++) if (list[i] === x) return;
  list.push(x);
}

function hashEvent(h: Hasher, ev: EngineEvent, w: World): void {
  h.num(ev.index);
  h.num(w.time);
  h.num(w.seq);
  const rng = w.rng;
  h.int(rng[0]);
  h.int(rng[1]);
  h.int(rng[2]);
  h.int(rng[3]);
  const c = w.counters;
  h.num(c.qubit);
  h.num(c.cluster);
  h.num(c.pair);
  h.num(c.message);
  h.num(c.sent);
  h.num(c.arrived);
  h.num(c.dropped);
  h.num(w.delivered?.count ?? 0);
  h.num(w.queue.length);
  h.str(ev.summary);
  const clusters = clusterList;
  const links = linkList;
  clusters.length = 0;
  links.length = 0;
  for (const id of ev.nodes) {
    const n = w.nodes[id];
    h.str(id);
    h.num(n.busyUntil);
    h.num(n.nextWake ?? -1);
    h.num(n.arrivals);
    // arrival order, which a deterministic run reproduces exactly (qubits print as q12)
    for (const p of n.pairs) {
      const q = p.qubit;
      h.tagged('q', q);
      h.str(p.id);
      h.str(p.partner);
      h.str(p.stage);
      h.num(p.born);
      h.num(p.order);
      h.str(p.link);
      addOnce(links, p.link);
      for (const k in p.notes) {
        h.str(k);
        h.str(JSON.stringify(p.notes[k]));
      }
      const qs = w.qubits.get(q);
      if (qs) {
        h.num(qs.decayedTo);
        addOnce(clusters, qs.cluster);
      }
    }
    for (const m of n.inbox) h.tagged('m', m.id);
  }
  for (const s of ev.sends) {
    h.tagged('m', s.id);
    h.num(s.arrives);
  }
  // in the order of their names as text (c10 before c9), as digests have always been taken
  if (clusters.length > 1) clusters.sort(byName);
  for (const cid of clusters) {
    const cl = w.clusters.get(cid);
    if (!cl) continue;
    h.tagged('c', cid);
    for (const q of cl.qubits) h.tagged('q', q);
    h.floats(cl.rho.data);
  }
  if (links.length > 1) links.sort();
  for (const lid of links) {
    const l = w.links[lid];
    if (!l) continue;
    h.str(lid);
    h.int(l.generating ? 1 : 0);
    let keys = usedKeys.get(l.used);
    if (keys === undefined) {
      keys = Object.keys(l.used).sort();
      usedKeys.set(l.used, keys);
    }
    for (const k of keys) h.num(l.used[k]);
  }
  for (const d of ev.deliveries) {
    h.str(d.id);
    h.num(d.fidelity);
  }
}

// ---------------------------------------------------------------- the second digest

/** The hash of each name (node, stage, link): a few strings mixed in again and again; cleared if it ever grows large. */
const stringHash = new Map<string, number>();

function hashOf(s: string): number {
  let v = stringHash.get(s);
  if (v === undefined) {
    let a = 0x811c9dc5 | 0;
    for (let i = 0; i < s.length; i++) a = Math.imul(a ^ s.charCodeAt(i), 0x01000193);
    v = Math.imul(a ^ s.length, 0x5bd1e995);
    if (stringHash.size > 65536) stringHash.clear();
    stringHash.set(s, v);
  }
  return v;
}

/**
 * The running mix of the second digest: the same steps as `Hasher.int`, word by word, on
 * module state (one digest is taken at a time) so that nothing is gathered or allocated.
 */
let ha = 0;
let hb = 0;

function put(x: number): void {
  ha = Math.imul(ha ^ x, 0x01000193);
  hb = Math.imul(hb ^ x, 0x5bd1e995);
  hb ^= hb >>> 15;
}

const f64 = new Float64Array(1);
const u32 = new Int32Array(f64.buffer);

/** A number as one word when it is a small whole number, else as its two 32-bit halves (as `Hasher.num`). */
function putNum(x: number): void {
  if (Number.isInteger(x) && x < 2147483648 && x > -2147483648) put(x);
  else {
    f64[0] = x;
    put(u32[0]);
    put(u32[1]);
  }
}

/** Mixes 32-bit words in one loop on locals (the bulk of a digest: strings and matrices). */
function putWords(v: Int32Array, n: number): void {
  let a = ha;
  let b = hb;
  for (let i = 0; i < n; i++) {
    const x = v[i];
    a = Math.imul(a ^ x, 0x01000193);
    b = Math.imul(b ^ x, 0x5bd1e995);
    b ^= b >>> 15;
  }
  ha = a;
  hb = b;
}

/** Mixes a string's UTF-16 code units, one word each (the first digest's strings too). */
function mixChars(str: string): void {
  let a = ha;
  let b = hb;
  for (let i = 0; i < str.length; i++) {
    const x = str.charCodeAt(i);
    a = Math.imul(a ^ x, 0x01000193);
    b = Math.imul(b ^ x, 0x5bd1e995);
    b ^= b >>> 15;
  }
  ha = a;
  hb = b;
}

function putStr(str: string): void {
  put(str.length);
  mixChars(str);
}

/** A matrix copied into scratch (one memcpy) and mixed as the 32-bit words of that copy, low word first. */
let scratch = new Float64Array(512);
let scratchWords = new Int32Array(scratch.buffer);

function putFloats(d: Float64Array): void {
  if (d.length > scratch.length) {
    scratch = new Float64Array(d.length);
    scratchWords = new Int32Array(scratch.buffer);
  }
  scratch.set(d);
  putWords(scratchWords, d.length * 2);
}

/** A digest as two 32-bit halves, updated in place. */
export interface DigestHalves {
  hi: number;
  lo: number;
}

/**
 * The clusters and links an event touched, kept in ascending order as they are found (the
 * lists are a few items long), with their own counts: no array is resized on the hot path.
 * Links are in code-unit order, as `Array.prototype.sort` orders strings.
 */
const touchedClusters: number[] = [];
const touchedLinks: string[] = [];
let nClusters = 0;
let nLinks = 0;

/** Inserts x into list[0..n) in order unless it is there; returns the new count. */
function insertSorted<T extends number | string>(list: T[], n: number, x: T): number {
  let i = n;
  while (i > 0 && list[i - 1] > x) i--;
  if (i > 0 && list[i - 1] === x) return n;
  for (let j = n; j > i; j--) list[j] = list[j - 1];
  list[i] = x;
  return n + 1;
}

/**
 * The digest of `bellstep/replay@2` files: the same state as the first (clock, generator,
 * counters, every touched node with its pairs and inbox, their clusters' density matrices
 * bit for bit, their links, the sends and the deliveries), chained the same way, with names
 * (nodes, stages, links) mixed in by their own cached hash and without the one-line summary,
 * which is derived from that state. Words are mixed as they are read, with nothing gathered or allocated.
 */
export function eventDigestInto2(chain: DigestHalves, ev: EngineEvent, w: World): void {
  ha = 0x811c9dc5 | 0;
  hb = 0x9e3779b9 | 0;
  put(chain.hi);
  put(chain.lo);
  putNum(ev.index);
  putNum(w.time);
  putNum(w.seq);
  const rng = w.rng;
  put(rng[0]);
  put(rng[1]);
  put(rng[2]);
  put(rng[3]);
  const c = w.counters;
  putNum(c.qubit);
  putNum(c.cluster);
  putNum(c.pair);
  putNum(c.message);
  putNum(c.sent);
  putNum(c.arrived);
  putNum(c.dropped);
  putNum(w.delivered?.count ?? 0);
  putNum(w.queue.length);
  nClusters = 0;
  nLinks = 0;
  for (const id of ev.nodes) {
    const n = w.nodes[id];
    put(hashOf(id));
    putNum(n.busyUntil);
    putNum(n.nextWake ?? -1);
    putNum(n.arrivals);
    put(n.pairs.length);
    for (const p of n.pairs) {
      put(p.qubit);
      // pair ids are new with every pair: mixed in as text, not cached
      putStr(p.id);
      put(hashOf(p.partner));
      put(hashOf(p.stage));
      putNum(p.born);
      putNum(p.order);
      put(hashOf(p.link));
      nLinks = insertSorted(touchedLinks, nLinks, p.link);
      for (const k in p.notes) {
        put(hashOf(k));
        putStr(JSON.stringify(p.notes[k]));
      }
      const qs = w.qubits.get(p.qubit);
      if (qs) {
        putNum(qs.decayedTo);
        nClusters = insertSorted(touchedClusters, nClusters, qs.cluster);
      }
    }
    put(n.inbox.length);
    for (const m of n.inbox) put(m.id);
  }
  for (const snd of ev.sends) {
    put(snd.id);
    putNum(snd.arrives);
  }
  for (let ci = 0; ci < nClusters; ci++) {
    const cid = touchedClusters[ci];
    const cl = w.clusters.get(cid);
    if (!cl) continue;
    put(cid);
    put(cl.qubits.length);
    for (const q of cl.qubits) put(q);
    const d = cl.rho.data;
    // each number's two 32-bit words, low word first (the order of an Int32Array view)
    put(d.length * 2);
    putFloats(d);
  }
  for (let li = 0; li < nLinks; li++) {
    const lid = touchedLinks[li];
    const l = w.links[lid];
    if (!l) continue;
    put(hashOf(lid));
    put(l.generating ? 1 : 0);
    let keys = usedKeys.get(l.used);
    if (keys === undefined) {
      keys = Object.keys(l.used).sort();
      usedKeys.set(l.used, keys);
    }
    for (const k of keys) putNum(l.used[k]);
  }
  for (const d of ev.deliveries) {
    putStr(d.id);
    putNum(d.fidelity);
  }
  chain.hi = ha >>> 0;
  chain.lo = hb >>> 0;
}

function byName(a: number, b: number): number {
  const x = String(a);
  const y = String(b);
  return x < y ? -1 : x > y ? 1 : 0;
}

/** The digest before the first event. */
export const GENESIS_DIGEST = '0000000000000000';
