/**
 * Entanglement swapping from kernel calls only: pairs (quay, mill₁) and (mill₂, fen) as
 * qubits 0..3, a Bell-state measurement on mill's halves 1 and 2, and the correction at fen.
 */
import { describe, expect, it } from 'vitest';
import {
  applyGate,
  bellCoefficients,
  bellDiagonal,
  fidelityPhiPlus,
  tensor,
  wernerState,
  type Rho,
} from '../../src/quantum/index.js';
import { branch, randomBell, seeded } from './helpers.js';

interface Outcome {
  readonly zBit: 0 | 1;
  readonly xBit: 0 | 1;
  readonly p: number;
  readonly outer: Rho;
}

/** Every outcome of the Bell-state measurement, with the corrected outer pair (quay, fen). */
function swapOutcomes(left: Rho, right: Rho): Outcome[] {
  let rho = tensor(left, right);
  // Bell-state measurement: CNOT q1→q2, H q1, then q1 gives the Z bit, q2 the X bit.
  rho = applyGate(rho, 'cnot', [1, 2]);
  rho = applyGate(rho, 'h', [1]);
  const out: Outcome[] = [];
  for (const zBit of [0, 1] as const) {
    const first = branch(rho, 1, 'z', zBit);
    if (!first) continue;
    for (const xBit of [0, 1] as const) {
      const second = branch(first.rho, 1, 'z', xBit); // old q2 is now qubit 1
      if (!second) continue;
      // Correction table of Bennett et al., PRL 70, 1895 (1993): X if the X bit is 1, then Z if the Z bit is 1.
      let outer = second.rho;
      if (xBit) outer = applyGate(outer, 'x', [1]);
      if (zBit) outer = applyGate(outer, 'z', [1]);
      out.push({ zBit, xBit, p: first.p * second.p, outer });
    }
  }
  return out;
}

describe('entanglement swapping', () => {
  it('turns two perfect pairs into exactly Φ+ for every outcome (Bennett et al., PRL 70, 1895 (1993))', () => {
    const outcomes = swapOutcomes(wernerState(1), wernerState(1));
    expect(outcomes).toHaveLength(4);
    for (const o of outcomes) {
      expect(o.p).toBeCloseTo(0.25, 12);
      const bell = bellCoefficients(o.outer);
      expect(bell[0]).toBeCloseTo(1, 12);
      expect(bell[1] + bell[2] + bell[3]).toBeCloseTo(0, 12);
    }
  });

  // Dür, Briegel, Cirac, Zoller, PRA 59, 169 (1999): F = F1·F2 + (1−F1)(1−F2)/3.
  const dur = (f1: number, f2: number): number => f1 * f2 + ((1 - f1) * (1 - f2)) / 3;

  it.each([
    [0.9, 0.85, 0.77],
    [0.97, 0.97, 0.9412],
  ])('Werner %s and %s give %s on every outcome (Dür et al., PRA 59, 169 (1999))', (f1, f2, want) => {
    const outcomes = swapOutcomes(wernerState(f1), wernerState(f2));
    expect(outcomes).toHaveLength(4);
    expect(outcomes.reduce((s, o) => s + o.p, 0)).toBeCloseTo(1, 12);
    for (const o of outcomes) expect(fidelityPhiPlus(o.outer)).toBeCloseTo(want, 10);
  });

  it('follows the Werner swapping formula over a grid of inputs (Dür et al., PRA 59, 169 (1999))', () => {
    for (const f1 of [0.5, 0.7, 0.8, 0.93, 1])
      for (const f2 of [0.6, 0.75, 0.9, 0.99]) {
        for (const o of swapOutcomes(wernerState(f1), wernerState(f2))) {
          expect(fidelityPhiPlus(o.outer)).toBeCloseTo(dur(f1, f2), 10);
        }
      }
  });

  it('composes Bell-diagonal errors as Pauli products on random inputs (common practice)', () => {
    // Each Bell state is a Pauli on one half of Φ+ (Φ− ↔ Z, Ψ+ ↔ X, Ψ− ↔ XZ); swapping with
    // correction multiplies the Paulis, so the outer coefficients are the group convolution.
    const rand = seeded(1895);
    const pauli = [0b00, 0b01, 0b10, 0b11]; // (x bit, z bit) per Bell index [Φ+, Φ−, Ψ+, Ψ−]
    for (let k = 0; k < 10; k++) {
      const a = randomBell(rand);
      const b = randomBell(rand);
      const want = [0, 0, 0, 0];
      for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) want[pauli.indexOf(pauli[i] ^ pauli[j])] += a[i] * b[j];
      for (const o of swapOutcomes(bellDiagonal(a), bellDiagonal(b))) {
        bellCoefficients(o.outer).forEach((v, i) => expect(v).toBeCloseTo(want[i], 10));
      }
    }
  });
});
