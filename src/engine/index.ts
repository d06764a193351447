/** The network engine: the only public surface of engine/. */
export { Engine, applyNext, hasNext, initialWorld, peekNextTime, quiescence, type AdvanceHooks, type AdvanceOptions, type AdvanceResult } from './step.js';
export { Net, derivedSuccess, type LinkInfo } from './net.js';
export { ProgramError } from './errors.js';
export { PhysicsTrace, recordPhysics, replayPhysics } from './physics-trace.js';
export { joinIds, linkPairId, parsePairId, shortPairId } from './ids.js';
export { explainNode, explainRule, guardText, stallReport, type GuardStatus, type RuleExplanation, type StallEntry } from './explain.js';
export { farHalf, twoQubitState, viewPair, type PairView } from './pair-state.js';
export { joinFunction, programFunctions, pairValue, messageValue } from './scope.js';
export { RULE_LOOP_LIMIT } from './scan.js';
export { seedRng, drawUniform, geometricAttempts, mixSeed, SEED_WARMUP } from './rng.js';
export type * from './types.js';
export { addDelivery, deliveredCount, deliveredWith, deliveries, eachDelivery, findDelivery, recentDeliveries, DeliveryLog, type DeliveredView } from './delivered.js';
