/**
 * Qubits and clusters inside a (draft) world: lazy memory decay, merging clusters for
 * two-qubit operations, gates with their noise, measurement and removal.
 */
import {
  applyGate,
  depolarize1,
  depolarize2,
  memoryDecay,
  measure,
  partialTrace,
  tensor,
  type GateName,
  type Rho,
} from '../quantum/index.js';
import type { Net } from './net.js';
import type { Cluster, World } from './types.js';

/** Creates a cluster holding fresh qubits and returns the qubit ids in order. */
export function addCluster(w: World, qubits: readonly { node: string; link: string }[], rho: Rho, since: number): string[] {
  const cid = `c${++w.counters.cluster}`;
  const ids = qubits.map((q) => {
    const id = `q${++w.counters.qubit}`;
    w.qubits[id] = { id, node: q.node, link: q.link, cluster: cid, decayedTo: since, frozen: false };
    return id;
  });
  w.clusters[cid] = { id: cid, qubits: ids, rho };
  return ids;
}

function clusterOf(w: World, qid: string): Cluster {
  const q = w.qubits[qid];
  if (!q) throw new Error(`engine: unknown qubit ${qid}`);
  return w.clusters[q.cluster];
}

/** Applies memory decay to a qubit from where it was last brought up to date until `t`. */
export function decayTo(net: Net, w: World, qid: string, t: number): void {
  const q = w.qubits[qid];
  if (q.frozen || t <= q.decayedTo) return;
  const mem = net.nodeNoise(q.node).memory;
  if (mem.t1Ns !== undefined || mem.t2Ns !== undefined) {
    const c = w.clusters[q.cluster];
    c.rho = memoryDecay(c.rho, c.qubits.indexOf(qid), t - q.decayedTo, mem.t1Ns, mem.t2Ns);
  }
  q.decayedTo = t;
}

/** Puts two qubits into one cluster (tensor product) and returns it. */
export function merge(w: World, a: string, b: string, cap: number): Cluster {
  const ca = clusterOf(w, a);
  const cb = clusterOf(w, b);
  if (ca.id === cb.id) return ca;
  ca.rho = tensor(ca.rho, cb.rho, cap);
  for (const q of cb.qubits) w.qubits[q].cluster = ca.id;
  ca.qubits = [...ca.qubits, ...cb.qubits];
  delete w.clusters[cb.id];
  return ca;
}

/** Applies a gate, then the node's gate depolarizing. */
export function gate(net: Net, w: World, op: GateName, qids: readonly string[], angle: number | undefined, cap: number): void {
  const node = w.qubits[qids[0]].node;
  const noise = net.nodeNoise(node).gates;
  if (qids.length === 2) {
    const c = merge(w, qids[0], qids[1], cap);
    const i = c.qubits.indexOf(qids[0]);
    const j = c.qubits.indexOf(qids[1]);
    c.rho = applyGate(c.rho, op, [i, j]);
    if (noise.two.depolarizing > 0) c.rho = depolarize2(c.rho, i, j, noise.two.depolarizing);
  } else {
    const c = clusterOf(w, qids[0]);
    const i = c.qubits.indexOf(qids[0]);
    c.rho = applyGate(c.rho, op, [i], angle);
    if (noise.single.depolarizing > 0) c.rho = depolarize1(c.rho, i, noise.single.depolarizing);
  }
}

/** Destructively measures a qubit with the node's readout flip; the qubit leaves the world. */
export function measureQubit(net: Net, w: World, qid: string, basis: 'z' | 'x' | 'y', u: number): 0 | 1 {
  const q = w.qubits[qid];
  const c = w.clusters[q.cluster];
  const flip = net.nodeNoise(q.node).gates.measure.flip;
  const r = measure(c.rho, c.qubits.indexOf(qid), basis, u, flip);
  dropQubit(w, c, qid, r.rho);
  return r.bit;
}

/** Traces a qubit out of its cluster; it leaves the world. */
export function traceOut(w: World, qid: string): void {
  const c = clusterOf(w, qid);
  dropQubit(w, c, qid, partialTrace(c.rho, c.qubits.indexOf(qid)));
}

function dropQubit(w: World, c: Cluster, qid: string, rest: Rho): void {
  c.qubits = c.qubits.filter((x) => x !== qid);
  delete w.qubits[qid];
  if (c.qubits.length === 0) delete w.clusters[c.id];
  else c.rho = rest;
}
