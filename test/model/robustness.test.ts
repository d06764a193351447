/**
 * Whatever a person writes, loading ends in a typed value or in input errors with a
 * position: never a crash. Every line of the fixtures is deleted or has its value replaced
 * by values of every other YAML type, one edit at a time.
 */
import { describe, it, expect } from 'vitest';
import { InputError, InputErrors } from '../../src/model/errors.js';
import { loadInputs } from '../../src/model/load-inputs.js';
import { fixture } from './helpers.js';

const NET = fixture('swap.net.yaml');
const NOISE = fixture('swap.noise.yaml');
const REPLACEMENTS = ['', '[]', '{}', '7', '-1', '1.5', 'true', 'null', '"x"', '[a, b, c]', '{a: 1}', '"{"', '__proto__'];

function edits(text: string): string[] {
  const lines = text.split('\n');
  const out: string[] = [];
  lines.forEach((line, i) => {
    out.push([...lines.slice(0, i), ...lines.slice(i + 1)].join('\n'));
    const colon = line.indexOf(': ');
    if (colon < 0) return;
    for (const r of REPLACEMENTS) out.push([...lines.slice(0, i), `${line.slice(0, colon + 2)}${r}`, ...lines.slice(i + 1)].join('\n'));
  });
  return out;
}

function outcome(netText: string, noiseText: string): 'ok' | 'input' {
  try {
    loadInputs({ netFile: 'n.yaml', netText, noiseFile: 'x.yaml', noiseText });
    return 'ok';
  } catch (e) {
    if (e instanceof InputErrors) {
      expect(e.errors.length).toBeGreaterThan(0);
      for (const err of e.errors) {
        expect(err.file).toBeTruthy();
        expect(err.line).toBeGreaterThanOrEqual(1);
        expect(err.message).not.toMatch(/Invalid input|received undefined/);
      }
      return 'input';
    }
    if (e instanceof InputError) return 'input';
    throw e;
  }
}

describe('loading edited fixtures', () => {
  it('never crashes on a program set edited line by line', () => {
    const results = edits(NET).map((t) => outcome(t, NOISE));
    // most edits break something; the check is that none of them threw anything else
    expect(results.filter((r) => r === 'input').length).toBeGreaterThan(results.length / 2);
  });

  it('never crashes on a noise model edited line by line', () => {
    const results = edits(NOISE).map((t) => outcome(NET, t));
    expect(results.filter((r) => r === 'input').length).toBeGreaterThan(results.length / 2);
  });
});
