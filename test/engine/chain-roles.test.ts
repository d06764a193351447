/**
 * The benchmark chain written with roles runs exactly as the chain written out node by node,
 * so the benchmarks may load whichever form suits the size they measure.
 */
import { describe, expect, it } from 'vitest';
import { runHeadless } from '../../src/session/run.js';
import { CHAIN_NOISE, nestedChain, nestedChainWithRoles } from '../bench/chain.js';
import { engineFrom } from './scenarios.js';

describe('benchmark chains', () => {
  it('give byte-identical summaries written out and written with roles', () => {
    for (const levels of [2, 4]) {
      const out = JSON.stringify(runHeadless(engineFrom(nestedChain(levels), CHAIN_NOISE), { seed: 9, maxEvents: 6000 }).summary);
      const roles = JSON.stringify(runHeadless(engineFrom(nestedChainWithRoles(levels), CHAIN_NOISE), { seed: 9, maxEvents: 6000 }).summary);
      expect(roles).toBe(out);
      expect(JSON.parse(out).delivered.length).toBeGreaterThan(10);
    }
  });

  it('is much shorter with roles for a long chain', () => {
    expect(nestedChainWithRoles(11).length * 4).toBeLessThan(nestedChain(11).length);
  });
});
