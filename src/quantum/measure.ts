/**
 * Projective, destructive measurement with an injected uniform draw, and outcome
 * probabilities in the Z, X and Y bases.
 */
import { unitary1InPlace } from './blocks.js';
import { bitFlipInPlace } from './channel-kernels.js';
import { H, SDG } from './mat2.js';
import { checkProbability, checkQubit, clone, dimOf, maskOf, type Rho } from './rho.js';

/** Measurement basis; outcome 0 is |0⟩, |+⟩ or |+i⟩ respectively. */
export type Basis = 'z' | 'x' | 'y';

/** The outcome of `measure`. */
export interface Measurement {
  /** The reported bit. */
  readonly bit: 0 | 1;
  /** Probability of reporting 0, readout error included. */
  readonly p0: number;
  /** The remaining qubits, conditioned on the reported bit and renormalised. */
  readonly rho: Rho;
}

/** Outcomes below this probability are never chosen, so renormalising never divides by ~0. */
const NEGLIGIBLE = 1e-15;

function checkBasis(basis: string): asserts basis is Basis {
  if (basis !== 'z' && basis !== 'x' && basis !== 'y') {
    throw new Error(`measurement basis must be z, x or y, got "${String(basis)}"`);
  }
}

/** [p0, p1] for measuring qubit q in the given basis (no readout error). */
export function probabilities(rho: Rho, q: number, basis: Basis): [number, number] {
  checkQubit(rho.n, q);
  checkBasis(basis);
  const dim = dimOf(rho.n);
  const mask = maskOf(rho.n, q);
  const d = rho.data;
  // Only qubit q's reduced state σ matters; its entries are sums over the other qubits.
  let s00 = 0;
  let s11 = 0;
  let s01r = 0;
  let s01i = 0;
  for (let r = 0; r < dim; r++) {
    if (r & mask) continue;
    const r1 = r | mask;
    s00 += d[2 * (r * dim + r)];
    s11 += d[2 * (r1 * dim + r1)];
    s01r += d[2 * (r * dim + r1)];
    s01i += d[2 * (r * dim + r1) + 1];
  }
  const half = (s00 + s11) / 2;
  if (basis === 'z') return [s00, s11];
  if (basis === 'x') return [half + s01r, half - s01r];
  return [half - s01i, half + s01i];
}

/**
 * Measures qubit q in a basis and removes it. Outcome 0 iff u < p0, where p0 includes a
 * readout flip with probability `flip` in the measured basis.
 */
export function measure(rho: Rho, q: number, basis: Basis, u: number, flip = 0): Measurement {
  checkQubit(rho.n, q);
  checkBasis(basis);
  if (!(u >= 0 && u < 1)) throw new Error(`uniform draw u must be in [0, 1), got ${String(u)}`);
  checkProbability(flip, 'readout flip probability');
  const work = clone(rho);
  const dimOut = dimOf(rho.n) >> 1;
  const out = new Float64Array(2 * dimOut * dimOut);
  const r = measureInto(work.data, rho.n, q, basis, u, flip, out);
  return { bit: r.bit, p0: r.p0, rho: { n: rho.n - 1, data: out } };
}

const outcome = { bit: 0 as 0 | 1, p0: 0 };

/**
 * The in-place form of `measure` for a caller that owns `d` (an n-qubit state, which it
 * overwrites): writes the remaining n−1 qubits into `out` and returns the outcome (a shared
 * object, valid until the next call). Arguments are not checked.
 */
export function measureInto(d: Float64Array, n: number, q: number, basis: Basis, u: number, flip: number, out: Float64Array): { readonly bit: 0 | 1; readonly p0: number } {
  // Rotate the measured basis onto Z, so that outcome 0 is always |0⟩.
  if (basis === 'y') unitary1InPlace(d, n, q, SDG);
  if (basis !== 'z') unitary1InPlace(d, n, q, H);
  bitFlipInPlace(d, n, q, flip);

  const dim = dimOf(n);
  const mask = maskOf(n, q);
  let p0 = 0;
  let p1 = 0;
  for (let r = 0; r < dim; r++) {
    const v = d[2 * (r * dim + r)];
    if (r & mask) p1 += v;
    else p0 += v;
  }
  const total = p0 + p1;
  p0 = Math.min(1, Math.max(0, p0 / total));
  p1 = 1 - p0;
  let bit: 0 | 1 = u < p0 ? 0 : 1;
  if ((bit === 0 ? p0 : p1) < NEGLIGIBLE) bit = bit === 0 ? 1 : 0;
  const p = (bit === 0 ? p0 : p1) * total;

  const dimOut = dim >> 1;
  // Old index of reduced index j: j's bits below qubit q stay, the rest move up past it.
  const low = mask - 1;
  const set = bit ? mask : 0;
  for (let r = 0; r < dimOut; r++) {
    const rOld = ((r & ~low) << 1) | (r & low) | set;
    for (let c = 0; c < dimOut; c++) {
      const i = 2 * (rOld * dim + (((c & ~low) << 1) | (c & low) | set));
      out[2 * (r * dimOut + c)] = d[i] / p;
      out[2 * (r * dimOut + c) + 1] = d[i + 1] / p;
    }
  }
  outcome.bit = bit;
  outcome.p0 = p0;
  return outcome;
}
