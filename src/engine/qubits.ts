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
  gateKernel,
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
import { trace, traced } from './physics-trace.js';
import { removeItem } from './pair-state.js';
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
  if (trace) traced.copy(trace, data, rho.data, rho.n);
  const mine: Rho = { n: rho.n, data };
  c.rho = mine;
  return mine;
}

/** Replaces a cluster's state by an n-qubit `data`, recycling the old buffer when nothing else can see it. */
function replace(c: Cluster, n: number, data: Float64Array): void {
  const old = c.rho;
  if (owned(old)) {
    give(old.data);
    // the wrapper is this working copy's own too: update it rather than make another
    const mine = old as { n: number; data: Float64Array };
    mine.n = n;
    mine.data = data;
  } else c.rho = { n, data };
}

function give(buf: Float64Array): void {
  if (trace) traced.free(trace, buf);
  pool.give(buf);
}

/** Creates a cluster holding fresh qubits and returns the qubit ids in order. */
export function addCluster(w: World, qubits: readonly { node: string; link: string }[], rho: Rho, since: number): number[] {
  const cid = ++w.counters.cluster;
  const ids: number[] = [];
  for (const q of qubits) {
    const id = ++w.counters.qubit;
    w.qubits.set(id, { id, node: q.node, link: q.link, cluster: cid, decayedTo: since, frozen: false });
    ids.push(id);
  }
  // `rho` is a shared, frozen value (the link's pair state): the cluster copies it on first change
  w.clusters.set(cid, { id: cid, qubits: ids, rho, born: w.time });
  return ids;
}

function clusterOf(w: World, qid: number): Cluster {
  const q = w.qubits.get(qid);
  if (!q) throw new Error(`engine: unknown qubit ${qid}`);
  return w.clusters.get(q.cluster)!;
}

/** The herald time of the earliest link pair behind qubits a and b (ns). */
export function earliestBirth(w: World, a: number, b: number): number {
  const ba = w.clusters.get(w.qubits.get(a)!.cluster)!.born;
  const bb = w.clusters.get(w.qubits.get(b)!.cluster)!.born;
  return ba < bb ? ba : bb;
}

/** Applies memory decay to a qubit from where it was last brought up to date until `t`. */
export function decayTo(net: Net, w: World, qid: number, t: number): void {
  const q = w.qubits.get(qid)!;
  if (q.frozen || t <= q.decayedTo) return;
  const mem = net.nodeNoise(q.node).memory;
  if (mem.t1Ns !== undefined || mem.t2Ns !== undefined) {
    const dt = t - q.decayedTo;
    checkDecay(dt, mem.t1Ns, mem.t2Ns);
    const c = w.clusters.get(q.cluster)!;
    const rho = writable(c);
    const i = c.qubits.indexOf(qid);
    if (trace) traced.decay(trace, rho.data, rho.n, i, dt, mem.t1Ns, mem.t2Ns);
    memoryDecayInPlace(rho.data, rho.n, i, dt, mem.t1Ns, mem.t2Ns);
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
  if (trace) traced.tensor(trace, out, ca.rho.data, ca.rho.n, cb.rho.data, cb.rho.n);
  tensorInto(ca.rho, cb.rho, out);
  replace(ca, n, out);
  if (owned(cb.rho)) give(cb.rho.data);
  for (const q of cb.qubits) w.qubits.get(q)!.cluster = ca.id;
  if (cb.born < ca.born) ca.born = cb.born;
  // a list made since the last finished world is this copy's own (see `owned`)
  if (Object.isFrozen(ca.qubits) || isDraft(ca.qubits)) ca.qubits = [...ca.qubits, ...cb.qubits];
  else for (const q of cb.qubits) ca.qubits.push(q);
  w.clusters.delete(cb.id);
  return ca;
}

/**
 * Applies a gate to qubit a (and b, for a two-qubit gate; -1 otherwise), then the node's gate
 * depolarizing. The model has checked the gate's name and arity; the angle is checked here.
 */
export function gate(net: Net, w: World, op: GateName, a: number, b: number, angle: number | undefined, cap: number): void {
  const node = w.qubits.get(a)!.node;
  const noise = net.nodeNoise(node).gates;
  if (b >= 0) {
    const c = merge(w, a, b, cap);
    const i = c.qubits.indexOf(a);
    const j = c.qubits.indexOf(b);
    const rho = writable(c);
    if (i === j) throw new Error(`qubit indices must be distinct, got [${i}, ${j}]`);
    if (trace) traced.gate(trace, rho.data, rho.n, op, i, j, 0);
    gateKernel(rho.data, rho.n, op, i, j, 0);
    if (noise.two.depolarizing > 0) {
      if (trace) traced.dep2(trace, rho.data, rho.n, i, j, noise.two.depolarizing);
      depolarize2InPlace(rho.data, rho.n, i, j, noise.two.depolarizing);
    }
  } else {
    const c = clusterOf(w, a);
    const i = c.qubits.indexOf(a);
    const rho = writable(c);
    if ((op === 'rx' || op === 'ry' || op === 'rz') && (angle === undefined || !Number.isFinite(angle))) {
      throw new Error(`gate ${op} needs a finite angle in radians, got ${String(angle)}`);
    }
    if (trace) traced.gate(trace, rho.data, rho.n, op, i, -1, angle ?? 0);
    gateKernel(rho.data, rho.n, op, i, -1, angle ?? 0);
    if (noise.single.depolarizing > 0) {
      if (trace) traced.dep1(trace, rho.data, rho.n, i, noise.single.depolarizing);
      depolarize1InPlace(rho.data, rho.n, i, noise.single.depolarizing);
    }
  }
}

/** Destructively measures a qubit with the node's readout flip; the qubit leaves the world. */
export function measureQubit(net: Net, w: World, qid: number, basis: 'z' | 'x' | 'y', u: number): 0 | 1 {
  const q = w.qubits.get(qid)!;
  const c = w.clusters.get(q.cluster)!;
  const flip = net.nodeNoise(q.node).gates.measure.flip;
  if (!(flip >= 0 && flip <= 1)) throw new Error(`readout flip probability must be a probability in [0, 1], got ${String(flip)}`);
  // the measurement rotates the state before reading it, so it needs a private copy
  const rho = writable(c);
  const out = pool.take(rho.n - 1);
  const i = c.qubits.indexOf(qid);
  if (trace) traced.measure(trace, rho.data, rho.n, i, basis, u, flip, out);
  const r = measureInto(rho.data, rho.n, i, basis, u, flip, out);
  dropQubit(w, c, qid, rho.n - 1, out);
  return r.bit;
}

/** Traces a qubit out of its cluster; it leaves the world. */
export function traceOut(w: World, qid: number): void {
  const c = clusterOf(w, qid);
  const keep: number[] = [];
  for (let k = 0; k < c.qubits.length; k++) if (c.qubits[k] !== qid) keep.push(k);
  const out = pool.take(keep.length);
  if (trace) traced.keep(trace, c.rho.data, c.rho.n, keep, out);
  keepQubitsInto(c.rho, keep, out);
  dropQubit(w, c, qid, keep.length, out);
}

function dropQubit(w: World, c: Cluster, qid: number, n: number, rest: Float64Array): void {
  if (Object.isFrozen(c.qubits) || isDraft(c.qubits)) c.qubits = c.qubits.filter((x) => x !== qid);
  else removeItem(c.qubits, qid);
  w.qubits.delete(qid);
  replace(c, n, rest);
  if (c.qubits.length === 0) {
    w.clusters.delete(c.id);
    give(rest);
  }
}
