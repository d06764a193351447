import { describe, it, expect } from 'vitest';
import { parse } from 'yaml';
import { noiseJsonSchema, programSetJsonSchema } from '../../src/model/json-schema.js';
import { runCli } from '../helpers/run-cli.js';
import { fixture } from '../model/helpers.js';
import { validateJson } from '../model/mini-json-schema.js';

describe('bellstep schema', () => {
  it('prints the program-set schema as JSON, exit 0', async () => {
    const r = await runCli(['schema', 'program-set']);
    expect(r.code).toBe(0);
    const schema = JSON.parse(r.stdout);
    expect(schema).toEqual(programSetJsonSchema());
    const doc = parse(fixture('swap.net.yaml')) as Record<string, unknown>;
    expect(validateJson(schema, doc)).toEqual([]);
    expect(validateJson(schema, { ...doc, format: 'bellstep/noise@1' })).not.toEqual([]);
  });

  it('prints the noise schema as JSON, exit 0', async () => {
    const r = await runCli(['schema', 'noise']);
    expect(r.code).toBe(0);
    const schema = JSON.parse(r.stdout);
    expect(schema).toEqual(noiseJsonSchema());
    const doc = parse(fixture('swap.noise.yaml')) as Record<string, unknown>;
    expect(validateJson(schema, doc)).toEqual([]);
    expect(validateJson(schema, { ...doc, format: 'noise' })).not.toEqual([]);
  });

  it('refuses another name as a usage error listing the two names', async () => {
    const r = await runCli(['schema', 'replay']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('unknown schema "replay"');
    expect(r.stderr).toContain('"program-set" and "noise"');
  });

  it('refuses a missing name', async () => {
    const r = await runCli(['schema']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain("missing required argument 'NAME'");
  });
});
