/**
 * Working copies of frozen worlds. `thaw` makes a mutable copy of everything the engine
 * mutates; values it only replaces (density matrices, queue entries, messages, delivery
 * records) are shared, which is safe because they are never mutated once stored.
 * `settle` turns a worked-on copy back into a value: parts equal to the world it came
 * from are replaced by that world's own objects (structural sharing, as immer gives), and
 * the rest is frozen.
 */
import { DeliveryLog } from './delivered.js';
import type { Cluster, LinkState, NodeState, PairRecord, QubitState, World } from './types.js';

function copyPair(p: PairRecord): PairRecord {
  // a frozen notes record is shared: a `note` step copies it before its first write (fire.ts)
  let notes = p.notes;
  if (!Object.isFrozen(notes)) {
    notes = {};
    for (const k in p.notes) notes[k] = p.notes[k];
  }
  return { qubit: p.qubit, id: p.id, partner: p.partner, stage: p.stage, born: p.born, entered: p.entered, order: p.order, link: p.link, notes };
}

function copyRecord<T>(o: Record<string, T>): Record<string, T> {
  const out: Record<string, T> = {};
  for (const k in o) out[k] = o[k];
  return out;
}

function copyNode(n: NodeState): NodeState {
  const pairs: PairRecord[] = new Array(n.pairs.length);
  for (let i = 0; i < n.pairs.length; i++) pairs[i] = copyPair(n.pairs[i]);
  return { id: n.id, busyUntil: n.busyUntil, nextWake: n.nextWake, pairs, inbox: n.inbox.slice(), arrivals: n.arrivals, fired: copyRecord(n.fired) };
}

/**
 * Makes one node of a working copy mutable (when only some nodes were thawed). An engine
 * write to a node that was not thawed throws (frozen object, strict mode), so a mistake here
 * cannot silently change a world.
 */
export function thawNode(work: World, id: string): void {
  const n = work.nodes[id];
  if (n && Object.isFrozen(n)) work.nodes[id] = copyNode(n);
}

// Built field by field: an object spread followed by more keys is very slow in V8 here.
/**
 * A copy of a world that the engine can mutate in place. With `nodes: 'none'`, node states
 * stay the frozen originals until `thawNode` is called for each node an event will touch.
 */
export function thaw(w: World, opts: { nodes: 'all' | 'none' } = { nodes: 'all' }): World {
  const nodes: World['nodes'] = {};
  if (opts.nodes === 'all') for (const id in w.nodes) nodes[id] = copyNode(w.nodes[id]);
  else for (const id in w.nodes) nodes[id] = w.nodes[id];
  const links: World['links'] = {};
  for (const id in w.links) {
    const l = w.links[id];
    links[id] = { id: l.id, generating: l.generating, used: copyRecord(l.used), generated: l.generated, fullSince: l.fullSince, fullNs: l.fullNs };
  }
  const qubits: World['qubits'] = new Map();
  for (const [id, q] of w.qubits) qubits.set(id, { id: q.id, node: q.node, link: q.link, cluster: q.cluster, decayedTo: q.decayedTo, frozen: q.frozen });
  const clusters: World['clusters'] = new Map();
  for (const [id, c] of w.clusters) clusters.set(id, { id: c.id, qubits: c.qubits, rho: c.rho, born: c.born });
  const c = w.counters;
  return {
    time: w.time,
    events: w.events,
    seq: w.seq,
    rng: [w.rng[0], w.rng[1], w.rng[2], w.rng[3]],
    queue: w.queue.slice(),
    nodes,
    links,
    qubits,
    clusters,
    inflight: new Map(w.inflight),
    halves: copyRecord(w.halves),
    delivered: w.delivered,
    lost: w.lost.slice(),
    counters: { qubit: c.qubit, cluster: c.cluster, pair: c.pair, message: c.message, sent: c.sent, arrived: c.arrived, dropped: c.dropped, faultHits: c.faultHits.slice() },
  };
}

/** Freezes a value and everything new inside it, stopping at what is already frozen. */
export function deepFreeze<T>(v: T): T {
  // the delivery log is shared by every world of a run and only ever appended to (delivered.ts)
  if (v === null || typeof v !== 'object' || Object.isFrozen(v) || ArrayBuffer.isView(v) || v instanceof DeliveryLog) return v;
  Object.freeze(v);
  if (Array.isArray(v)) for (const x of v) deepFreeze(x);
  else if (v instanceof Map) for (const x of v.values()) deepFreeze(x);
  else for (const k in v) deepFreeze((v as Record<string, unknown>)[k]);
  return v;
}

/** Whether two records hold the same keys with identical values. */
function sameEntries<T>(a: Record<string, T>, b: Record<string, T>, eq: (x: T, y: T) => boolean = Object.is): boolean {
  let n = 0;
  for (const k in b) {
    n++;
    if (!Object.hasOwn(a, k) || !eq(a[k], b[k])) return false;
  }
  for (const _k in a) n--;
  return n === 0;
}

function sameArray<T>(a: readonly T[], b: readonly T[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** Each entry of `next` replaced by base's entry when `same` says they are equal. */
function shareRecord<T>(base: Record<string, T>, next: Record<string, T>, same: (a: T, b: T) => boolean): Record<string, T> {
  let changed = false;
  let n = 0;
  for (const k in next) {
    n++;
    const b = base[k];
    if (b === next[k]) continue;
    if (b !== undefined && Object.hasOwn(base, k) && same(b, next[k])) next[k] = b;
    else changed = true;
  }
  if (!changed) {
    for (const _k in base) n--;
    if (n === 0) return base;
  }
  return next;
}

/** Each entry of `next` replaced by base's entry when `same` says they are equal; base itself when nothing changed. */
function shareMap<K, T>(base: Map<K, T>, next: Map<K, T>, same: (a: T, b: T) => boolean): Map<K, T> {
  let changed = base.size !== next.size;
  for (const [k, v] of next) {
    const b = base.get(k);
    if (b === v) continue;
    if (b !== undefined && same(b, v)) next.set(k, b);
    else changed = true;
  }
  return changed ? next : base;
}

const samePair = (a: PairRecord, b: PairRecord): boolean =>
  a.qubit === b.qubit && a.id === b.id && a.partner === b.partner && a.stage === b.stage && a.born === b.born && a.entered === b.entered && a.order === b.order && a.link === b.link && sameEntries(a.notes, b.notes);

/**
 * A node's pairs with each record replaced by base's record of the same qubit when they are
 * equal; base itself when nothing changed. Both lists are in arrival order, which is qubit order.
 */
function sharePairs(base: readonly PairRecord[], next: PairRecord[]): PairRecord[] {
  let all = base.length === next.length;
  let j = 0;
  for (let i = 0; i < next.length; i++) {
    const n = next[i];
    while (j < base.length && base[j].qubit < n.qubit) j++;
    const b = j < base.length ? base[j] : undefined;
    if (b === n) continue;
    if (b !== undefined && b.qubit === n.qubit && samePair(b, n)) next[i] = b;
    else all = false;
    if (i !== j) all = false;
  }
  return all ? (base as PairRecord[]) : next;
}

const sameNode = (a: NodeState, b: NodeState): boolean => {
  b.pairs = sharePairs(a.pairs, b.pairs);
  if (sameArray(a.inbox, b.inbox)) b.inbox = a.inbox;
  if (sameEntries(a.fired, b.fired)) b.fired = a.fired;
  return a.busyUntil === b.busyUntil && a.nextWake === b.nextWake && a.arrivals === b.arrivals && a.pairs === b.pairs && a.inbox === b.inbox && a.fired === b.fired;
};

const sameLink = (a: LinkState, b: LinkState): boolean => {
  if (sameEntries(a.used, b.used)) b.used = a.used;
  return a.generating === b.generating && a.generated === b.generated && a.used === b.used && a.fullSince === b.fullSince && a.fullNs === b.fullNs;
};

const sameQubit = (a: QubitState, b: QubitState): boolean =>
  a.node === b.node && a.link === b.link && a.cluster === b.cluster && a.decayedTo === b.decayedTo && a.frozen === b.frozen;

const sameCluster = (a: Cluster, b: Cluster): boolean => a.rho === b.rho && a.born === b.born && (a.qubits === b.qubits || sameArray(a.qubits, b.qubits));

/**
 * Gives a worked-on copy of `base` structural sharing with it: every part equal to base's
 * is replaced by base's own object (which is what immer would have kept), in place.
 * Written for the world's known shape, so it costs a few comparisons per object.
 */
export function shareWorld(base: World, next: World): World {
  next.nodes = shareRecord(base.nodes, next.nodes, sameNode);
  next.links = shareRecord(base.links, next.links, sameLink);
  next.qubits = shareMap(base.qubits, next.qubits, sameQubit);
  next.clusters = shareMap(base.clusters, next.clusters, sameCluster);
  next.inflight = shareMap(base.inflight, next.inflight, Object.is);
  next.halves = shareRecord(base.halves, next.halves, Object.is);
  if (sameArray(base.queue, next.queue)) next.queue = base.queue;
  if (sameArray(base.lost, next.lost)) next.lost = base.lost;
  if (sameArray(base.rng, next.rng)) next.rng = base.rng;
  const c = base.counters;
  const d = next.counters;
  if (
    c.qubit === d.qubit && c.cluster === d.cluster && c.pair === d.pair && c.message === d.message &&
    c.sent === d.sent && c.arrived === d.arrived && c.dropped === d.dropped && sameArray(c.faultHits, d.faultHits)
  ) {
    next.counters = c;
  }
  return next;
}

/** The value a working copy of `base` became: shared where unchanged, frozen everywhere. */
export function settle(base: World, work: World): World {
  return deepFreeze(shareWorld(base, work));
}
