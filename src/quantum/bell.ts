/**
 * Bell-diagonal states and Bell-basis figures of a pair, always in the fixed order
 * [Φ+, Φ−, Ψ+, Ψ−] with Φ± = (|00⟩ ± |11⟩)/√2 and Ψ± = (|01⟩ ± |10⟩)/√2.
 */
import type { Rho } from './rho.js';

/** Four Bell coefficients in the order [Φ+, Φ−, Ψ+, Ψ−]. */
export type BellCoeffs = [number, number, number, number];

/** Σ c_k |B_k⟩⟨B_k| over [Φ+, Φ−, Ψ+, Ψ−]; coefficients must be ≥ 0 and sum to 1. */
export function bellDiagonal(coeffs: readonly [number, number, number, number]): Rho {
  let ok = coeffs.length === 4;
  for (let i = 0; ok && i < 4; i++) ok = Number.isFinite(coeffs[i]) && coeffs[i] >= -1e-12;
  if (!ok) throw new Error(`Bell coefficients must be four numbers ≥ 0, got [${coeffs.join(', ')}]`);
  const sum = coeffs[0] + coeffs[1] + coeffs[2] + coeffs[3];
  if (Math.abs(sum - 1) > 1e-9) throw new Error(`Bell coefficients must sum to 1, got ${sum}`);
  const [pp, pm, sp, sm] = coeffs;
  // Real entries only; the offset of (r, c) is 2·(4r + c).
  const data = new Float64Array(32);
  data[0] = data[30] = (pp + pm) / 2; // (0,0), (3,3)
  data[6] = data[24] = (pp - pm) / 2; // (0,3), (3,0)
  data[10] = data[20] = (sp + sm) / 2; // (1,1), (2,2)
  data[12] = data[18] = (sp - sm) / 2; // (1,2), (2,1)
  return { n: 2, data };
}

function checkFidelity(f: number): void {
  if (!(f >= 0 && f <= 1)) throw new Error(`fidelity must be in [0, 1], got ${String(f)}`);
}

/** The Werner state of fidelity f: f·Φ+ plus (1−f)/3 of each other Bell state. */
export function wernerState(f: number): Rho {
  checkFidelity(f);
  const o = (1 - f) / 3;
  return bellDiagonal([f, o, o, 1 - f - 2 * o]);
}

/** f·Φ+ + (1−f)·Ψ+: a pair that suffered a bit flip with probability 1−f. */
export function bitFlipState(f: number): Rho {
  checkFidelity(f);
  return bellDiagonal([f, 0, 1 - f, 0]);
}

function checkPair(rho: Rho): void {
  if (rho.n !== 2) throw new Error(`a Bell-basis figure needs a 2-qubit state, got ${rho.n} qubits (use reducedPair first)`);
}

/** ⟨Φ+|ρ|Φ+⟩ of a two-qubit state. */
export function fidelityPhiPlus(rho: Rho): number {
  return bellCoefficients(rho)[0];
}

/** ⟨B|ρ|B⟩ for B in [Φ+, Φ−, Ψ+, Ψ−]. */
export function bellCoefficients(rho: Rho): BellCoeffs {
  checkPair(rho);
  // Real parts of (r, c) sit at 2·(4r + c); see bellDiagonal for the pattern.
  const d = rho.data;
  const phi = (d[0] + d[30]) / 2;
  const phiX = (d[6] + d[24]) / 2;
  const psi = (d[10] + d[20]) / 2;
  const psiX = (d[12] + d[18]) / 2;
  return [phi + phiX, phi - phiX, psi + psiX, psi - psiX];
}
