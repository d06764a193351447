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
export { keepQubits, partialTrace, permuteQubits, reducedPair, tensor } from './structure.js';
export { GATE_NAMES, applyGate, isGateName, type GateName } from './gates.js';
export {
  amplitudeDamp,
  applyKraus1,
  bitFlip,
  depolarize1,
  depolarize2,
  memoryDecay,
  phaseDamp,
  phaseFlip,
} from './channels.js';
export { measure, probabilities, type Basis, type Measurement } from './measure.js';
