/** 2×2 complex matrices for one-qubit gates and Kraus operators. */

/** A 2×2 complex matrix: 8 numbers, row-major, interleaved re/im. */
export type Mat2 = readonly [number, number, number, number, number, number, number, number];

const R = Math.SQRT1_2;

/** Hadamard. */
export const H: Mat2 = [R, 0, R, 0, R, 0, -R, 0];
/** Pauli Y. */
export const Y: Mat2 = [0, 0, 0, -1, 0, 1, 0, 0];
/** S† (used to rotate a Y-basis readout onto Z). */
export const SDG: Mat2 = [1, 0, 0, 0, 0, 0, 0, -1];

/** rx(θ) = exp(−iθX/2) (Nielsen & Chuang §4.2). */
export function rx(theta: number): Mat2 {
  const c = Math.cos(theta / 2);
  const s = Math.sin(theta / 2);
  return [c, 0, 0, -s, 0, -s, c, 0];
}

/** ry(θ) = exp(−iθY/2) (Nielsen & Chuang §4.2). */
export function ry(theta: number): Mat2 {
  const c = Math.cos(theta / 2);
  const s = Math.sin(theta / 2);
  return [c, 0, -s, 0, s, 0, c, 0];
}

/** Entry (a, b) as [re, im]. */
function at(m: Mat2, a: number, b: number): [number, number] {
  const k = 2 * (2 * a + b);
  return [m[k], m[k + 1]];
}

/**
 * The superoperator Σ_k E_k ⊗ conj(E_k) acting on a row-major vectorised 2×2 block:
 * S[(a,b),(a',b')] = Σ_k E_k[a,a']·conj(E_k[b,b']).
 */
export function superopOf(ops: readonly Mat2[]): Float64Array {
  const S = new Float64Array(32);
  for (const e of ops) {
    for (let a = 0; a < 2; a++)
      for (let b = 0; b < 2; b++)
        for (let a2 = 0; a2 < 2; a2++)
          for (let b2 = 0; b2 < 2; b2++) {
            const [xr, xi] = at(e, a, a2);
            const [yr, yi] = at(e, b, b2);
            const k = 8 * (2 * a + b) + 2 * (2 * a2 + b2);
            S[k] += xr * yr + xi * yi;
            S[k + 1] += xi * yr - xr * yi;
          }
  }
  return S;
}

/** Largest deviation of Σ_k E_k† E_k from the identity (0 for a trace-preserving set). */
export function completenessError(ops: readonly Mat2[]): number {
  let worst = 0;
  for (let i = 0; i < 2; i++)
    for (let j = 0; j < 2; j++) {
      let re = 0;
      let im = 0;
      for (const e of ops)
        for (let k = 0; k < 2; k++) {
          // conj(E[k,i]) · E[k,j]
          const [ar, ai] = at(e, k, i);
          const [br, bi] = at(e, k, j);
          re += ar * br + ai * bi;
          im += ar * bi - ai * br;
        }
      worst = Math.max(worst, Math.abs(re - (i === j ? 1 : 0)), Math.abs(im));
    }
  return worst;
}
