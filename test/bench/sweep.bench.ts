/**
 * Sweep throughput, as a ratio measured in one run: seeds per second with 2 worker threads
 * against 1 (goal ≥ 1.6×). Each sweep includes starting its workers, as a user's does; the
 * seeds are long enough (a few hundred milliseconds each) that the runs, not the start,
 * dominate. The two are measured in turn, twice, and the faster of each pair counts, so a
 * burst of other work on a shared machine does not fall on one side only.
 *
 * Beside it, the machine's own ceiling: seeds per second of two warm threads running seeds
 * at once, against one, with no pool, no messages and no start-up. Where two
 * busy threads slow each other down (shared caches, one physical core), no sweep can do
 * better than that line, and the ratio of the two says how much of it the pool keeps.
 */
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { prepareJob, runSeed } from '../../src/sweep/run-seed.js';
import { runSweep } from '../../src/sweep/sweep.js';
import type { SweepJob } from '../../src/sweep/types.js';
import { noiseWith, purificationNet } from '../engine/scenarios.js';
import type { BenchLine } from './harness.js';

const JOB: SweepJob = {
  netFile: 'purify.net.yaml',
  netText: purificationNet({ dejmps: true }),
  noiseFile: 'purify.noise.yaml',
  noiseText: noiseWith('{werner: 0.9}', '    success: 0.3\n  memory: {t2: 80 ms}\n  gates: {two: {depolarizing: 0.01, duration: 20 us}}', 5),
  untilNs: 600_000_000,
  breaks: [],
  expects: ['delivered() >= 1'],
  recordFailures: false,
};
const SEEDS = { from: 1, to: 24 };

async function seedsPerSecond(workers: number): Promise<{ rate: number; ms: number; bytes: string }> {
  const t0 = process.hrtime.bigint();
  const { report } = await runSweep(JOB, { range: SEEDS, workers });
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  return { rate: report.runs.length / (ms / 1000), ms, bytes: JSON.stringify(report) };
}

// a ceiling worker: runs `count` seeds in this thread as a sweep's worker does (inputs
// loaded once), then reports
if (!isMainThread && (workerData as { ceiling?: number } | null)?.ceiling !== undefined) {
  const count = (workerData as { ceiling: number }).ceiling;
  const job = prepareJob(JOB);
  runSeed(job, SEEDS.from); // warm, as a sweep's worker is after its first seed
  const t0 = performance.now();
  for (let i = 1; i <= count; i++) runSeed(job, SEEDS.from + i);
  parentPort!.postMessage(performance.now() - t0);
}

/** The longest time (ms) that one of `threads` threads, started together, took for `each` warm seeds. */
async function threadsAtOnce(threads: number, each: number): Promise<number> {
  const times = await Promise.all(
    Array.from({ length: threads }, () => new Promise<number>((resolve, reject) => {
      const w = new Worker(new URL(import.meta.url), { workerData: { ceiling: each } });
      w.once('message', (ms: number) => void w.terminate().then(() => resolve(ms)));
      w.once('error', reject);
    })),
  );
  return Math.max(...times);
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
  // the ceiling: seeds per second of 2 warm threads at once against 1 (no start-up on either side)
  let ceil = 0;
  for (let i = 0; i < 2; i++) ceil = Math.max(ceil, (2 * (await threadsAtOnce(1, 6))) / (await threadsAtOnce(2, 6)));
  return [
    {
      name: 'this machine: seeds per second of 2 warm threads at once, against 1 (ceiling for 2 workers)',
      ratio: ceil,
      goal: 'reference',
      ok: true,
      detail: 'warm threads, no pool, no start-up: what two busy threads give here',
    },
    {
      name: `sweep throughput, 2 workers against 1 (${SEEDS.to - SEEDS.from + 1} seeds)`,
      ratio,
      goal: '>= 1.6',
      ok: ratio >= 1.6,
      detail: `${one.rate.toFixed(1)} seeds/s in ${(one.ms / 1000).toFixed(2)} s with 1 worker, ${two.rate.toFixed(1)} seeds/s in ${(two.ms / 1000).toFixed(2)} s with 2; ${((100 * ratio) / ceil).toFixed(0)} % of the machine's ceiling`,
    },
  ];
}
