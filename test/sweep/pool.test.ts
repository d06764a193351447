/**
 * The worker pool: a worker that throws, runs out of memory or exits costs only the seed it
 * was running, and a fresh worker takes its place; a worker that cannot start fails the
 * pool. The misbehaving worker is TypeScript, so this also runs the path that loads a .ts
 * worker through tsx.
 */
import { describe, expect, it } from 'vitest';
import { runPool } from '../../src/sweep/pool.js';
import { runSweep } from '../../src/sweep/sweep.js';
import type { SweepJob } from '../../src/sweep/types.js';
import { LOSSY_NET, LOSSY_NOISE } from './scenarios.js';

const ENTRY = new URL('./fixtures/misbehaving-worker.ts', import.meta.url);
// small enough that seed 5's hog hits it in a moment, large enough for the worker's modules
const LIMITS = { maxOldGenerationSizeMb: 48, maxYoungGenerationSizeMb: 8 };

describe('the sweep worker pool', () => {
  it('turns a crash, an out-of-memory and an exit into that task’s result, respawns, and keeps task order', async () => {
    const seen: number[] = [];
    const results = await runPool<number, unknown>([1, 2, 3, 4, 5, 6, 7, 8], {
      entry: ENTRY,
      data: {},
      workers: 1,
      resourceLimits: LIMITS,
      crashed: (seed, message) => ({ crashed: seed, message }),
      onResult: (seed) => seen.push(seed),
    });
    expect(seen.sort()).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect(results[2]).toEqual({ crashed: 3, message: 'the worker crashed: deliberate crash at seed 3' });
    expect(results[4]).toMatchObject({ crashed: 5, message: expect.stringMatching(/^the worker ran out of memory/) });
    expect(results[6]).toEqual({ crashed: 7, message: 'the worker exited with code 7' });
    for (const i of [0, 1, 3, 5, 7]) expect(results[i]).toMatchObject({ run: { seed: i + 1, outcome: 'ok' } });
  });

  it('rejects when a worker cannot even start, instead of respawning it for ever', async () => {
    await expect(runPool([1, 2], { entry: ENTRY, data: { failSetup: true }, workers: 2, crashed: () => null })).rejects.toThrow(
      'a sweep worker failed to start: the worker crashed: deliberate failure during setup',
    );
  });

  it('resolves at once with no tasks', async () => {
    await expect(runPool([], { entry: ENTRY, data: {}, workers: 2, crashed: () => null })).resolves.toEqual([]);
  });
});

describe('a sweep whose worker crashes', () => {
  it('reports the seed as an error with the worker’s message and goes on', async () => {
    const job: SweepJob = { netFile: 'lossy.net.yaml', netText: LOSSY_NET, noiseFile: 'lossy.noise.yaml', noiseText: LOSSY_NOISE, untilNs: 1e6, breaks: [], expects: [], recordFailures: false };
    const { report } = await runSweep(job, { range: { from: 1, to: 4 }, workers: 2, entry: ENTRY });
    expect(report.runs.map((r) => r.outcome)).toEqual(['ok', 'ok', 'error', 'ok']);
    expect(report.runs[2]).toEqual({ seed: 3, outcome: 'error', events: 0, time_ns: 0, delivered: 0, fidelity_mean: null, signature: 'crash | the worker crashed: deliberate crash at seed N' });
    expect(report.failures).toHaveLength(1);
    expect(report.failures[0]).toMatchObject({ count: 1, seeds: [3] });
    expect(report.failures[0].explanation).toContain('bellstep itself failed on this seed');
    expect(report.stats.failed).toBe(1);
  });
});
