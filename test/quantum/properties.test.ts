/**
 * Property tests: any sequence of gates, channels, merges and measurements keeps ρ a density
 * matrix (trace 1, Hermitian, eigenvalues ≥ 0) and never touches its inputs (common practice).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  amplitudeDamp,
  applyGate,
  bitFlip,
  depolarize1,
  depolarize2,
  GATE_NAMES,
  isHermitian,
  measure,
  memoryDecay,
  phaseDamp,
  phaseFlip,
  tensor,
  trace,
  type Basis,
  type Rho,
} from '../../src/quantum/index.js';
import { minEigenvalue, randomRho, seeded } from './helpers.js';

/** An operation with qubit choices as fractions, resolved against the current size. */
type Op =
  | { kind: 'gate'; gate: (typeof GATE_NAMES)[number]; a: number; b: number; angle: number }
  | { kind: 'channel'; which: number; a: number; b: number; p: number }
  | { kind: 'measure'; a: number; basis: Basis; u: number; flip: number }
  | { kind: 'merge'; seed: number };

const frac = fc.double({ min: 0, max: 1, maxExcluded: true, noNaN: true });
const opArb: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ kind: fc.constant('gate' as const), gate: fc.constantFrom(...GATE_NAMES), a: frac, b: frac, angle: fc.double({ min: -7, max: 7, noNaN: true }) }),
  fc.record({ kind: fc.constant('channel' as const), which: fc.integer({ min: 0, max: 6 }), a: frac, b: frac, p: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({ kind: fc.constant('measure' as const), a: frac, basis: fc.constantFrom<Basis>('z', 'x', 'y'), u: frac, flip: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({ kind: fc.constant('merge' as const), seed: fc.integer() }),
);

function pickTwo(n: number, a: number, b: number): [number, number] {
  const x = Math.floor(a * n);
  let y = Math.floor(b * (n - 1));
  if (y >= x) y++;
  return [x, y];
}

function apply(rho: Rho, op: Op): Rho {
  const n = rho.n;
  switch (op.kind) {
    case 'gate': {
      const two = op.gate === 'cnot' || op.gate === 'cz' || op.gate === 'swap';
      if (two && n < 2) return rho;
      return applyGate(rho, op.gate, two ? pickTwo(n, op.a, op.b) : [Math.floor(op.a * n)], op.angle);
    }
    case 'channel': {
      const q = Math.floor(op.a * n);
      switch (op.which) {
        case 0: return depolarize1(rho, q, op.p);
        case 1: return n < 2 ? rho : depolarize2(rho, ...pickTwo(n, op.a, op.b), op.p);
        case 2: return amplitudeDamp(rho, q, op.p);
        case 3: return phaseDamp(rho, q, op.p);
        case 4: return bitFlip(rho, q, op.p);
        case 5: return phaseFlip(rho, q, op.p);
        default: return memoryDecay(rho, q, op.p * 1e7, 5e6, 4e6);
      }
    }
    case 'measure':
      return n < 2 ? rho : measure(rho, Math.floor(op.a * n), op.basis, op.u, op.flip).rho;
    case 'merge':
      return n >= 4 ? rho : tensor(rho, randomRho(1, seeded(op.seed)));
  }
}

describe('density-matrix invariants', () => {
  it('trace 1, Hermitian and positive after any sequence of operations on 1–4 qubits', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4 }), fc.integer(), fc.integer({ min: 1, max: 4 }), fc.array(opArb, { maxLength: 10 }), (n, seed, rank, ops) => {
        let rho = randomRho(n, seeded(seed), Math.min(rank, 1 << n));
        for (const op of ops) {
          const before = rho.data.slice();
          const next = apply(rho, op);
          expect(rho.data).toEqual(before);
          rho = next;
          expect(Math.abs(trace(rho) - 1)).toBeLessThan(1e-9);
          expect(isHermitian(rho, 1e-9)).toBe(true);
        }
        expect(minEigenvalue(rho)).toBeGreaterThanOrEqual(-1e-9);
      }),
      { numRuns: 150, seed: 20261201 },
    );
  });

  it('measurement probabilities are in [0, 1] and sum to 1 on pure states (rank 1)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4 }), fc.integer(), frac, fc.constantFrom<Basis>('z', 'x', 'y'), (n, seed, a, basis) => {
        const rho = randomRho(n, seeded(seed), 1);
        const m = measure(rho, Math.floor(a * n), basis, 0.5);
        expect(m.p0).toBeGreaterThanOrEqual(0);
        expect(m.p0).toBeLessThanOrEqual(1);
        expect(Math.abs(trace(m.rho) - 1)).toBeLessThan(1e-9);
      }),
      { numRuns: 100, seed: 7 },
    );
  });
});
