/**
 * Sweep throughput, as a ratio measured in one run: seeds per second with 2 worker threads
 * against 1 (goal ≥ 1.6×). Each sweep includes starting its workers, as a user's does; the
 * seeds are long enough (a hundred milliseconds or more each) that the runs, not the start,
 * dominate. The two are measured in turn, twice, and the faster of each pair counts, so a
 * burst of other work on a shared machine does not fall on one side only.
 */
import { runSweep } from '../../src/sweep/sweep.js';
import type { SweepJob } from '../../src/sweep/types.js';
import { noiseWith, purificationNet } from '../engine/scenarios.js';
import type { BenchLine } from './harness.js';

const JOB: SweepJob = {
  netFile: 'purify.net.yaml',
  netText: purificationNet({ dejmps: true }),
  noiseFile: 'purify.noise.yaml',
  noiseText: noiseWith('{werner: 0.9}', '    success: 0.3\n  memory: {t2: 80 ms}\n  gates: {two: {depolarizing: 0.01, duration: 20 us}}', 5),
  untilNs: 150_000_000,
  breaks: [],
  expects: ['delivered() >= 1'],
  recordFailures: false,
};
const SEEDS = { from: 1, to: 32 };

async function seedsPerSecond(workers: number): Promise<{ rate: number; ms: number; bytes: string }> {
  const t0 = process.hrtime.bigint();
  const { report } = await runSweep(JOB, { range: SEEDS, workers });
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  return { rate: report.runs.length / (ms / 1000), ms, bytes: JSON.stringify(report) };
}

export default async function sweepBench(): Promise<BenchLine[]> {
  await seedsPerSecond(2); // warm the file cache and the JIT of the main thread
  const best = (a: Awaited<ReturnType<typeof seedsPerSecond>>, b: Awaited<ReturnType<typeof seedsPerSecond>>) => (a.rate >= b.rate ? a : b);
  let one = await seedsPerSecond(1);
  let two = await seedsPerSecond(2);
  one = best(one, await seedsPerSecond(1));
  two = best(two, await seedsPerSecond(2));
  if (one.bytes !== two.bytes) throw new Error('the sweep gave different results with 1 and 2 workers');
  const ratio = two.rate / one.rate;
  return [
    {
      name: `sweep throughput, 2 workers against 1 (${SEEDS.to - SEEDS.from + 1} seeds)`,
      ratio,
      goal: '>= 1.6',
      ok: ratio >= 1.6,
      detail: `${one.rate.toFixed(1)} seeds/s in ${(one.ms / 1000).toFixed(2)} s with 1 worker, ${two.rate.toFixed(1)} seeds/s in ${(two.ms / 1000).toFixed(2)} s with 2`,
    },
  ];
}
