/**
 * Recurrence purification built from kernel calls only: two pairs tensored into 4 qubits
 * (A1, B1, A2, B2), bilateral CNOT, both ends measure pair 2 in Z, keep pair 1 on agreement.
 * Outcomes are enumerated, not sampled.
 */
import { describe, expect, it } from 'vitest';
import {
  applyGate,
  bellCoefficients,
  bellDiagonal,
  bitFlipState,
  tensor,
  wernerState,
  type Rho,
} from '../../src/quantum/index.js';
import { branch, randomBell, seeded } from './helpers.js';

type Bell = [number, number, number, number];

/** Runs the recurrence round on two copies of a pair; returns p_success and the kept pair's Bell coefficients. */
function purify(pair: Rho, rotate = false): { p: number; bell: Bell } {
  let rho = tensor(pair, pair); // qubits: 0 = A1, 1 = B1, 2 = A2, 3 = B2
  if (rotate) {
    for (const q of [0, 2]) rho = applyGate(rho, 'rx', [q], Math.PI / 2);
    for (const q of [1, 3]) rho = applyGate(rho, 'rx', [q], -Math.PI / 2);
  }
  rho = applyGate(rho, 'cnot', [0, 2]);
  rho = applyGate(rho, 'cnot', [1, 3]);
  let p = 0;
  const acc: Bell = [0, 0, 0, 0];
  for (const bit of [0, 1] as const) {
    const first = branch(rho, 2, 'z', bit); // A2
    if (!first) continue;
    const second = branch(first.rho, 2, 'z', bit); // B2 is qubit 2 once A2 is gone
    if (!second) continue;
    const weight = first.p * second.p;
    p += weight;
    bellCoefficients(second.rho).forEach((v, i) => (acc[i] += weight * v));
  }
  return { p, bell: acc.map((v) => v / p) as Bell };
}

describe('bit-flip purification', () => {
  // Check values: docs/physics.md, common practice (p = F² + (1−F)², F′ = F²/p).
  it.each([
    [0.8, 0.68, 0.941176470588],
    [0.7, 0.58, 0.844827586207],
  ])('F=%s gives p=%s and F′=%s (common practice)', (f, p, fOut) => {
    const r = purify(bitFlipState(f));
    expect(r.p).toBeCloseTo(p, 10);
    expect(r.bell[0]).toBeCloseTo(fOut, 10);
  });

  it('follows p = F² + (1−F)², F′ = F²/p for many F (common practice)', () => {
    for (let f = 0.5; f <= 1.0001; f += 0.05) {
      const ff = Math.min(f, 1);
      const r = purify(bitFlipState(ff));
      const p = ff * ff + (1 - ff) * (1 - ff);
      expect(r.p).toBeCloseTo(p, 10);
      expect(r.bell[0]).toBeCloseTo((ff * ff) / p, 10);
    }
  });
});

describe('BBPSSW with Werner inputs', () => {
  // Bennett et al., PRL 76, 722 (1996): p = F² + 2F(1−F)/3 + 5(1−F)²/9, F′ = (F² + (1−F)²/9)/p.
  const formula = (f: number): { p: number; f: number } => {
    const p = f * f + (2 * f * (1 - f)) / 3 + (5 * (1 - f) ** 2) / 9;
    return { p, f: (f * f + (1 - f) ** 2 / 9) / p };
  };

  it.each([
    [0.75, 0.722222222222, 0.788461538462],
    [0.9, 0.875555555556, 0.926395939086],
  ])('F=%s gives p=%s and F′=%s (Bennett et al., PRL 76, 722 (1996))', (f, p, fOut) => {
    const r = purify(wernerState(f));
    expect(r.p).toBeCloseTo(p, 10);
    expect(r.bell[0]).toBeCloseTo(fOut, 10);
  });

  it('matches the published formula over a range of F (Bennett et al., PRL 76, 722 (1996))', () => {
    for (const f of [0.3, 0.5, 0.55, 0.6, 0.66, 0.8, 0.85, 0.95, 0.99, 1]) {
      const r = purify(wernerState(f));
      const want = formula(f);
      expect(r.p).toBeCloseTo(want.p, 10);
      expect(r.bell[0]).toBeCloseTo(want.f, 10);
    }
  });
});

describe('DEJMPS', () => {
  // Deutsch et al., PRL 77, 2818 (1996), in the paper's order A=Φ+, B=Ψ−, C=Ψ+, D=Φ−:
  // N = (A+B)² + (C+D)², A′=(A²+B²)/N, B′=2CD/N, C′=(C²+D²)/N, D′=2AB/N.
  const formula = ([phiP, phiM, psiP, psiM]: Bell): { p: number; bell: Bell } => {
    const [A, B, C, D] = [phiP, psiM, psiP, phiM];
    const N = (A + B) ** 2 + (C + D) ** 2;
    const [A2, B2, C2, D2] = [(A * A + B * B) / N, (2 * C * D) / N, (C * C + D * D) / N, (2 * A * B) / N];
    return { p: N, bell: [A2, D2, C2, B2] }; // back to [Φ+, Φ−, Ψ+, Ψ−]
  };

  it('turns [0.7, 0.1, 0.15, 0.05] into [0.788, 0.112, 0.052, 0.048] with p = 0.625 (Deutsch et al., PRL 77, 2818 (1996))', () => {
    const r = purify(bellDiagonal([0.7, 0.1, 0.15, 0.05]), true);
    expect(r.p).toBeCloseTo(0.625, 10);
    [0.788, 0.112, 0.052, 0.048].forEach((v, i) => expect(r.bell[i]).toBeCloseTo(v, 10));
  });

  it('matches the published map on random Bell-diagonal inputs (Deutsch et al., PRL 77, 2818 (1996))', () => {
    const rand = seeded(77);
    for (let k = 0; k < 25; k++) {
      const input = randomBell(rand);
      const r = purify(bellDiagonal(input), true);
      const want = formula(input);
      expect(r.p).toBeCloseTo(want.p, 10);
      want.bell.forEach((v, i) => expect(r.bell[i]).toBeCloseTo(v, 10));
    }
  });
});
