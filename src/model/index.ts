/** The file model: loading and validating program sets and noise models, units, JSON Schemas and lint. */
export type * from './types.js';
export { GATE_OPS, TWO_QUBIT_OPS, ANGLE_OPS } from './types.js';
export { InputError, InputErrors, type InputErrorCode, type InputErrorInit } from './errors.js';
export { parseDuration, parseLength, parseSpeed, parseLoss, formatDuration } from './units.js';
export { loadProgramSet, linkId } from './load-program.js';
export { loadNoiseModel, idealNoise, linkNoiseFor, nodeNoiseFor, FIBER_SPEED_M_PER_S } from './load-noise.js';
export { crossCheck } from './cross-check.js';
export { loadInputs, type InputFiles } from './load-inputs.js';
export { staticNode, literalValue, offsetPos, exprPos, PROGRAM_FUNCTIONS, DEBUGGER_FUNCTIONS } from './expressions.js';
export { MESSAGE_FIELDS, PAIR_FIELDS } from './build-steps.js';
export { programSetJsonSchema, noiseJsonSchema } from './json-schema.js';
export { lint, findingRule, type Finding } from './lint.js';
export { PROGRAM_SET_FORMAT } from './schema-program.js';
export { NOISE_FORMAT } from './schema-noise.js';
export { editDistance, closest, didYouMean } from './suggest.js';
export { plural, article } from './words.js';
export { FINDING_CODES, type FindingCode } from './lint-codes.js';
