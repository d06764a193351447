/** JSON Schemas of the two file kinds, generated from the zod schemas that validate them, for editors. */
import { z } from 'zod';
import { noiseJson } from './schema-noise.js';
import { programJson } from './schema-program.js';

function emit(schema: z.ZodType, title: string): Record<string, unknown> {
  const out = z.toJSONSchema(schema, { target: 'draft-2020-12', unrepresentable: 'any' }) as Record<string, unknown>;
  return { ...out, title };
}

/** The JSON Schema of a program set (`*.net.yaml`). */
export function programSetJsonSchema(): Record<string, unknown> {
  return emit(programJson.programSet, 'bellstep program set');
}

/** The JSON Schema of a noise model (`*.noise.yaml`). */
export function noiseJsonSchema(): Record<string, unknown> {
  return emit(noiseJson.noise, 'bellstep noise model');
}
