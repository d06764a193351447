/**
 * Qubits and clusters inside a (draft) world: lazy memory decay, merging clusters for
 * two-qubit operations, gates with their noise, measurement and removal.
 *
 * Density matrices are copy-on-write. A cluster's `rho` that belongs to a finished world is
 * frozen (or, under immer, a draft of a frozen one) and is copied before its first change;
 * one made since then belongs to this working copy alone and is updated in place. Buffers
 * it replaces go back to a pool, since nothing else can refer to them.
 */
import { isDraft } from 'immer';
import {
  applyGateInPlace,
  BufferPool,
  checkDecay,
  ClusterTooLargeError,
  depolarize1InPlace,
  depolarize2InPlace,
  keepQubitsInto,
  measureInto,
  memoryDecayInPlace,
  tensorInto,
  type GateName,
  type Rho,
} from '../quantum/index.js';
import type { Net } from './net.js';
import type { Cluster, World } from './types.js';

const pool = new BufferPool();

/** Whether this working copy alone holds `rho`, so it may be changed in place. */
function owned(rho: Rho): boolean {
  return !Object.isFrozen(rho) && !isDraft(rho);
}

/** The cluster's state, made private to this working copy (copied once if it is shared). */
function writable(c: Cluster): Rho {
  const rho = c.rho;
  if (owned(rho)) return rho;
  const data = pool.take(rho.n);
  data.set(rho.data);
  const mine: Rho = { n: rho.n, data };
  c.rho = mine;
  return mine;
}

/** Replaces a cluster's state, recycling the old buffer when nothing else can see it. */
function replace(c: Cluster, next: Rho): void {
  const old = c.rho;
  c.rho = next;
  if (owned(old)) pool.give(old.data);
}

/** Creates a cluster holding fresh qubits and returns the qubit ids in order. */
export function addCluster(w: World, qubits: readonly { node: string; link: string }[], rho: Rho, since: number): number[] {
  const cid = ++w.counters.cluster;
  const ids: number[] = [];
  for (const q of qubits) {
    const id = ++w.counters.qubit;
    w.qubits[id] = { id, node: q.node, link: q.link, cluster: cid, decayedTo: since, frozen: false };
    ids.push(id);
  }
  // `rho` is a shared, frozen value (the link's pair state): the cluster copies it on first change
  w.clusters[cid] = { id: cid, qubits: ids, rho };
  return ids;
}

function clusterOf(w: World, qid: number): Cluster {
  const q = w.qubits[qid];
  if (!q) throw new Error(`engine: unknown qubit ${qid}`);
  return w.clusters[q.cluster];
}

/** Applies memory decay to a qubit from where it was last brought up to date until `t`. */
export function decayTo(net: Net, w: World, qid: number, t: number): void {
  const q = w.qubits[qid];
  if (q.frozen || t <= q.decayedTo) return;
  const mem = net.nodeNoise(q.node).memory;
  if (mem.t1Ns !== undefined || mem.t2Ns !== undefined) {
    const dt = t - q.decayedTo;
    checkDecay(dt, mem.t1Ns, mem.t2Ns);
    const c = w.clusters[q.cluster];
    const rho = writable(c);
    memoryDecayInPlace(rho.data, rho.n, c.qubits.indexOf(qid), dt, mem.t1Ns, mem.t2Ns);
  }
  q.decayedTo = t;
}

/** Puts two qubits into one cluster (tensor product) and returns it. */
export function merge(w: World, a: number, b: number, cap: number): Cluster {
  const ca = clusterOf(w, a);
  const cb = clusterOf(w, b);
  if (ca.id === cb.id) return ca;
  const n = ca.rho.n + cb.rho.n;
  if (n > cap) throw new ClusterTooLargeError(n, cap);
  const out = pool.take(n);
  tensorInto(ca.rho, cb.rho, out);
  replace(ca, { n, data: out });
  if (owned(cb.rho)) pool.give(cb.rho.data);
  for (const q of cb.qubits) w.qubits[q].cluster = ca.id;
  ca.qubits = [...ca.qubits, ...cb.qubits];
  delete w.clusters[cb.id];
  return ca;
}

/** Applies a gate, then the node's gate depolarizing. */
export function gate(net: Net, w: World, op: GateName, qids: readonly number[], angle: number | undefined, cap: number): void {
  const node = w.qubits[qids[0]].node;
  const noise = net.nodeNoise(node).gates;
  if (qids.length === 2) {
    const c = merge(w, qids[0], qids[1], cap);
    const i = c.qubits.indexOf(qids[0]);
    const j = c.qubits.indexOf(qids[1]);
    const rho = writable(c);
    applyGateInPlace(rho.data, rho.n, op, [i, j]);
    if (noise.two.depolarizing > 0) depolarize2InPlace(rho.data, rho.n, i, j, noise.two.depolarizing);
  } else {
    const c = clusterOf(w, qids[0]);
    const i = c.qubits.indexOf(qids[0]);
    const rho = writable(c);
    applyGateInPlace(rho.data, rho.n, op, [i], angle);
    if (noise.single.depolarizing > 0) depolarize1InPlace(rho.data, rho.n, i, noise.single.depolarizing);
  }
}

/** Destructively measures a qubit with the node's readout flip; the qubit leaves the world. */
export function measureQubit(net: Net, w: World, qid: number, basis: 'z' | 'x' | 'y', u: number): 0 | 1 {
  const q = w.qubits[qid];
  const c = w.clusters[q.cluster];
  const flip = net.nodeNoise(q.node).gates.measure.flip;
  if (!(flip >= 0 && flip <= 1)) throw new Error(`readout flip probability must be a probability in [0, 1], got ${String(flip)}`);
  // the measurement rotates the state before reading it, so it needs a private copy
  const rho = writable(c);
  const out = pool.take(rho.n - 1);
  const r = measureInto(rho.data, rho.n, c.qubits.indexOf(qid), basis, u, flip, out);
  dropQubit(w, c, qid, { n: rho.n - 1, data: out });
  return r.bit;
}

/** Traces a qubit out of its cluster; it leaves the world. */
export function traceOut(w: World, qid: number): void {
  const c = clusterOf(w, qid);
  const keep: number[] = [];
  for (let k = 0; k < c.qubits.length; k++) if (c.qubits[k] !== qid) keep.push(k);
  const out = pool.take(keep.length);
  keepQubitsInto(c.rho, keep, out);
  dropQubit(w, c, qid, { n: keep.length, data: out });
}

function dropQubit(w: World, c: Cluster, qid: number, rest: Rho): void {
  c.qubits = c.qubits.filter((x) => x !== qid);
  delete w.qubits[qid];
  replace(c, rest);
  if (c.qubits.length === 0) {
    delete w.clusters[c.id];
    pool.give(rest.data);
  }
}
