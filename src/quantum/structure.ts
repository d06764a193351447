/**
 * Merging and splitting clusters: tensor products, partial traces and qubit reordering.
 */
import { checkDistinct, ClusterTooLargeError, dimOf, maskOf, MAX_CLUSTER_QUBITS, type Rho } from './rho.js';

/** a ⊗ b, with the qubits of a first; throws ClusterTooLargeError above maxQubits. */
export function tensor(a: Rho, b: Rho, maxQubits: number = MAX_CLUSTER_QUBITS): Rho {
  const n = a.n + b.n;
  if (n > maxQubits) throw new ClusterTooLargeError(n, maxQubits);
  const dim = dimOf(n);
  const out = new Float64Array(2 * dim * dim);
  tensorInto(a, b, out);
  return { n, data: out };
}

/**
 * Writes a ⊗ b into `out` (2·4^(a.n+b.n) numbers, overwritten). Entries of a that are zero
 * are skipped, so their blocks stay +0 exactly as in a fresh array.
 */
export function tensorInto(a: Rho, b: Rho, out: Float64Array): void {
  const da = dimOf(a.n);
  const db = dimOf(b.n);
  const dim = da * db;
  out.fill(0, 0, 2 * dim * dim);
  const x = a.data;
  const y = b.data;
  for (let ra = 0; ra < da; ra++) {
    for (let ca = 0; ca < da; ca++) {
      const ia = 2 * (ra * da + ca);
      const xr = x[ia];
      const xi = x[ia + 1];
      if (xr === 0 && xi === 0) continue;
      for (let rb = 0; rb < db; rb++) {
        const rowOut = 2 * ((ra * db + rb) * dim + ca * db);
        const rowB = 2 * rb * db;
        for (let cb = 0; cb < db; cb++) {
          const yr = y[rowB + 2 * cb];
          const yi = y[rowB + 2 * cb + 1];
          out[rowOut + 2 * cb] = xr * yr - xi * yi;
          out[rowOut + 2 * cb + 1] = xr * yi + xi * yr;
        }
      }
    }
  }
}

/**
 * The reduced state of the listed qubits, in the listed order (all others traced out).
 * With every qubit listed this is a pure reordering, and the input itself when nothing moves.
 */
export function keepQubits(rho: Rho, keep: readonly number[]): Rho {
  checkDistinct(rho.n, keep);
  // Keeping every qubit in place is the common case of a pair alone in its cluster.
  if (keep.length === rho.n && isIdentity(keep)) return rho;
  const dimOut = dimOf(keep.length);
  const out = new Float64Array(2 * dimOut * dimOut);
  keepQubitsInto(rho, keep, out);
  return { n: keep.length, data: out };
}

/** Writes the reduced state of the listed qubits (distinct, checked by the caller) into `out`. */
export function keepQubitsInto(rho: Rho, keep: readonly number[], out: Float64Array): void {
  const n = rho.n;
  const { keepIdx, restIdx } = spreads(n, keep);
  const dimIn = dimOf(n);
  const dimOut = dimOf(keep.length);
  const src = rho.data;
  for (let r = 0; r < dimOut; r++) {
    const rOld = keepIdx[r];
    for (let c = 0; c < dimOut; c++) {
      const cOld = keepIdx[c];
      let re = 0;
      let im = 0;
      for (let j = 0; j < restIdx.length; j++) {
        const k = restIdx[j];
        const i = 2 * ((rOld + k) * dimIn + cOld + k);
        re += src[i];
        im += src[i + 1];
      }
      out[2 * (r * dimOut + c)] = re;
      out[2 * (r * dimOut + c) + 1] = im;
    }
  }
}

function isIdentity(order: readonly number[]): boolean {
  for (let i = 0; i < order.length; i++) if (order[i] !== i) return false;
  return true;
}

// Index spreads of the small states that occur in a network, built once per list of kept qubits.
const spreadCache = new Map<number, { keepIdx: Int32Array; restIdx: Int32Array }>();

function spreads(n: number, keep: readonly number[]): { keepIdx: Int32Array; restIdx: Int32Array } {
  // a key for n ≤ 6: the kept qubits as base-7 digits (1 + index), then n
  let key = -1;
  if (n <= 6) {
    key = 0;
    for (let i = 0; i < keep.length; i++) key = key * 7 + keep[i] + 1;
    key = key * 7 + n;
    const hit = spreadCache.get(key);
    if (hit !== undefined) return hit;
  }
  const rest: number[] = [];
  for (let q = 0; q < n; q++) if (keep.indexOf(q) < 0) rest.push(q);
  const s = { keepIdx: spread(n, keep), restIdx: spread(n, rest) };
  if (key >= 0) spreadCache.set(key, s);
  return s;
}

/** For each index j over the listed qubits (first listed = most significant), the old index with those bits set. */
function spread(n: number, qubits: readonly number[]): Int32Array {
  const m = qubits.length;
  const out = new Int32Array(dimOf(m));
  for (let j = 0; j < out.length; j++) {
    let old = 0;
    for (let i = 0; i < m; i++) if (j & (1 << (m - 1 - i))) old |= maskOf(n, qubits[i]);
    out[j] = old;
  }
  return out;
}

/** Traces out qubit q; the remaining qubits keep their relative order. */
export function partialTrace(rho: Rho, q: number): Rho {
  const keep: number[] = [];
  for (let k = 0; k < rho.n; k++) if (k !== q) keep.push(k);
  if (keep.length === rho.n) {
    throw new Error(`qubit index ${String(q)} is out of range for a ${rho.n}-qubit state (valid: 0..${rho.n - 1})`);
  }
  return keepQubits(rho, keep);
}

/** Reorders qubits: new qubit i is old qubit order[i]. */
export function permuteQubits(rho: Rho, order: readonly number[]): Rho {
  if (order.length !== rho.n) {
    throw new Error(`permuteQubits needs an order of all ${rho.n} qubits, got [${order.join(', ')}]`);
  }
  return keepQubits(rho, order);
}

/** The two-qubit state of qubits (qa, qb), in that order, with every other qubit traced out. */
export function reducedPair(rho: Rho, qa: number, qb: number): Rho {
  return keepQubits(rho, [qa, qb]);
}
