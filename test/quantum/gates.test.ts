/** Gates against dense U ρ U† built with mathjs kron from textbook matrices (Nielsen & Chuang §4.2). */
import { describe, expect, it } from 'vitest';
import {
  applyGate,
  basisState,
  bellCoefficients,
  GATE_NAMES,
  probabilities,
  tensor,
  type GateName,
} from '../../src/quantum/index.js';
import { conjugate, denseGate, maxDiff, randomRho, seeded, toMath } from './helpers.js';

const TWO: readonly GateName[] = ['cnot', 'cz', 'swap'];

describe('applyGate against mathjs', () => {
  const rand = seeded(42);
  for (const gate of GATE_NAMES) {
    it(`${gate} equals dense U ρ U† on random states of 1–4 qubits (Nielsen & Chuang §4.2)`, () => {
      for (const n of [1, 2, 3, 4]) {
        if (TWO.includes(gate) && n < 2) continue;
        for (let trial = 0; trial < 3; trial++) {
          const rho = randomRho(n, rand);
          const a = Math.floor(rand() * n);
          let b = Math.floor(rand() * (n - 1));
          if (b >= a) b++;
          const qubits = TWO.includes(gate) ? [a, b] : [a];
          const theta = (rand() - 0.5) * 4 * Math.PI;
          const got = applyGate(rho, gate, qubits, theta);
          const want = conjugate(denseGate(n, gate, qubits, theta), toMath(rho));
          expect(maxDiff(got, want)).toBeLessThan(1e-12);
        }
      }
    });
  }
});

describe('gate actions (Nielsen & Chuang §4.2)', () => {
  it('H then CNOT on |00⟩ gives Φ+, and the four inputs give the four Bell states', () => {
    // Nielsen & Chuang §1.3.6: CNOT·(H⊗I)|xy⟩ is the Bell state β_xy.
    const want: Record<string, [number, number, number, number]> = {
      '00': [1, 0, 0, 0], // Φ+
      '01': [0, 0, 1, 0], // Ψ+
      '10': [0, 1, 0, 0], // Φ−
      '11': [0, 0, 0, 1], // Ψ−
    };
    for (const [bits, coeffs] of Object.entries(want)) {
      let rho = basisState(2, [Number(bits[0]) as 0 | 1, Number(bits[1]) as 0 | 1]);
      rho = applyGate(applyGate(rho, 'h', [0]), 'cnot', [0, 1]);
      bellCoefficients(rho).forEach((v, i) => expect(v).toBeCloseTo(coeffs[i], 12));
    }
  });

  it('qubit 0 is the most significant bit: X on qubit 0 of |00⟩ gives index 0b10', () => {
    const rho = applyGate(basisState(2), 'x', [0]);
    expect(rho.data[2 * (2 * 4 + 2)]).toBe(1);
  });

  it('rx(π) acts as X and ry(π/2) takes |0⟩ to |+⟩', () => {
    expect(probabilities(applyGate(basisState(1), 'rx', [0], Math.PI), 0, 'z')[1]).toBeCloseTo(1, 12);
    expect(probabilities(applyGate(basisState(1), 'ry', [0], Math.PI / 2), 0, 'x')[0]).toBeCloseTo(1, 12);
  });

  it('cnot with a later control flips the earlier target', () => {
    const rho = applyGate(tensor(basisState(1), basisState(1, [1])), 'cnot', [1, 0]);
    expect(probabilities(rho, 0, 'z')[1]).toBeCloseTo(1, 12);
  });

  it('never mutates its input', () => {
    const rho = randomRho(3, seeded(5));
    const before = rho.data.slice();
    for (const gate of GATE_NAMES) applyGate(rho, gate, TWO.includes(gate) ? [2, 0] : [1], 0.3);
    expect(rho.data).toEqual(before);
  });
});
