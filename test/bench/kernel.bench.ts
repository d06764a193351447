/**
 * The density-matrix kernel against mathjs doing the same operations densely: complex
 * matrices, Kron-expanded operators (built once, outside the timing) and U ρ U† products.
 */
import * as math from 'mathjs';
import { randomRho, seeded } from '../quantum/helpers.js';
import type { Complex, Matrix } from 'mathjs';
import {
  applyGate,
  depolarize1,
  fidelityPhiPlus,
  reducedPair,
  type Rho,
} from '../../src/quantum/index.js';
import { formatNs, timePerCall, type BenchLine } from './harness.js';

const GOAL = 50;

/**
 * Nanoseconds per call of `fn`. Fast calls are batched so that each timed call of the
 * harness lasts about 0.2 ms, because the harness reads the clock after every call.
 */
function nsPerCall(fn: () => void): number {
  const start = process.hrtime.bigint();
  fn();
  const estimate = Math.max(1, Number(process.hrtime.bigint() - start));
  const batch = Math.max(1, Math.round(2e5 / estimate));
  return timePerCall(() => {
    for (let i = 0; i < batch; i++) fn();
  }, 100) / batch;
}

/** Best times of both sides over alternating rounds, so a load spike on a shared machine hits both. */
function compare(dense: () => void, kernel: () => void): { dense: number; kernel: number } {
  let tDense = Infinity;
  let tKernel = Infinity;
  for (let round = 0; round < 3; round++) {
    tDense = Math.min(tDense, nsPerCall(dense));
    tKernel = Math.min(tKernel, nsPerCall(kernel));
  }
  return { dense: tDense, kernel: tKernel };
}

const cx = (re: number, im = 0): Complex => math.complex(re, im);
const I2 = math.matrix([[cx(1), cx(0)], [cx(0), cx(1)]]);
const X = math.matrix([[cx(0), cx(1)], [cx(1), cx(0)]]);
const Y = math.matrix([[cx(0), cx(0, -1)], [cx(0, 1), cx(0)]]);
const Z = math.matrix([[cx(1), cx(0)], [cx(0), cx(-1)]]);
const H = math.multiply(math.matrix([[cx(1), cx(1)], [cx(1), cx(-1)]]), Math.SQRT1_2) as Matrix;
const P0 = math.matrix([[cx(1), cx(0)], [cx(0), cx(0)]]);
const P1 = math.matrix([[cx(0), cx(0)], [cx(0), cx(1)]]);

function kronAt(n: number, at: ReadonlyMap<number, Matrix>): Matrix {
  let m: Matrix = math.matrix([[cx(1)]]);
  for (let q = 0; q < n; q++) m = math.kron(m, at.get(q) ?? I2);
  return m;
}

function toMath(rho: Rho): Matrix {
  const dim = 1 << rho.n;
  return math.matrix(
    Array.from({ length: dim }, (_, r) => Array.from({ length: dim }, (_, c) => cx(rho.data[2 * (r * dim + c)], rho.data[2 * (r * dim + c) + 1]))),
  );
}

const sandwich = (u: Matrix, uDag: Matrix, m: Matrix): Matrix => math.multiply(math.multiply(u, m), uDag) as Matrix;
const dag = (m: Matrix): Matrix => math.ctranspose(m) as Matrix;

/** Builds the dense operators for each compared operation and returns the function that applies them. */
function denseBuilders(n: number): Record<string, () => (m: Matrix) => unknown> {
  const mid = n >> 1;
  const p = 0.05;
  return {
    h: () => {
      const h = kronAt(n, new Map([[mid, H]]));
      const hDag = dag(h);
      return (m) => sandwich(h, hDag, m);
    },
    cnot: () => {
      const cnot = math.add(kronAt(n, new Map([[0, P0]])), kronAt(n, new Map([[0, P1], [n - 1, X]])));
      const cnotDag = dag(cnot);
      return (m) => sandwich(cnot, cnotDag, m);
    },
    depolarize: () => {
      const pauli = [math.multiply(I2, Math.sqrt(1 - (3 * p) / 4)), ...[X, Y, Z].map((k) => math.multiply(k, Math.sqrt(p / 4)))];
      const kraus = pauli.map((k) => kronAt(n, new Map([[mid, k as Matrix]])));
      const krausDag = kraus.map(dag);
      return (m) => kraus.map((k, i) => sandwich(k, krausDag[i], m)).reduce((a, b) => math.add(a, b));
    },
    'fidelity of a reduced pair': () => {
      // Tr over qubits 2..n−1 as Σ_k B_k ρ B_k†, with B_k = I ⊗ I ⊗ ⟨k| Kron-expanded.
      const bras: Matrix[] = [];
      for (let k = 0; k < 1 << (n - 2); k++) {
        let b: Matrix = math.kron(I2, I2);
        for (let q = 2; q < n; q++) b = math.kron(b, math.matrix([(k >> (n - 1 - q)) & 1 ? [cx(0), cx(1)] : [cx(1), cx(0)]]));
        bras.push(b);
      }
      const brasDag = bras.map(dag);
      const phi = math.matrix([[cx(Math.SQRT1_2)], [cx(0)], [cx(0)], [cx(Math.SQRT1_2)]]);
      const phiDag = dag(phi);
      return (m) => {
        const pair = bras.map((b, i) => sandwich(b, brasDag[i], m)).reduce((a, b) => math.add(a, b));
        return math.multiply(math.multiply(phiDag, pair), phi);
      };
    },
  };
}

function kernelOps(n: number): Record<string, (r: Rho) => unknown> {
  const mid = n >> 1;
  return {
    h: (r) => applyGate(r, 'h', [mid]),
    cnot: (r) => applyGate(r, 'cnot', [0, n - 1]),
    depolarize: (r) => depolarize1(r, mid, 0.05),
    'fidelity of a reduced pair': (r) => fidelityPhiPlus(reducedPair(r, 0, 1)),
  };
}

/**
 * One line per operation and size: how many times faster the kernel is than dense mathjs.
 * Both sides start from ρ plus the gate name and qubits, so the ratio counts mathjs building
 * its Kron-expanded operators, as the kernel builds its permutation or block layout on each
 * call; the detail also gives the ratio against mathjs with the operators prepared in advance.
 */
export default async function kernelBench(): Promise<BenchLine[]> {
  const lines: BenchLine[] = [];
  for (const n of [2, 4, 6]) {
    const rho = randomRho(n, seeded(1000 + n));
    const m = toMath(rho);
    const builders = denseBuilders(n);
    const kernel = kernelOps(n);
    for (const name of Object.keys(kernel)) {
      const prepared = builders[name]();
      const t = compare(
        () => void builders[name]()(m),
        () => void kernel[name](rho),
      );
      const tPrepared = compare(() => void prepared(m), () => void kernel[name](rho));
      const ratio = t.dense / t.kernel;
      const ratioPrepared = tPrepared.dense / tPrepared.kernel;
      const note = n === 2 && name.startsWith('fidelity') ? '; nothing to trace out at 2 qubits' : '';
      lines.push({
        name: `kernel vs mathjs, ${name} on ${n} qubits`,
        ratio,
        goal: `>= ${GOAL}x`,
        ok: ratio >= GOAL,
        detail:
          `kernel ${formatNs(t.kernel)}, mathjs ${formatNs(t.dense)}; ` +
          `with operators prepared: mathjs ${formatNs(tPrepared.dense)}, ratio ${ratioPrepared.toFixed(1)}${note}`,
      });
    }
  }
  return lines;
}
