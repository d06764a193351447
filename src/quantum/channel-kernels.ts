/**
 * In-place channel kernels (Nielsen & Chuang §8.3) on the 2×2 blocks of one qubit, or the
 * 4×4 blocks of two.
 */
import { blockLayout, mulAt, phase1InPlace } from './blocks.js';
import { dimOf, maskOf } from './rho.js';

/** Scales the off-diagonal entries of qubit q's blocks by a real factor (dephasing). */
export function scaleCoherenceInPlace(d: Float64Array, n: number, q: number, factor: number): void {
  if (factor !== 1) phase1InPlace(d, n, q, factor, 0);
}

/** Amplitude damping with decay probability γ on qubit q. */
export function amplitudeDampInPlace(d: Float64Array, n: number, q: number, gamma: number): void {
  if (gamma === 0) return;
  const keep = 1 - gamma;
  const root = Math.sqrt(keep);
  const L = blockLayout(n, q);
  for (let k = 0; k < L.count; k++) {
    const i = L.bases[k];
    const i11 = i + L.s11;
    d[i] += gamma * d[i11];
    d[i + 1] += gamma * d[i11 + 1];
    d[i11] *= keep;
    d[i11 + 1] *= keep;
    mulAt(d, i + L.s01, root, 0);
    mulAt(d, i + L.s10, root, 0);
  }
}

/** Mixes two entries: (x, y) ← (k·x + p·y, k·y + p·x), both components. */
function mixAt(d: Float64Array, a: number, b: number, k: number, p: number): void {
  for (let t = 0; t < 2; t++) {
    const x = d[a + t];
    const y = d[b + t];
    d[a + t] = k * x + p * y;
    d[b + t] = k * y + p * x;
  }
}

/** B ← (1−p)·B + p·X·B·X on qubit q's blocks. */
export function bitFlipInPlace(d: Float64Array, n: number, q: number, p: number): void {
  if (p === 0) return;
  const L = blockLayout(n, q);
  for (let k = 0; k < L.count; k++) {
    const i = L.bases[k];
    mixAt(d, i, i + L.s11, 1 - p, p);
    mixAt(d, i + L.s01, i + L.s10, 1 - p, p);
  }
}

/** B ← (1−p)·B + p·(Tr B / 2)·I on qubit q's blocks, i.e. (1−p)ρ + p·Tr_q ρ ⊗ I/2. */
export function depolarize1InPlace(d: Float64Array, n: number, q: number, p: number): void {
  if (p === 0) return;
  const keep = 1 - p;
  const L = blockLayout(n, q);
  for (let k = 0; k < L.count; k++) {
    const i = L.bases[k];
    const i11 = i + L.s11;
    const hr = (p * (d[i] + d[i11])) / 2;
    const hi = (p * (d[i + 1] + d[i11 + 1])) / 2;
    d[i] = keep * d[i] + hr;
    d[i + 1] = keep * d[i + 1] + hi;
    d[i11] = keep * d[i11] + hr;
    d[i11 + 1] = keep * d[i11 + 1] + hi;
    mulAt(d, i + L.s01, keep, 0);
    mulAt(d, i + L.s10, keep, 0);
  }
}

/** ρ ← (1−p)ρ + p·Tr_{q1 q2} ρ ⊗ I/4, working on the 4×4 blocks of the two qubits. */
export function depolarize2InPlace(d: Float64Array, n: number, q1: number, q2: number, p: number): void {
  if (p === 0) return;
  const dim = dimOf(n);
  const m1 = maskOf(n, q1);
  const m2 = maskOf(n, q2);
  const both = m1 | m2;
  const sub = [0, m2, m1, both];
  const keep = 1 - p;
  for (let rb = 0; rb < dim; rb++) {
    if (rb & both) continue;
    for (let cb = 0; cb < dim; cb++) {
      if (cb & both) continue;
      let tr = 0;
      let ti = 0;
      for (const a of sub) {
        const i = 2 * ((rb + a) * dim + cb + a);
        tr += d[i];
        ti += d[i + 1];
      }
      for (const a of sub) {
        for (const b of sub) mulAt(d, 2 * ((rb + a) * dim + cb + b), keep, 0);
        const i = 2 * ((rb + a) * dim + cb + a);
        d[i] += (p * tr) / 4;
        d[i + 1] += (p * ti) / 4;
      }
    }
  }
}
