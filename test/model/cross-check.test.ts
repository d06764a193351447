import { describe, it, expect } from 'vitest';
import { crossCheck } from '../../src/model/cross-check.js';
import { loadInputs } from '../../src/model/load-inputs.js';
import { loadNoiseModel } from '../../src/model/load-noise.js';
import { loadProgramSet } from '../../src/model/load-program.js';
import { fixture, inputErrors, where } from './helpers.js';

const netText = fixture('swap.net.yaml');
const noiseText = fixture('swap.noise.yaml');

describe('crossCheck', () => {
  const ps = loadProgramSet('swap.net.yaml', netText);

  it('accepts the fixture pair', () => {
    expect(() => crossCheck(ps, loadNoiseModel('swap.noise.yaml', noiseText))).not.toThrow();
  });

  it('refuses a noise entry for a link the network does not have, with a did-you-mean', () => {
    const t = noiseText.replace('  mill~ridge:', '  mill~rdge:');
    const errs = inputErrors(() => crossCheck(ps, loadNoiseModel('x.noise.yaml', t)));
    expect(errs).toHaveLength(1);
    expect(errs[0].message).toContain('unknown link "mill~rdge" (did you mean "mill~ridge"?)');
    expect(errs[0].file).toBe('x.noise.yaml');
    expect([errs[0].line, errs[0].col]).toEqual([where(t, 'mill~rdge').line, where(t, 'mill~rdge').col]);
  });

  it('refuses per-node settings and faults naming unknown nodes', () => {
    const t = noiseText.replace('  mill:\n    memory', '  mil:\n    memory').replace('to: ridge', 'to: ridg');
    const errs = inputErrors(() => crossCheck(ps, loadNoiseModel('x.noise.yaml', t)));
    expect(errs.map((e) => e.message)).toEqual(['unknown node "mil" (did you mean "mill"?)', 'unknown node "ridg" (did you mean "ridge"?)']);
    expect(errs[1].field).toBe('faults[0].delay.to');
    expect(errs[1].line).toBe(where(t, 'to: ridg').line);
  });
});

describe('loadInputs', () => {
  it('loads both files, and the ideal model when no noise file is given', () => {
    const both = loadInputs({ netFile: 'n.yaml', netText, noiseFile: 'x.yaml', noiseText });
    expect(both.noise.seed).toBe(20261201);
    expect(both.programSet.nodes).toHaveLength(3);
    const ideal = loadInputs({ netFile: 'n.yaml', netText });
    expect(ideal.noise.file).toBe('');
    expect(ideal.noise.seed).toBe(1);
  });

  it("lets the CLI's seed override the file's seed", () => {
    expect(loadInputs({ netFile: 'n.yaml', netText, noiseFile: 'x.yaml', noiseText, seed: 7 }).noise.seed).toBe(7);
    expect(loadInputs({ netFile: 'n.yaml', netText, seed: 9 }).noise.seed).toBe(9);
  });

  it('reports the problems of both files together', () => {
    const errs = inputErrors(() =>
      loadInputs({ netFile: 'n.yaml', netText: netText.replace('length: 12 km', 'length: 12'), noiseFile: 'x.yaml', noiseText: noiseText.replace('seed: 20261201', 'seed: 1.5') }),
    );
    expect(errs.map((e) => e.file)).toEqual(['n.yaml', 'x.yaml']);
  });
});
