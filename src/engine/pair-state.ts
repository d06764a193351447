/**
 * The true state of a pair, read without changing the world: memory decay is applied to
 * copies up to the time asked for. Panes, breakpoints and deliveries all read it here.
 */
import { bellCoefficients, fidelityPhiPlus, keepQubits, memoryDecay, tensor, type Rho } from '../quantum/index.js';
import type { Net } from './net.js';
import type { PairRecord, World } from './types.js';

/** The cluster's state with every unfrozen qubit decayed up to `t`. */
function clusterAt(net: Net, w: World, cid: number, t: number): { rho: Rho; qubits: readonly number[] } {
  const c = w.clusters.get(cid)!;
  let rho = c.rho;
  c.qubits.forEach((qid, i) => {
    const q = w.qubits.get(qid)!;
    if (q.frozen || t <= q.decayedTo) return;
    const mem = net.nodeNoise(q.node).memory;
    if (mem.t1Ns !== undefined || mem.t2Ns !== undefined) rho = memoryDecay(rho, i, t - q.decayedTo, mem.t1Ns, mem.t2Ns);
  });
  return { rho, qubits: c.qubits };
}

/** The two-qubit state of qubits a and b (a first) at time t; a product state if they share no cluster. */
export function twoQubitState(net: Net, w: World, a: number, b: number, t: number): Rho {
  const ca = w.qubits.get(a)!.cluster;
  const cb = w.qubits.get(b)!.cluster;
  if (ca === cb) {
    const c = clusterAt(net, w, ca, t);
    return keepQubits(c.rho, [c.qubits.indexOf(a), c.qubits.indexOf(b)]);
  }
  const xa = clusterAt(net, w, ca, t);
  const xb = clusterAt(net, w, cb, t);
  return tensor(keepQubits(xa.rho, [xa.qubits.indexOf(a)]), keepQubits(xb.rho, [xb.qubits.indexOf(b)]));
}

/** Finds the far half of the pair held at `node` as qubit `qid`: the partner's half with the same id. */
export function farHalf(w: World, node: string, qid: number): number | undefined {
  const rec = heldHalf(w.nodes[node]?.pairs, qid);
  if (!rec) return undefined;
  const partner = w.nodes[rec.partner];
  if (!partner) return undefined;
  for (const other of partner.pairs) {
    if (other.id === rec.id && other.partner === node) return other.qubit;
  }
  return undefined;
}

/** Removes the first occurrence of `item` from a list in place, keeping the order (unlike `splice`, it makes no new array). */
export function removeItem<T>(list: T[], item: T): void {
  const i = list.indexOf(item);
  if (i < 0) return;
  for (let j = i + 1; j < list.length; j++) list[j - 1] = list[j];
  list.length--;
}

/** The record of the half held in qubit `qid` among a node's pairs, if it is there. */
export function heldHalf(pairs: readonly PairRecord[] | undefined, qid: number): PairRecord | undefined {
  if (pairs === undefined) return undefined;
  for (let i = 0; i < pairs.length; i++) if (pairs[i].qubit === qid) return pairs[i];
  return undefined;
}

export interface PairView {
  /** The pair's true fidelity to Φ+ (both halves located), else undefined. */
  fidelity?: number;
  bell?: [number, number, number, number];
}

/** True fidelity and Bell coefficients of a held half and its far half at time t, ends in sorted order. */
export function viewPair(net: Net, w: World, node: string, qid: number, t: number): PairView {
  const far = farHalf(w, node, qid);
  if (!far) return {};
  const farNode = w.qubits.get(far)!.node;
  const [a, b] = node <= farNode ? [qid, far] : [far, qid];
  const rho = twoQubitState(net, w, a, b, t);
  return { fidelity: fidelityPhiPlus(rho), bell: bellCoefficients(rho) };
}
