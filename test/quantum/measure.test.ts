/** Projective measurement against dense projectors built with mathjs (Nielsen & Chuang §2.2.5). */
import * as math from 'mathjs';
import type { Complex, Matrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  applyGate,
  basisState,
  measure,
  probabilities,
  wernerState,
  type Basis,
  type Rho,
} from '../../src/quantum/index.js';
import { maxDiff, randomRho, seeded, toMath } from './helpers.js';

const R = Math.SQRT1_2;
/** Outcome-0 and outcome-1 vectors of each basis, written out from their definitions. */
const VECTORS: Record<Basis, [Complex[], Complex[]]> = {
  z: [[math.complex(1, 0), math.complex(0, 0)], [math.complex(0, 0), math.complex(1, 0)]],
  x: [[math.complex(R, 0), math.complex(R, 0)], [math.complex(R, 0), math.complex(-R, 0)]],
  y: [[math.complex(R, 0), math.complex(0, R)], [math.complex(R, 0), math.complex(0, -R)]],
};

/** B = I ⊗ ⟨v|_q ⊗ I as a dense 2^(n−1) × 2^n matrix. */
function braAt(n: number, q: number, v: Complex[]): Matrix {
  let m: Matrix = math.matrix([[math.complex(1, 0)]]);
  for (let k = 0; k < n; k++) m = math.kron(m, k === q ? math.matrix([v.map((z) => math.conj(z))]) : (math.identity(2) as Matrix));
  return m;
}

/** Unnormalised conditional state B ρ B† for outcome `bit`. */
function branchDense(rho: Rho, q: number, basis: Basis, bit: 0 | 1): Matrix {
  const b = braAt(rho.n, q, VECTORS[basis][bit]);
  return math.multiply(math.multiply(b, toMath(rho)), math.ctranspose(b)) as Matrix;
}

const realTrace = (m: Matrix): number => math.complex(math.trace(m) as unknown as Complex).re;
const BASES: readonly Basis[] = ['z', 'x', 'y'];

describe('probabilities and post-measurement states', () => {
  const rand = seeded(225);
  it('match Tr(B ρ B†) and B ρ B†/p on random states in every basis (Nielsen & Chuang §2.2.5)', () => {
    for (const n of [1, 2, 3]) {
      const rho = randomRho(n, rand);
      for (let q = 0; q < n; q++)
        for (const basis of BASES) {
          const dense = [branchDense(rho, q, basis, 0), branchDense(rho, q, basis, 1)];
          const [p0, p1] = probabilities(rho, q, basis);
          expect(p0).toBeCloseTo(realTrace(dense[0]), 12);
          expect(p1).toBeCloseTo(realTrace(dense[1]), 12);
          const zero = measure(rho, q, basis, p0 * 0.999);
          const one = measure(rho, q, basis, Math.min(p0 * 1.001 + 1e-9, 1 - 1e-12));
          expect([zero.bit, one.bit]).toEqual([0, 1]);
          expect(zero.p0).toBeCloseTo(p0, 12);
          if (n > 1) {
            expect(maxDiff(zero.rho, math.multiply(dense[0], 1 / p0) as Matrix)).toBeLessThan(1e-11);
            expect(maxDiff(one.rho, math.multiply(dense[1], 1 / p1) as Matrix)).toBeLessThan(1e-11);
          }
        }
    }
  });

  it('with a readout flip f, reports p0 = (1−f)p0 + f·p1 and conditions on the reported bit (common practice)', () => {
    for (const basis of BASES) {
      const rho = randomRho(3, rand);
      const f = 0.13;
      const dense = [branchDense(rho, 1, basis, 0), branchDense(rho, 1, basis, 1)];
      const [p0, p1] = probabilities(rho, 1, basis);
      const reported0 = (1 - f) * p0 + f * p1;
      const m0 = measure(rho, 1, basis, 0, f);
      expect(m0.p0).toBeCloseTo(reported0, 12);
      const want0 = math.multiply(math.add(math.multiply(dense[0], 1 - f), math.multiply(dense[1], f)), 1 / reported0) as Matrix;
      expect(maxDiff(m0.rho, want0)).toBeLessThan(1e-11);
      const m1 = measure(rho, 1, basis, 1 - 1e-12, f);
      const want1 = math.multiply(math.add(math.multiply(dense[1], 1 - f), math.multiply(dense[0], f)), 1 / (1 - reported0)) as Matrix;
      expect(m1.bit).toBe(1);
      expect(maxDiff(m1.rho, want1)).toBeLessThan(1e-11);
    }
  });
});

describe('measurement details', () => {
  it('outcome 0 is |0⟩, |+⟩ and |+i⟩ in the z, x and y bases', () => {
    const zero = basisState(1);
    const plus = applyGate(zero, 'h', [0]);
    const plusI = applyGate(plus, 's', [0]);
    expect(probabilities(zero, 0, 'z')[0]).toBeCloseTo(1, 14);
    expect(probabilities(plus, 0, 'x')[0]).toBeCloseTo(1, 14);
    expect(probabilities(plusI, 0, 'y')[0]).toBeCloseTo(1, 14);
    expect(probabilities(plusI, 0, 'x')[0]).toBeCloseTo(0.5, 14);
  });

  it('Φ+ outcomes agree in Z and X and disagree in Y (common practice: ZZ = XX = +1, YY = −1)', () => {
    for (const [basis, same] of [['z', true], ['x', true], ['y', false]] as const) {
      for (const u of [0.2, 0.7]) {
        const first = measure(wernerState(1), 0, basis, u);
        const [q0] = probabilities(first.rho, 0, basis);
        expect(first.p0).toBeCloseTo(0.5, 14);
        expect(q0).toBeCloseTo((first.bit === 0) === same ? 1 : 0, 12);
      }
    }
  });

  it('never divides by zero: a certain outcome is taken whatever u says', () => {
    const one = measure(basisState(2, [1, 0]), 0, 'z', 0);
    expect(one.bit).toBe(1);
    expect(one.p0).toBe(0);
    expect(Array.from(one.rho.data).every(Number.isFinite)).toBe(true);
    const zero = measure(basisState(2), 1, 'z', 1 - 1e-16);
    expect(zero.bit).toBe(0);
    expect(zero.rho.data[0]).toBeCloseTo(1, 14);
  });

  it('a one-qubit state leaves the 0-qubit state [1, 0]', () => {
    const m = measure(applyGate(basisState(1), 'h', [0]), 0, 'x', 0.5);
    expect(m.rho.n).toBe(0);
    expect(Array.from(m.rho.data)).toEqual([1, 0]);
  });

  it('does not mutate its input', () => {
    const rho = randomRho(2, seeded(3));
    const before = rho.data.slice();
    measure(rho, 0, 'y', 0.4, 0.1);
    expect(rho.data).toEqual(before);
  });
});
