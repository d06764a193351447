/**
 * A seed sweep (docs/cli.md): one headless run per seed of a range or shard, on worker
 * threads, gathered into the sweep file. Every seed's result depends on the inputs and the
 * seed alone, and the file is built from the runs in seed order, so it does not depend on
 * the number of workers or on which worker ran which seed.
 */
import type { ResourceLimits } from 'node:worker_threads';
import { sha256 } from '../session/replay.js';
import { DEFAULT_MAX_EVENTS } from '../session/run.js';
import { runPool } from './pool.js';
import { buildReport, type SweepHeader } from './report.js';
import { formatShard, shardSeeds, type SeedRange, type Shard } from './seeds.js';
import { diagnoseCrash } from './signature.js';
import type { SeedResult, SweepJob, SweepReport } from './types.js';

// the worker sits next to this module: worker.js in dist/, worker.ts in the sources
const WORKER = new URL(`./worker${import.meta.url.endsWith('.ts') ? '.ts' : '.js'}`, import.meta.url);

export interface SweepOptions {
  readonly range: SeedRange;
  readonly shard?: Shard;
  readonly workers: number;
  /** Sees each seed's result as it comes in (completion order): progress, saving replays. */
  readonly onSeed?: (result: SeedResult) => void;
  /** Another worker module, for tests that need a worker to misbehave. */
  readonly entry?: URL;
  readonly resourceLimits?: ResourceLimits;
}

/** The sweep file plus what stays out of it: each seed's wall time, by seed. */
export interface SweepOutcome {
  readonly report: SweepReport;
  readonly ms: ReadonlyMap<number, number>;
}

/** The header of the sweep file for a job over a range (or one shard of it). */
export function sweepHeader(job: SweepJob, range: SeedRange, shard: Shard | undefined, count: number): SweepHeader {
  const events = job.maxEvents ?? (job.untilNs === undefined ? DEFAULT_MAX_EVENTS : null);
  return {
    inputs: { program_set_sha256: sha256(job.netText), noise_sha256: job.noiseText === undefined ? null : sha256(job.noiseText) },
    seeds: { from: range.from, to: range.to, shard: shard ? formatShard(shard) : null, count },
    limits: { until_ns: job.untilNs ?? null, events, ...(job.breaks.length ? { breakpoints: [...job.breaks] } : {}) },
    expectations: [...job.expects],
  };
}

/** Runs the sweep; resolves once every seed has a result. */
export async function runSweep(job: SweepJob, opts: SweepOptions): Promise<SweepOutcome> {
  const seeds = shardSeeds(opts.range, opts.shard);
  const explanations = new Map<string, string>();
  const ms = new Map<number, number>();
  const results = await runPool<number, SeedResult>(seeds, {
    entry: opts.entry ?? WORKER,
    data: job,
    workers: opts.workers,
    resourceLimits: opts.resourceLimits,
    crashed: (seed, message) => {
      const d = diagnoseCrash(message);
      return { run: { seed, outcome: 'error', events: 0, time_ns: 0, delivered: 0, fidelity_mean: null, signature: d.signature }, explanation: d.explanation, ms: 0 };
    },
    onResult: (_seed, result) => opts.onSeed?.(result),
    // a replay can be megabytes: onSeed has written it, so the sweep need not hold them all
    keep: ({ replay: _written, ...rest }) => rest,
  });
  for (const r of results) {
    ms.set(r.run.seed, r.ms);
    if (r.run.signature !== null && r.explanation !== null) explanations.set(r.run.signature, r.explanation);
  }
  const header = sweepHeader(job, opts.range, opts.shard, seeds.length);
  const report = buildReport(
    header,
    results.map((r) => r.run),
    (sig) => explanations.get(sig) ?? '',
  );
  return { report, ms };
}
