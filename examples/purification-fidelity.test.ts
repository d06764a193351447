/**
 * An example of bellstep as a library in a project's own tests: run a purification protocol
 * headless and assert the fidelity of the pairs it delivers. Copy it into your project, point
 * `load` at your program set and noise model, and run it with vitest.
 */
import { describe, expect, it } from 'vitest';
import { load, run } from 'bellstep';

/**
 * One round of recurrence purification on two Werner pairs of fidelity F, with perfect
 * gates and readout (Bennett et al., Phys. Rev. Lett. 76, 722 (1996), eq. for F').
 */
function purifiedWerner(f: number): number {
  const q = (1 - f) / 3;
  return (f * f + q * q) / (f * f + 2 * f * q + 5 * q * q);
}

describe('two-site purification', () => {
  const inputs = load('demos/two-site-purification/purify.net.yaml', { noise: 'demos/two-site-purification/purify.noise.yaml' });

  it('delivers pairs better than the links make, and no better than perfect gates allow', () => {
    const summary = run(inputs, { until: '20ms', seed: 7 });
    expect(summary.stop.reason).toBe('until');
    expect(summary.delivered.length).toBeGreaterThanOrEqual(10);
    // the links make Werner pairs of fidelity 0.90 (the noise model); gate, readout and
    // memory noise can only lower what one round of purification gives
    for (const pair of summary.delivered) {
      expect(pair.fidelity).toBeGreaterThan(0.9);
      expect(pair.fidelity).toBeLessThan(purifiedWerner(0.9));
    }
    // the run statistics summarise the same pairs
    expect(summary.stats.fidelity.min).toBeGreaterThan(0.9);
    expect(summary.stats.fidelity.p50).toBeGreaterThan(0.92);
  });

  it('holds on other seeds too', () => {
    for (const seed of [1, 2, 3]) {
      const summary = run(inputs, { until: '20ms', seed, expect: ['min_fidelity_delivered() > 0.9'] });
      expect(summary.expectations[0].ok).toBe(true);
    }
  });
});
