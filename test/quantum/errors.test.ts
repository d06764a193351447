/** Misuse is reported with a clear message rather than a wrong matrix. */
import { describe, expect, it } from 'vitest';
import {
  applyGate,
  applyKraus1,
  basisState,
  bellCoefficients,
  bellDiagonal,
  ClusterTooLargeError,
  depolarize1,
  depolarize2,
  MAX_CLUSTER_QUBITS,
  measure,
  memoryDecay,
  partialTrace,
  permuteQubits,
  reducedPair,
  tensor,
  type GateName,
  type Mat2,
} from '../../src/quantum/index.js';

describe('cluster cap', () => {
  it('tensor to 11 qubits throws ClusterTooLargeError naming the size and the cap', () => {
    expect(MAX_CLUSTER_QUBITS).toBe(10);
    const five = basisState(5);
    const six = basisState(6);
    let caught: unknown;
    try {
      tensor(five, six);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ClusterTooLargeError);
    const err = caught as ClusterTooLargeError;
    expect(err.qubits).toBe(11);
    expect(err.cap).toBe(10);
    expect(err.code).toBe('cluster-too-large');
    expect(err.message).toMatch(/11 qubits/);
    expect(err.message).toMatch(/cap of 10/);
    expect(err.message).toMatch(/raised/);
  });

  it('a raised cap lets the merge through, and a lowered one blocks smaller merges', () => {
    expect(tensor(basisState(5), basisState(6), 11).n).toBe(11);
    expect(() => tensor(basisState(2), basisState(2), 3)).toThrow(ClusterTooLargeError);
  });
});

describe('bad qubit indices and arguments', () => {
  const rho = basisState(2);
  it.each([
    ['x', [2]],
    ['h', [-1]],
    ['z', [0.5]],
    ['cnot', [0, 0]],
    ['cnot', [0, 3]],
  ] as [GateName, number[]][])('%s on %j throws', (gate, qubits) => {
    expect(() => applyGate(rho, gate, qubits)).toThrow(/qubit|distinct/);
  });

  it('wrong arity, unknown gate and missing angle throw', () => {
    expect(() => applyGate(rho, 'cnot', [0])).toThrow(/2 qubits/);
    expect(() => applyGate(rho, 'h', [0, 1])).toThrow(/1 qubit/);
    expect(() => applyGate(rho, 'rx', [0])).toThrow(/angle/);
    expect(() => applyGate(rho, 'rz', [0], Number.NaN)).toThrow(/angle/);
    expect(() => applyGate(rho, 'toffoli' as GateName, [0])).toThrow(/unknown gate/);
  });

  it('channels, measurement and reductions check their qubits and probabilities', () => {
    expect(() => depolarize1(rho, 2, 0.1)).toThrow(/out of range/);
    expect(() => depolarize1(rho, 0, 1.5)).toThrow(/probability/);
    expect(() => depolarize2(rho, 1, 1, 0.1)).toThrow(/distinct/);
    expect(() => measure(rho, 5, 'z', 0.1)).toThrow(/out of range/);
    expect(() => measure(rho, 0, 'z', 1)).toThrow(/\[0, 1\)/);
    expect(() => measure(rho, 0, 'w' as 'z', 0.1)).toThrow(/basis/);
    expect(() => partialTrace(rho, 2)).toThrow(/out of range/);
    expect(() => permuteQubits(rho, [0, 0])).toThrow(/distinct/);
    expect(() => permuteQubits(rho, [0])).toThrow(/all 2 qubits/);
    expect(() => reducedPair(basisState(3), 0, 3)).toThrow(/out of range/);
    expect(() => bellCoefficients(basisState(3))).toThrow(/2-qubit/);
    expect(() => bellDiagonal([0.5, 0.5, 0.5, -0.5])).toThrow(/≥ 0/);
    expect(() => bellDiagonal([0.5, 0.2, 0.2, 0.2])).toThrow(/sum to 1/);
  });

  it('applyKraus1 rejects operator sets that are not trace-preserving', () => {
    const half: Mat2 = [Math.SQRT1_2, 0, 0, 0, 0, 0, Math.SQRT1_2, 0];
    expect(() => applyKraus1(basisState(1), 0, [half])).toThrow(/trace-preserving/);
    expect(() => applyKraus1(basisState(1), 0, [])).toThrow(/at least one/);
    expect(applyKraus1(basisState(1), 0, [half, half]).data[0]).toBeCloseTo(1, 14);
  });
});

describe('memory decay parameters', () => {
  const rho = basisState(1);
  it('throws when T2 > 2·T1 (Nielsen & Chuang §8.3)', () => {
    expect(() => memoryDecay(rho, 0, 10, 100, 201)).toThrow(/2·T1/);
    expect(memoryDecay(rho, 0, 10, 100, 200).n).toBe(1);
  });
  it('throws on negative time or non-positive T1/T2', () => {
    expect(() => memoryDecay(rho, 0, -1, 100, 100)).toThrow(/≥ 0/);
    expect(() => memoryDecay(rho, 0, 1, 0)).toThrow(/T1/);
    expect(() => memoryDecay(rho, 0, 1, undefined, -5)).toThrow(/T2/);
  });
});
