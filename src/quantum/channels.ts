/**
 * Noise channels on one or two qubits (Nielsen & Chuang §8.3), each applied block by block
 * to the affected qubits' 2×2 (or 4×4) sub-blocks.
 */
import { superop1InPlace } from './blocks.js';
import {
  amplitudeDampInPlace,
  bitFlipInPlace,
  depolarize1InPlace,
  depolarize2InPlace,
  scaleCoherenceInPlace,
} from './channel-kernels.js';
import { completenessError, superopOf, type Mat2 } from './mat2.js';
import { checkDistinct, checkProbability, checkQubit, clone, type Rho } from './rho.js';

/** Checks the qubit and returns a private copy for an in-place kernel. */
function copyFor(rho: Rho, q: number): Rho {
  checkQubit(rho.n, q);
  return clone(rho);
}

/** ρ → (1−p)ρ + p·(Tr_q ρ ⊗ I/2) on qubit q. */
export function depolarize1(rho: Rho, q: number, p: number): Rho {
  checkProbability(p, 'depolarizing probability');
  const out = copyFor(rho, q);
  depolarize1InPlace(out.data, out.n, q, p);
  return out;
}

/** ρ → (1−p)ρ + p·(Tr_{q1 q2} ρ ⊗ I/4) on qubits q1 and q2. */
export function depolarize2(rho: Rho, q1: number, q2: number, p: number): Rho {
  checkProbability(p, 'depolarizing probability');
  checkDistinct(rho.n, [q1, q2]);
  const out = clone(rho);
  depolarize2InPlace(out.data, out.n, q1, q2, p);
  return out;
}

/** Amplitude damping with Kraus E0 = [[1,0],[0,√(1−γ)]], E1 = [[0,√γ],[0,0]]. */
export function amplitudeDamp(rho: Rho, q: number, gamma: number): Rho {
  checkProbability(gamma, 'amplitude damping γ');
  const out = copyFor(rho, q);
  amplitudeDampInPlace(out.data, out.n, q, gamma);
  return out;
}

/** Phase damping with Kraus E0 = [[1,0],[0,√(1−λ)]], E1 = [[0,0],[0,√λ]]: coherences scale by √(1−λ). */
export function phaseDamp(rho: Rho, q: number, lambda: number): Rho {
  checkProbability(lambda, 'phase damping λ');
  const out = copyFor(rho, q);
  scaleCoherenceInPlace(out.data, out.n, q, Math.sqrt(1 - lambda));
  return out;
}

/** X on qubit q with probability p. */
export function bitFlip(rho: Rho, q: number, p: number): Rho {
  checkProbability(p, 'bit-flip probability');
  const out = copyFor(rho, q);
  bitFlipInPlace(out.data, out.n, q, p);
  return out;
}

/** Z on qubit q with probability p (coherences scale by 1−2p). */
export function phaseFlip(rho: Rho, q: number, p: number): Rho {
  checkProbability(p, 'phase-flip probability');
  const out = copyFor(rho, q);
  scaleCoherenceInPlace(out.data, out.n, q, 1 - 2 * p);
  return out;
}

/** A general one-qubit channel ρ → Σ_k E_k ρ E_k†; the operators must be trace-preserving. */
export function applyKraus1(rho: Rho, q: number, ops: readonly Mat2[]): Rho {
  if (ops.length === 0 || ops.some((e) => e.length !== 8 || !e.every(Number.isFinite))) {
    throw new Error('applyKraus1 needs at least one Kraus operator, each 8 finite numbers (2×2 complex, re/im interleaved)');
  }
  const err = completenessError(ops);
  if (err > 1e-9) {
    throw new Error(`Kraus operators are not trace-preserving: Σ E†E differs from I by ${err.toExponential(2)}`);
  }
  const S = superopOf(ops);
  const out = copyFor(rho, q);
  superop1InPlace(out.data, out.n, q, S);
  return out;
}

/**
 * Memory decay of qubit q over dtNs: amplitude damping with γ = 1 − e^(−t/T1) (if T1 is
 * given) and pure dephasing at rate 1/T2 − 1/(2·T1), so that the coherence decays by
 * exactly e^(−t/T2). Throws if T2 > 2·T1.
 */
export function memoryDecay(rho: Rho, q: number, dtNs: number, t1Ns?: number, t2Ns?: number): Rho {
  checkQubit(rho.n, q);
  checkDecay(dtNs, t1Ns, t2Ns);
  if (dtNs === 0 || (t1Ns === undefined && t2Ns === undefined)) return rho;
  const out = clone(rho);
  memoryDecayInPlace(out.data, out.n, q, dtNs, t1Ns, t2Ns);
  return out;
}

/** Throws unless dt is a finite duration ≥ 0, T1 and T2 (when given) are positive, and T2 ≤ 2·T1. */
export function checkDecay(dtNs: number, t1Ns?: number, t2Ns?: number): void {
  if (!(dtNs >= 0) || !Number.isFinite(dtNs)) throw new Error(`decay time must be a finite duration ≥ 0 ns, got ${String(dtNs)}`);
  if (t1Ns !== undefined && !(t1Ns > 0)) throw new Error(`T1 must be a positive duration, got ${String(t1Ns)} ns`);
  if (t2Ns !== undefined && !(t2Ns > 0)) throw new Error(`T2 must be a positive duration, got ${String(t2Ns)} ns`);
  if (t1Ns !== undefined && t2Ns !== undefined && t2Ns > 2 * t1Ns) {
    throw new Error(`T2 (${t2Ns} ns) must not exceed 2·T1 (${2 * t1Ns} ns): no physical memory dephases slower than that`);
  }
}

/** The in-place form of `memoryDecay` for a caller that owns `d` and has run `checkDecay`. */
export function memoryDecayInPlace(d: Float64Array, n: number, q: number, dtNs: number, t1Ns?: number, t2Ns?: number): void {
  if (dtNs === 0) return;
  if (t1Ns !== undefined) amplitudeDampInPlace(d, n, q, 1 - Math.exp(-dtNs / t1Ns));
  if (t2Ns !== undefined) {
    const pureRate = 1 / t2Ns - (t1Ns === undefined ? 0 : 1 / (2 * t1Ns));
    scaleCoherenceInPlace(d, n, q, Math.exp(-dtNs * pureRate));
  }
}
