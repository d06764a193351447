/**
 * In-place gate kernels on the raw data array, and the block layout shared with the channel
 * kernels. Every public operation copies its input once and then runs one or more kernels,
 * so each touches only the index pairs a gate or channel affects and no dense 2^n × 2^n
 * product is ever formed. Kernels allocate nothing large and create no closures: a typed
 * array above 64 bytes costs more than a 2-qubit gate itself, so one copy per call is the budget.
 */
import type { Mat2 } from './mat2.js';
import { dimOf, maskOf } from './rho.js';

/** Where qubit q's 2×2 blocks sit: `count` block origins in `bases`, and the strides inside a block. */
export interface BlockLayout {
  /** Data offsets of entry (0,0) of each block; only the first `count` are valid. */
  readonly bases: Int32Array;
  readonly count: number;
  /** Offsets from entry (0,0) to (0,1), (1,0) and (1,1). */
  readonly s01: number;
  readonly s10: number;
  readonly s11: number;
}

// Layouts of the sizes that occur in a network (clusters of up to 5 qubits) are computed once
// and kept; larger ones use a shared scratch array, grown on demand (kernels are synchronous
// and read it right after blockLayout fills it).
const CACHED_QUBITS = 5;
const layoutCache: (BlockLayout | undefined)[] = new Array(CACHED_QUBITS * CACHED_QUBITS + CACHED_QUBITS + 1);
let baseScratch = new Int32Array(16);

function fillBases(n: number, q: number, bases: Int32Array): void {
  const dim = dimOf(n);
  const mask = maskOf(n, q);
  const step = 2 * mask;
  let k = 0;
  for (let rh = 0; rh < dim; rh += step)
    for (let rl = 0; rl < mask; rl++) {
      const row = 2 * (rh + rl) * dim;
      for (let ch = 0; ch < dim; ch += step) for (let cl = 0; cl < mask; cl++) bases[k++] = row + 2 * (ch + cl);
    }
}

/** The block layout of qubit q in an n-qubit state (valid until the next call). */
export function blockLayout(n: number, q: number): BlockLayout {
  const dim = dimOf(n);
  const mask = maskOf(n, q);
  const count = (dim * dim) >> 2;
  if (n <= CACHED_QUBITS) {
    const key = n * CACHED_QUBITS + q;
    let L = layoutCache[key];
    if (L === undefined) {
      const bases = new Int32Array(count);
      fillBases(n, q, bases);
      L = { bases, count, s01: 2 * mask, s10: 2 * mask * dim, s11: 2 * mask * (dim + 1) };
      layoutCache[key] = L;
    }
    return L;
  }
  if (baseScratch.length < count) baseScratch = new Int32Array(count);
  fillBases(n, q, baseScratch);
  return { bases: baseScratch, count, s01: 2 * mask, s10: 2 * mask * dim, s11: 2 * mask * (dim + 1) };
}

// Scratch space for one 2×2 block; kernels are synchronous, so sharing it is safe.
const blk = new Float64Array(8);
const tmp = new Float64Array(8);

/** Copies block entries (00, 01, 10, 11) at base i into blk, or back. */
function load(d: Float64Array, i: number, L: BlockLayout): void {
  blk[0] = d[i];
  blk[1] = d[i + 1];
  blk[2] = d[i + L.s01];
  blk[3] = d[i + L.s01 + 1];
  blk[4] = d[i + L.s10];
  blk[5] = d[i + L.s10 + 1];
  blk[6] = d[i + L.s11];
  blk[7] = d[i + L.s11 + 1];
}

function store(d: Float64Array, i: number, L: BlockLayout, from: Float64Array): void {
  d[i] = from[0];
  d[i + 1] = from[1];
  d[i + L.s01] = from[2];
  d[i + L.s01 + 1] = from[3];
  d[i + L.s10] = from[4];
  d[i + L.s10 + 1] = from[5];
  d[i + L.s11] = from[6];
  d[i + L.s11 + 1] = from[7];
}

/** B ← U·B·U† on every 2×2 block of qubit q (scalar code, so a block stays in registers). */
export function unitary1InPlace(d: Float64Array, n: number, q: number, u: Mat2): void {
  // U = [[a, b], [c, e]]
  const ar = u[0], ai = u[1], br = u[2], bi = u[3], cr = u[4], ci = u[5], er = u[6], ei = u[7];
  const L = blockLayout(n, q);
  const { bases, s01, s10, s11 } = L;
  for (let k = 0; k < L.count; k++) {
    const i = bases[k];
    const x00r = d[i], x00i = d[i + 1];
    const x01r = d[i + s01], x01i = d[i + s01 + 1];
    const x10r = d[i + s10], x10i = d[i + s10 + 1];
    const x11r = d[i + s11], x11i = d[i + s11 + 1];
    // M = U·B
    const m00r = ar * x00r - ai * x00i + br * x10r - bi * x10i;
    const m00i = ar * x00i + ai * x00r + br * x10i + bi * x10r;
    const m01r = ar * x01r - ai * x01i + br * x11r - bi * x11i;
    const m01i = ar * x01i + ai * x01r + br * x11i + bi * x11r;
    const m10r = cr * x00r - ci * x00i + er * x10r - ei * x10i;
    const m10i = cr * x00i + ci * x00r + er * x10i + ei * x10r;
    const m11r = cr * x01r - ci * x01i + er * x11r - ei * x11i;
    const m11i = cr * x01i + ci * x01r + er * x11i + ei * x11r;
    // B' = M·U†, with U† = [[conj a, conj c], [conj b, conj e]]
    d[i] = m00r * ar + m00i * ai + m01r * br + m01i * bi;
    d[i + 1] = m00i * ar - m00r * ai + m01i * br - m01r * bi;
    d[i + s01] = m00r * cr + m00i * ci + m01r * er + m01i * ei;
    d[i + s01 + 1] = m00i * cr - m00r * ci + m01i * er - m01r * ei;
    d[i + s10] = m10r * ar + m10i * ai + m11r * br + m11i * bi;
    d[i + s10 + 1] = m10i * ar - m10r * ai + m11i * br - m11r * bi;
    d[i + s11] = m10r * cr + m10i * ci + m11r * er + m11i * ei;
    d[i + s11 + 1] = m10i * cr - m10r * ci + m11i * er - m11r * ei;
  }
}

/**
 * Applies a one-qubit superoperator to qubit q: vec(B') = S·vec(B) on every 2×2 block, with
 * vec in row-major order (00, 01, 10, 11) and S a 4×4 complex matrix, interleaved re/im.
 */
export function superop1InPlace(d: Float64Array, n: number, q: number, S: Float64Array): void {
  const L = blockLayout(n, q);
  for (let k = 0; k < L.count; k++) {
    const base = L.bases[k];
    load(d, base, L);
    for (let i = 0; i < 4; i++) {
      let re = 0;
      let im = 0;
      for (let j = 0; j < 4; j++) {
        const x = 8 * i + 2 * j;
        re += S[x] * blk[2 * j] - S[x + 1] * blk[2 * j + 1];
        im += S[x] * blk[2 * j + 1] + S[x + 1] * blk[2 * j];
      }
      tmp[2 * i] = re;
      tmp[2 * i + 1] = im;
    }
    store(d, base, L, tmp);
  }
}

function swap(d: Float64Array, a: number, b: number): void {
  const re = d[a];
  const im = d[a + 1];
  d[a] = d[b];
  d[a + 1] = d[b + 1];
  d[b] = re;
  d[b + 1] = im;
}

/** X on qubit q: swaps (0,0)↔(1,1) and (0,1)↔(1,0) in every block. */
export function flipInPlace(d: Float64Array, n: number, q: number): void {
  const L = blockLayout(n, q);
  for (let k = 0; k < L.count; k++) {
    const i = L.bases[k];
    swap(d, i, i + L.s11);
    swap(d, i + L.s01, i + L.s10);
  }
}

/** Multiplies entry i by the complex factor f (in place). */
export function mulAt(d: Float64Array, i: number, fr: number, fi: number): void {
  const re = d[i];
  const im = d[i + 1];
  d[i] = fr * re - fi * im;
  d[i + 1] = fr * im + fi * re;
}

/** diag(φ0, φ1) on qubit q: with f = φ0·conj(φ1), entries (0,1) gain f and (1,0) gain conj(f). */
export function phase1InPlace(d: Float64Array, n: number, q: number, fr: number, fi: number): void {
  const L = blockLayout(n, q);
  for (let k = 0; k < L.count; k++) {
    const i = L.bases[k];
    mulAt(d, i + L.s01, fr, fi);
    mulAt(d, i + L.s10, fr, -fi);
  }
}

let permScratch = new Int32Array(16);

/** A scratch array for a basis permutation of an n-qubit state (valid until the next call). */
export function permutationScratch(n: number): Int32Array {
  const dim = dimOf(n);
  if (permScratch.length < dim) permScratch = new Int32Array(dim);
  return permScratch;
}

/** ρ[r,c] ← ρ[p(r), p(c)] for a permutation p (first 2^n entries) that is its own inverse (cnot, swap). */
export function involutionInPlace(d: Float64Array, n: number, p: Int32Array): void {
  const dim = dimOf(n);
  for (let r = 0; r < dim; r++) {
    const pr = p[r];
    for (let c = 0; c < dim; c++) {
      const a = r * dim + c;
      const b = pr * dim + p[c];
      if (b > a) swap(d, 2 * a, 2 * b);
    }
  }
}

/** A new array with ρ'[r,c] = ρ[p(r), p(c)] for a permutation p (first 2^n entries). */
export function permutedCopy(src: Float64Array, n: number, p: Int32Array): Float64Array {
  const dim = dimOf(n);
  const out = new Float64Array(src.length);
  for (let r = 0; r < dim; r++) {
    const row = 2 * r * dim;
    const srcRow = 2 * p[r] * dim;
    for (let c = 0; c < dim; c++) {
      const from = srcRow + 2 * p[c];
      out[row + 2 * c] = src[from];
      out[row + 2 * c + 1] = src[from + 1];
    }
  }
  return out;
}

/** CZ on the qubits under `both`: negates (r,c) where exactly one of r, c has both bits set. */
export function czInPlace(d: Float64Array, n: number, both: number): void {
  const dim = dimOf(n);
  for (let r = 0; r < dim; r++) {
    const sr = (r & both) === both;
    for (let c = 0; c < dim; c++) {
      if (sr === ((c & both) === both)) continue;
      const i = 2 * (r * dim + c);
      d[i] = -d[i];
      d[i + 1] = -d[i + 1];
    }
  }
}
