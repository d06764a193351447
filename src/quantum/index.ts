/** The density-matrix kernel: the only public surface of quantum/. */
export {
  MAX_CLUSTER_QUBITS,
  ClusterTooLargeError,
  basisState,
  clone,
  fromData,
  isHermitian,
  trace,
  type Rho,
} from './rho.js';
export type { Mat2 } from './mat2.js';
export { bellCoefficients, bellDiagonal, bitFlipState, fidelityPhiPlus, wernerState, type BellCoeffs } from './bell.js';
export { keepQubits, keepQubitsInto, partialTrace, permuteQubits, reducedPair, tensor, tensorInto } from './structure.js';
export { GATE_NAMES, applyGate, applyGateInPlace, gateKernel, isGateName, type GateName } from './gates.js';
export {
  amplitudeDamp,
  applyKraus1,
  bitFlip,
  checkDecay,
  depolarize1,
  depolarize2,
  memoryDecay,
  memoryDecayInPlace,
  phaseDamp,
  phaseFlip,
} from './channels.js';
export { measure, measureInto, probabilities, type Basis, type Measurement } from './measure.js';
export { depolarize1InPlace, depolarize2InPlace } from './channel-kernels.js';
export { BufferPool } from './pool.js';
