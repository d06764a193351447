/**
 * Test helpers: an independent dense reference built on mathjs, seeded random states, and
 * outcome enumeration for circuits. Nothing here uses the kernel's own gate or channel code.
 */
import * as math from 'mathjs';
import type { Complex, Matrix } from 'mathjs';
import { measure, probabilities, type Basis, type Rho } from '../../src/quantum/index.js';

/** Small seeded generator (mulberry32), so random inputs are the same on every run. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random full-rank density matrix A·A†/Tr from a complex Gaussian-ish A (plain loops, no kernel code). */
export function randomRho(n: number, rand: () => number, rank = 1 << n): Rho {
  const dim = 1 << n;
  const g = (): number => rand() + rand() + rand() - 1.5;
  const a: number[] = [];
  for (let i = 0; i < 2 * dim * rank; i++) a.push(g());
  const data = new Float64Array(2 * dim * dim);
  let tr = 0;
  for (let r = 0; r < dim; r++)
    for (let c = 0; c < dim; c++) {
      let re = 0;
      let im = 0;
      for (let k = 0; k < rank; k++) {
        const [xr, xi] = [a[2 * (r * rank + k)], a[2 * (r * rank + k) + 1]];
        const [yr, yi] = [a[2 * (c * rank + k)], -a[2 * (c * rank + k) + 1]];
        re += xr * yr - xi * yi;
        im += xr * yi + xi * yr;
      }
      data[2 * (r * dim + c)] = re;
      data[2 * (r * dim + c) + 1] = im;
      if (r === c) tr += re;
    }
  for (let i = 0; i < data.length; i++) data[i] /= tr;
  return { n, data };
}

/** Random Bell coefficients that sum to 1. */
export function randomBell(rand: () => number): [number, number, number, number] {
  const w = [rand(), rand(), rand(), rand()];
  const s = w[0] + w[1] + w[2] + w[3];
  return [w[0] / s, w[1] / s, w[2] / s, w[3] / s];
}

/** The kernel's matrix as a mathjs complex matrix. */
export function toMath(rho: Rho): Matrix {
  const dim = 1 << rho.n;
  const rows: Complex[][] = [];
  for (let r = 0; r < dim; r++) {
    const row: Complex[] = [];
    for (let c = 0; c < dim; c++) row.push(math.complex(rho.data[2 * (r * dim + c)], rho.data[2 * (r * dim + c) + 1]));
    rows.push(row);
  }
  return math.matrix(rows);
}

/** Largest componentwise difference between a kernel matrix and a mathjs matrix. */
export function maxDiff(rho: Rho, m: Matrix): number {
  const dim = 1 << rho.n;
  let worst = 0;
  for (let r = 0; r < dim; r++)
    for (let c = 0; c < dim; c++) {
      const z = math.complex(m.get([r, c]) as Complex | number);
      worst = Math.max(worst, Math.abs(rho.data[2 * (r * dim + c)] - z.re), Math.abs(rho.data[2 * (r * dim + c) + 1] - z.im));
    }
  return worst;
}

const c = (re: number, im = 0): Complex => math.complex(re, im);
const s = Math.SQRT1_2;

/** Textbook one-qubit matrices (Nielsen & Chuang §4.2), written out here independently of the kernel. */
export const PAULI = {
  i: math.matrix([[c(1), c(0)], [c(0), c(1)]]),
  x: math.matrix([[c(0), c(1)], [c(1), c(0)]]),
  y: math.matrix([[c(0), c(0, -1)], [c(0, 1), c(0)]]),
  z: math.matrix([[c(1), c(0)], [c(0), c(-1)]]),
};
export const P0 = math.matrix([[c(1), c(0)], [c(0), c(0)]]);
export const P1 = math.matrix([[c(0), c(0)], [c(0), c(1)]]);

/** Dense 2×2 matrix of a one-qubit gate by its textbook definition. */
export function textbook1(gate: string, theta = 0): Matrix {
  const ch = Math.cos(theta / 2);
  const sh = Math.sin(theta / 2);
  switch (gate) {
    case 'x': case 'y': case 'z':
      return PAULI[gate];
    case 'h': return math.matrix([[c(s), c(s)], [c(s), c(-s)]]);
    case 's': return math.matrix([[c(1), c(0)], [c(0), c(0, 1)]]);
    case 'sdg': return math.matrix([[c(1), c(0)], [c(0), c(0, -1)]]);
    case 't': return math.matrix([[c(1), c(0)], [c(0), c(s, s)]]);
    case 'rx': return math.matrix([[c(ch), c(0, -sh)], [c(0, -sh), c(ch)]]);
    case 'ry': return math.matrix([[c(ch), c(-sh)], [c(sh), c(ch)]]);
    case 'rz': return math.matrix([[c(Math.cos(theta / 2), -Math.sin(theta / 2)), c(0)], [c(0), c(Math.cos(theta / 2), Math.sin(theta / 2))]]);
  }
  throw new Error(`not a one-qubit gate: ${gate}`);
}

/** Kron of one 2×2 factor per qubit (qubit 0 first, i.e. most significant); missing qubits get I. */
export function kronAt(n: number, factors: ReadonlyMap<number, Matrix>): Matrix {
  let m: Matrix = math.matrix([[c(1)]]);
  for (let q = 0; q < n; q++) m = math.kron(m, factors.get(q) ?? PAULI.i);
  return m;
}

/** The dense 2^n × 2^n unitary of a gate, built from Kron-expanded terms. */
export function denseGate(n: number, gate: string, qubits: readonly number[], theta = 0): Matrix {
  const [a, b] = qubits;
  const at = (entries: [number, Matrix][]): Matrix => kronAt(n, new Map(entries));
  switch (gate) {
    case 'cnot':
      return math.add(at([[a, P0]]), at([[a, P1], [b, PAULI.x]]));
    case 'cz':
      return math.add(at([[a, P0]]), at([[a, P1], [b, PAULI.z]]));
    case 'swap': {
      // SWAP = (II + XX + YY + ZZ)/2
      const terms = (['i', 'x', 'y', 'z'] as const).map((p) => at([[a, PAULI[p]], [b, PAULI[p]]]));
      return math.multiply(terms.reduce((x, y) => math.add(x, y)), 0.5) as Matrix;
    }
    default:
      return at([[a, textbook1(gate, theta)]]);
  }
}

/** U ρ U† with mathjs. */
export function conjugate(u: Matrix, rho: Matrix): Matrix {
  return math.multiply(math.multiply(u, rho), math.ctranspose(u)) as Matrix;
}

/** Smallest eigenvalue of a Hermitian matrix, via the real symmetric embedding [[Re, −Im], [Im, Re]]. */
export function minEigenvalue(rho: Rho): number {
  const dim = 1 << rho.n;
  const big: number[][] = [];
  for (let i = 0; i < 2 * dim; i++) big.push(new Array<number>(2 * dim).fill(0));
  for (let r = 0; r < dim; r++)
    for (let col = 0; col < dim; col++) {
      // Symmetrise so rounding noise cannot make eigs reject the matrix as non-symmetric.
      const re = (rho.data[2 * (r * dim + col)] + rho.data[2 * (col * dim + r)]) / 2;
      const im = (rho.data[2 * (r * dim + col) + 1] - rho.data[2 * (col * dim + r) + 1]) / 2;
      big[r][col] = re;
      big[r + dim][col + dim] = re;
      big[r][col + dim] = -im;
      big[r + dim][col] = im;
    }
  const values = math.eigs(big).values as number[] | Matrix;
  const list = Array.isArray(values) ? values : (values.toArray() as number[]);
  return Math.min(...list.map((v) => Number(v)));
}

/** One measurement branch, forced to a given bit: its probability and the post-measurement state. */
export function branch(rho: Rho, q: number, basis: Basis, bit: 0 | 1): { p: number; rho: Rho } | undefined {
  const p = probabilities(rho, q, basis)[bit];
  if (p < 1e-12) return undefined;
  // Outcome 0 iff u < p0: u = 0 forces 0, the largest double below 1 forces 1.
  const m = measure(rho, q, basis, bit === 0 ? 0 : 1 - Number.EPSILON / 2);
  if (m.bit !== bit) throw new Error('could not force the outcome');
  return { p, rho: m.rho };
}
