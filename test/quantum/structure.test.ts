/** Tensor products, partial traces and reorderings against mathjs. */
import * as math from 'mathjs';
import type { Matrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  basisState,
  clone,
  isHermitian,
  keepQubits,
  partialTrace,
  permuteQubits,
  reducedPair,
  tensor,
  trace,
  wernerState,
  type Rho,
} from '../../src/quantum/index.js';
import { kronAt, maxDiff, P0, P1, randomRho, seeded, toMath } from './helpers.js';

/** Tr_q ρ = Σ_k (⟨k|_q) ρ (|k⟩_q), with the bra/ket Kron-expanded as 2^(n−1) × 2^n matrices. */
function densePartialTrace(rho: Rho, q: number): Matrix {
  const m = toMath(rho);
  let out: Matrix | undefined;
  for (const ket of [[1, 0], [0, 1]]) {
    let bra: Matrix = math.matrix([[math.complex(1, 0)]]);
    for (let k = 0; k < rho.n; k++) {
      const f = k === q ? math.matrix([ket.map((v) => math.complex(v, 0))]) : math.identity(2);
      bra = math.kron(bra, f as Matrix);
    }
    const term = math.multiply(math.multiply(bra, m), math.transpose(bra)) as Matrix;
    out = out ? math.add(out, term) : term;
  }
  return out as Matrix;
}

describe('tensor', () => {
  it('equals mathjs kron on random states (common practice)', () => {
    const rand = seeded(11);
    for (const [na, nb] of [[1, 1], [1, 2], [2, 2], [3, 1], [0, 2]]) {
      const a = randomRho(na, rand);
      const b = randomRho(nb, rand);
      const t = tensor(a, b);
      expect(t.n).toBe(na + nb);
      expect(maxDiff(t, math.kron(toMath(a), toMath(b)))).toBeLessThan(1e-14);
    }
  });
});

describe('partial trace', () => {
  it('equals the dense Σ_k ⟨k|ρ|k⟩ on random states, for every qubit (common practice)', () => {
    const rand = seeded(12);
    for (const n of [1, 2, 3, 4]) {
      const rho = randomRho(n, rand);
      for (let q = 0; q < n; q++) expect(maxDiff(partialTrace(rho, q), densePartialTrace(rho, q))).toBeLessThan(1e-14);
    }
  });

  it('undoes tensor: Tr_b(a ⊗ b) = a', () => {
    const rand = seeded(13);
    const a = randomRho(2, rand);
    const b = randomRho(1, rand);
    expect(maxDiff(partialTrace(tensor(a, b), 2), toMath(a))).toBeLessThan(1e-14);
    expect(maxDiff(partialTrace(tensor(b, a), 0), toMath(a))).toBeLessThan(1e-14);
  });

  it('leaves a maximally mixed qubit from half of Φ+', () => {
    const half = partialTrace(wernerState(1), 1);
    expect(Array.from(half.data)).toEqual([0.5, 0, 0, 0, 0, 0, 0.5, 0]);
  });
});

describe('permuteQubits and reducedPair', () => {
  it('moves product factors: new qubit i is old qubit order[i]', () => {
    const rand = seeded(14);
    const f = [randomRho(1, rand), randomRho(1, rand), randomRho(1, rand)];
    const rho = tensor(tensor(f[0], f[1]), f[2]);
    const order = [2, 0, 1];
    const want = tensor(tensor(f[2], f[0]), f[1]);
    expect(maxDiff(permuteQubits(rho, order), toMath(want))).toBeLessThan(1e-14);
  });

  it('matches conjugation by the dense SWAP for a two-qubit exchange', () => {
    const rho = randomRho(2, seeded(15));
    const swap = math.add(
      math.add(kronAt(2, new Map([[0, P0], [1, P0]])), kronAt(2, new Map([[0, P1], [1, P1]]))),
      math.add(
        math.kron(math.matrix([[0, 1], [0, 0]]), math.matrix([[0, 0], [1, 0]])),
        math.kron(math.matrix([[0, 0], [1, 0]]), math.matrix([[0, 1], [0, 0]])),
      ),
    );
    const want = math.multiply(math.multiply(swap, toMath(rho)), swap) as Matrix;
    expect(maxDiff(permuteQubits(rho, [1, 0]), want)).toBeLessThan(1e-14);
  });

  it('reducedPair(qa, qb) traces the rest and keeps the order (qa, qb)', () => {
    const rand = seeded(16);
    const rho = randomRho(4, rand);
    const direct = partialTrace(partialTrace(rho, 3), 1); // keeps 0 and 2
    expect(maxDiff(reducedPair(rho, 0, 2), toMath(direct))).toBeLessThan(1e-14);
    expect(maxDiff(reducedPair(rho, 2, 0), toMath(permuteQubits(direct, [1, 0])))).toBeLessThan(1e-14);
    expect(keepQubits(rho, []).data[0]).toBeCloseTo(1, 14);
  });
});

describe('trace, clone, isHermitian', () => {
  it('trace agrees with mathjs trace', () => {
    const rho = randomRho(3, seeded(17));
    const scaled = { n: 3, data: rho.data.map((v) => v * 2.5) };
    expect(trace(scaled)).toBeCloseTo(math.complex(math.trace(toMath(scaled)) as never).re, 12);
  });

  it('clone copies and isHermitian spots a broken matrix', () => {
    const rho = basisState(2, [0, 1]);
    const c = clone(rho);
    expect(c.data).not.toBe(rho.data);
    expect(isHermitian(c)).toBe(true);
    c.data[3] = 0.1; // imaginary part of (0,1) without its conjugate at (1,0)
    expect(isHermitian(c)).toBe(false);
    expect(isHermitian(rho)).toBe(true);
  });
});
