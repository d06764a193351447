/** Noise channels against Nielsen & Chuang §8.3 and the dense mathjs reference. */
import * as math from 'mathjs';
import type { Matrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  amplitudeDamp,
  applyKraus1,
  basisState,
  bellDiagonal,
  bitFlip,
  depolarize1,
  depolarize2,
  fidelityPhiPlus,
  memoryDecay,
  phaseDamp,
  phaseFlip,
  wernerState,
  applyGate,
  type Mat2,
  type Rho,
} from '../../src/quantum/index.js';
import { conjugate, kronAt, maxDiff, PAULI, randomBell, randomRho, seeded, toMath } from './helpers.js';

/** Σ_k K_k ρ K_k† with each Kraus operator Kron-expanded to the full register (mathjs). */
function denseKraus(rho: Rho, q: number, ops: readonly Matrix[]): Matrix {
  const m = toMath(rho);
  return ops.map((k) => conjugate(kronAt(rho.n, new Map([[q, k]])), m)).reduce((a, b) => math.add(a, b));
}

const mat = (rows: number[][][]): Matrix => math.matrix(rows.map((r) => r.map(([re, im]) => math.complex(re, im ?? 0))));
const scaled = (m: Matrix, f: number): Matrix => math.multiply(m, f) as Matrix;

describe('depolarizing', () => {
  it('maps a Bell-diagonal F=0.95 through p=0.02 to 0.936 (Nielsen & Chuang §8.3)', () => {
    for (const coeffs of [[0.95, 0.02, 0.02, 0.01], [0.95, 0.05, 0, 0], [0.95, 0, 0.01, 0.04]] as const) {
      expect(fidelityPhiPlus(depolarize1(bellDiagonal(coeffs), 1, 0.02))).toBeCloseTo(0.936, 12);
    }
  });

  it('gives F′ = (1−p)F + p/4 on random Bell-diagonal pairs, either half (Nielsen & Chuang §8.3)', () => {
    const rand = seeded(83);
    for (let k = 0; k < 20; k++) {
      const b = randomBell(rand);
      const p = rand();
      const q = k % 2;
      expect(fidelityPhiPlus(depolarize1(bellDiagonal(b), q, p))).toBeCloseTo((1 - p) * b[0] + p / 4, 12);
    }
  });

  it('equals the Pauli twirl (1−3p/4)ρ + p/4·(XρX + YρY + ZρZ) on random states (Nielsen & Chuang §8.3)', () => {
    const rand = seeded(102);
    for (const n of [1, 2, 3, 4]) {
      const rho = randomRho(n, rand);
      const p = rand();
      const q = Math.floor(rand() * n);
      const ops = [scaled(PAULI.i, Math.sqrt(1 - (3 * p) / 4)), ...['x', 'y', 'z'].map((g) => scaled(PAULI[g as 'x'], Math.sqrt(p / 4)))];
      expect(maxDiff(depolarize1(rho, q, p), denseKraus(rho, q, ops))).toBeLessThan(1e-12);
    }
  });

  it('on two qubits equals (1−p)ρ + p/16·Σ over all Pauli pairs P⊗Q ρ P⊗Q (Nielsen & Chuang §8.3)', () => {
    const rand = seeded(4);
    for (const n of [2, 3, 4]) {
      const rho = randomRho(n, rand);
      const p = rand();
      const q1 = n - 1;
      const q2 = 0;
      const m = toMath(rho);
      let twirl: Matrix = math.multiply(m, 0) as Matrix;
      for (const a of ['i', 'x', 'y', 'z'] as const)
        for (const b of ['i', 'x', 'y', 'z'] as const) {
          twirl = math.add(twirl, conjugate(kronAt(n, new Map([[q1, PAULI[a]], [q2, PAULI[b]]])), m));
        }
      const want = math.add(scaled(m, 1 - p), scaled(twirl, p / 16));
      expect(maxDiff(depolarize2(rho, q1, q2, p), want)).toBeLessThan(1e-12);
    }
  });

  it('depolarize2 on a Werner pair gives F′ = (1−p)F + p/4 (Nielsen & Chuang §8.3)', () => {
    for (const f of [0.6, 0.9, 1]) for (const p of [0.01, 0.3]) {
      expect(fidelityPhiPlus(depolarize2(wernerState(f), 0, 1, p))).toBeCloseTo((1 - p) * f + p / 4, 12);
    }
  });
});

describe('Kraus channels against dense mathjs', () => {
  const rand = seeded(83);
  const cases: { name: string; run: (r: Rho, q: number, x: number) => Rho; ops: (x: number) => Matrix[] }[] = [
    {
      name: 'amplitude damping',
      run: amplitudeDamp,
      ops: (g) => [mat([[[1], [0]], [[0], [Math.sqrt(1 - g)]]]), mat([[[0], [Math.sqrt(g)]], [[0], [0]]])],
    },
    {
      name: 'phase damping',
      run: phaseDamp,
      ops: (l) => [mat([[[1], [0]], [[0], [Math.sqrt(1 - l)]]]), mat([[[0], [0]], [[0], [Math.sqrt(l)]]])],
    },
    { name: 'bit flip', run: bitFlip, ops: (p) => [scaled(PAULI.i, Math.sqrt(1 - p)), scaled(PAULI.x, Math.sqrt(p))] },
    { name: 'phase flip', run: phaseFlip, ops: (p) => [scaled(PAULI.i, Math.sqrt(1 - p)), scaled(PAULI.z, Math.sqrt(p))] },
  ];
  for (const c of cases) {
    it(`${c.name} matches Σ E ρ E† with the Nielsen & Chuang §8.3 operators`, () => {
      for (const n of [1, 2, 3]) {
        const rho = randomRho(n, rand);
        const x = rand();
        const q = Math.floor(rand() * n);
        expect(maxDiff(c.run(rho, q, x), denseKraus(rho, q, c.ops(x)))).toBeLessThan(1e-12);
      }
    });
  }

  it('applyKraus1 with a generic complex operator set matches Σ E ρ E† (Nielsen & Chuang §8.3)', () => {
    // A unitary U split as √a·U and √(1−a)·V for a second unitary V: a valid channel with complex entries.
    const a = 0.3;
    const th = 0.7;
    const u: Mat2 = [Math.cos(th), 0, 0, -Math.sin(th), 0, -Math.sin(th), Math.cos(th), 0].map((v) => v * Math.sqrt(a)) as unknown as Mat2;
    const v: Mat2 = [0, 0, 0, -1, 0, 1, 0, 0].map((x) => x * Math.sqrt(1 - a)) as unknown as Mat2;
    const toM = (k: Mat2): Matrix => mat([[[k[0], k[1]], [k[2], k[3]]], [[k[4], k[5]], [k[6], k[7]]]]);
    for (const n of [1, 3]) {
      const rho = randomRho(n, rand);
      expect(maxDiff(applyKraus1(rho, n - 1, [u, v]), denseKraus(rho, n - 1, [toM(u), toM(v)]))).toBeLessThan(1e-12);
    }
  });
});

describe('memory decay', () => {
  it('a Φ+ pair held 200 ms with T2 = 1 s has F = (1 + e^(−2t/T2))/2 (Nielsen & Chuang §8.3)', () => {
    const t = 200e6;
    const t2 = 1e9;
    let rho = wernerState(1);
    rho = memoryDecay(memoryDecay(rho, 0, t, undefined, t2), 1, t, undefined, t2);
    const want = (1 + Math.exp((-2 * t) / t2)) / 2;
    expect(want).toBeCloseTo(0.835160023, 9);
    expect(fidelityPhiPlus(rho)).toBeCloseTo(want, 12);
  });

  it('with T1 given, a |+⟩ qubit keeps coherence e^(−t/T2) and |1⟩ keeps population e^(−t/T1) (Nielsen & Chuang §8.3)', () => {
    const plus = applyGate(basisState(1), 'h', [0]);
    const one = basisState(1, [1]);
    for (const [t, t1, t2] of [[5e6, 10e6, 8e6], [1e9, 2e9, 4e9], [3e3, 1e4, 1e3], [7e6, 5e6, undefined]] as const) {
      const coh = memoryDecay(plus, 0, t, t1, t2).data;
      const wantCoh = Math.exp(-t / (t2 ?? 2 * t1)); // with T1 alone, T2 = 2·T1
      expect(Math.hypot(coh[2], coh[3])).toBeCloseTo(wantCoh / 2, 12);
      expect(memoryDecay(one, 0, t, t1, t2).data[6]).toBeCloseTo(Math.exp(-t / t1), 12);
    }
  });

  it('composes over time: two steps of t equal one step of 2t (Nielsen & Chuang §8.3)', () => {
    const rho = randomRho(2, seeded(9));
    const twice = memoryDecay(memoryDecay(rho, 1, 3e6, 9e6, 7e6), 1, 3e6, 9e6, 7e6);
    expect(maxDiff(twice, toMath(memoryDecay(rho, 1, 6e6, 9e6, 7e6)))).toBeLessThan(1e-12);
  });

  it('returns the input unchanged for dt = 0 and when no decay is configured', () => {
    const rho = randomRho(2, seeded(1));
    expect(memoryDecay(rho, 0, 0, 1e6, 1e6)).toBe(rho);
    expect(memoryDecay(rho, 0, 5e6)).toBe(rho);
  });
});
