import { describe, it, expect } from 'vitest';
import { parse } from 'yaml';
import { noiseJsonSchema, programSetJsonSchema } from '../../src/model/json-schema.js';
import { fixture } from './helpers.js';
import { validateJson } from './mini-json-schema.js';

const net = parse(fixture('swap.net.yaml')) as Record<string, unknown>;
const noise = parse(fixture('swap.noise.yaml')) as Record<string, unknown>;

describe('the mini validator itself', () => {
  it('rejects what it should, so a pass below means something', () => {
    const s = { type: 'object', properties: { a: { type: 'string', pattern: '^x' } }, required: ['a'], additionalProperties: false };
    expect(validateJson(s, { a: 'xy' })).toEqual([]);
    expect(validateJson(s, { a: 'y' })).toHaveLength(1);
    expect(validateJson(s, {})).toHaveLength(1);
    expect(validateJson(s, { a: 'x', b: 1 })).toHaveLength(1);
    expect(() => validateJson({ frobnicate: true }, 1)).toThrow(/unsupported keyword/);
  });
});

describe('programSetJsonSchema', () => {
  const schema = programSetJsonSchema();

  it('accepts the valid fixture', () => {
    expect(validateJson(schema, net)).toEqual([]);
  });

  it('rejects a wrong format tag', () => {
    expect(validateJson(schema, { ...net, format: 'bellstep/program-set@2' }).join('\n')).toContain('/format');
  });

  it('rejects a length without a unit and an unknown guard key', () => {
    const links = [{ ends: ['quay', 'mill'], length: 12, slots: 2 }];
    expect(validateJson(schema, { ...net, links }).join('\n')).toContain('/links/0/length');
    const programs = { quay: { rules: [{ name: 'r', when: [{ hvae: { partner: 'mill' } }], do: [] }] } };
    expect(validateJson(schema, { ...net, programs })).not.toEqual([]);
  });

  it('shows durations and lengths as string patterns, with descriptions for editors', () => {
    const text = JSON.stringify(schema);
    expect(text).toContain('"min_age":{"type":"string","pattern"');
    expect(text).toContain('"length":{"type":"string","pattern"');
    expect(schema.description).toContain('program set');
  });
});

describe('noiseJsonSchema', () => {
  const schema = noiseJsonSchema();

  it('accepts the valid fixture and rejects a wrong format tag', () => {
    expect(validateJson(schema, noise)).toEqual([]);
    expect(validateJson(schema, { ...noise, format: 'bellstep/program-set@1' })).not.toEqual([]);
  });

  it('rejects a seed that is not a non-negative integer and a probability above 1', () => {
    expect(validateJson(schema, { ...noise, seed: -1 })).not.toEqual([]);
    expect(validateJson(schema, { ...noise, seed: 1.5 })).not.toEqual([]);
    expect(validateJson(schema, { ...noise, defaults: { link: { success: 1.5 } } })).not.toEqual([]);
    expect(validateJson(schema, { ...noise, links: { 'mill~ridge': { attempt_period: 40 } } })).not.toEqual([]);
  });
});
