/**
 * The density-matrix value: n qubits, dim = 2^n, row-major, interleaved re/im, qubit 0 the
 * most significant bit of the basis index. Everything here is pure.
 */

/** An n-qubit density matrix; `data` holds 2·dim·dim numbers and is never mutated once built. */
export interface Rho {
  readonly n: number;
  readonly data: Float64Array;
}

/** The largest cluster `tensor` builds unless told otherwise (a 10-qubit matrix is 16 MiB). */
export const MAX_CLUSTER_QUBITS = 10;

/** Thrown when merging two clusters would exceed the qubit cap. */
export class ClusterTooLargeError extends Error {
  /** Stable code, so callers can tell this error apart without parsing prose. */
  readonly code = 'cluster-too-large';
  /** Qubits the merged cluster would have had. */
  readonly qubits: number;
  /** The cap that was in force. */
  readonly cap: number;

  constructor(qubits: number, cap: number) {
    const mib = (2 * 8 * 4 ** qubits) / 2 ** 20;
    super(
      `entangled cluster of ${qubits} qubits exceeds the cap of ${cap} qubits ` +
        `(a ${qubits}-qubit density matrix takes ${mib >= 1 ? mib.toFixed(0) : mib.toFixed(3)} MiB); ` +
        `the cap can be raised by passing a larger maxQubits to tensor (default MAX_CLUSTER_QUBITS = ${MAX_CLUSTER_QUBITS}) ` +
        `if memory and time allow`,
    );
    this.name = 'ClusterTooLargeError';
    this.qubits = qubits;
    this.cap = cap;
  }
}

/** 2^n. */
export function dimOf(n: number): number {
  return 1 << n;
}

/** The bit of qubit q in a basis index of an n-qubit register (qubit 0 is the most significant). */
export function maskOf(n: number, q: number): number {
  return 1 << (n - 1 - q);
}

/** Throws unless q names a qubit of an n-qubit state. */
export function checkQubit(n: number, q: number, what = 'qubit'): void {
  if (!Number.isInteger(q) || q < 0 || q >= n) {
    throw new Error(`${what} index ${String(q)} is out of range for a ${n}-qubit state (valid: 0..${n - 1})`);
  }
}

/** Throws unless the qubits are valid and pairwise distinct. */
export function checkDistinct(n: number, qubits: readonly number[]): void {
  for (let i = 0; i < qubits.length; i++) {
    checkQubit(n, qubits[i]);
    for (let j = 0; j < i; j++) {
      if (qubits[j] === qubits[i]) throw new Error(`qubit indices must be distinct, got [${qubits.join(', ')}]`);
    }
  }
}

/** Throws unless p is a probability. */
export function checkProbability(p: number, what: string): void {
  if (!(p >= 0 && p <= 1)) throw new Error(`${what} must be a probability in [0, 1], got ${String(p)}`);
}

/** Wraps a data array as a Rho after checking its length. */
export function fromData(n: number, data: Float64Array): Rho {
  const dim = dimOf(n);
  if (data.length !== 2 * dim * dim) {
    throw new Error(`a ${n}-qubit density matrix needs ${2 * dim * dim} numbers, got ${data.length}`);
  }
  return { n, data };
}

/** A copy that shares nothing with the input. */
export function clone(rho: Rho): Rho {
  return { n: rho.n, data: rho.data.slice() };
}

/** The projector onto a computational basis state (all zeros unless bits are given). */
export function basisState(n: number, bits?: readonly (0 | 1)[]): Rho {
  if (!Number.isInteger(n) || n < 0) throw new Error(`qubit count must be a non-negative integer, got ${String(n)}`);
  if (bits !== undefined && bits.length !== n) {
    throw new Error(`basisState(${n}) needs ${n} bits, got ${bits.length}`);
  }
  const dim = dimOf(n);
  let index = 0;
  for (let q = 0; q < n; q++) {
    const b = bits?.[q] ?? 0;
    if (b !== 0 && b !== 1) throw new Error(`bits must be 0 or 1, got ${String(b)} for qubit ${q}`);
    index = (index << 1) | b;
  }
  const data = new Float64Array(2 * dim * dim);
  data[2 * (index * dim + index)] = 1;
  return { n, data };
}

/** Real part of the trace. */
export function trace(rho: Rho): number {
  const dim = dimOf(rho.n);
  let t = 0;
  for (let r = 0; r < dim; r++) t += rho.data[2 * (r * dim + r)];
  return t;
}

/** Whether ρ equals its conjugate transpose within `tol` in every component. */
export function isHermitian(rho: Rho, tol = 1e-12): boolean {
  const dim = dimOf(rho.n);
  const d = rho.data;
  for (let r = 0; r < dim; r++) {
    for (let c = r; c < dim; c++) {
      const a = 2 * (r * dim + c);
      const b = 2 * (c * dim + r);
      if (Math.abs(d[a] - d[b]) > tol || Math.abs(d[a + 1] + d[b + 1]) > tol) return false;
    }
  }
  return true;
}
