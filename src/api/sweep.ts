/**
 * `sweep` for the library and for `bellstep sweep`: one headless run per seed of a range,
 * on worker threads, gathered into the sweep file. The CLI adds saving failing seeds'
 * replays and progress through the hook.
 */
import { availableParallelism } from 'node:os';
import { InputError } from '../model/errors.js';
import { parseSeedRange, parseShard, type SeedRange, type Shard } from '../sweep/seeds.js';
import { runSweep, type SweepOutcome } from '../sweep/sweep.js';
import { prepareJob } from '../sweep/run-seed.js';
import type { SeedResult, SweepJob, SweepReport } from '../sweep/types.js';
import { loaded, type Inputs } from './inputs.js';
import { countOption, durationOption, textsOption } from './options.js';
import { prepareRun } from './run.js';

/** More threads than this only queue for the same cores. */
export const MAX_WORKERS = 256;

/** Options of `sweep`. */
export interface SweepOptions {
  /** The seeds, both ends included: '1..100' or {from: 1, to: 100}. */
  readonly seeds: string | { readonly from: number; readonly to: number };
  /** Worker threads (default: one per core). */
  readonly workers?: number;
  /** Run only shard I of N: '2/4' or {index: 2, count: 4}. */
  readonly shard?: string | { readonly index: number; readonly count: number };
  /** Stop each run before the first event after this simulated time: '5ms', '250 us', or whole nanoseconds. */
  readonly until?: string | number;
  /** Stop each run after this many events. */
  readonly events?: number;
  /** Breakpoints that stop a run, as `--break` takes them. */
  readonly breaks?: readonly string[];
  /** Expressions checked at the end of each run; a seed fails when one is false. */
  readonly expect?: readonly string[];
}

/** A sweep's options, already checked; `names` are how messages name the options. */
export interface SweepPlan {
  readonly range: SeedRange;
  readonly shard?: Shard;
  readonly workers: number;
  readonly untilNs?: number;
  readonly maxEvents?: number;
  readonly breaks: readonly string[];
  readonly expects: readonly string[];
  readonly names: { readonly break: string; readonly expect: string };
}

/** The number of worker threads: given, or one per core. */
export function workerCount(n: number | undefined, field: string): number {
  if (n === undefined) return Math.min(MAX_WORKERS, availableParallelism());
  if (n > MAX_WORKERS) throw new InputError({ code: 'usage', field, message: `${n} workers is more than ${MAX_WORKERS}`, fix: `leave ${field} out to use one per core (${availableParallelism()} here)` });
  return n;
}

function rangeOption(v: SweepOptions['seeds']): SeedRange {
  if (v !== null && typeof v === 'object') return parseSeedRange(`${v.from}..${v.to}`, 'seeds');
  if (typeof v !== 'string') throw new InputError({ code: 'usage', field: 'seeds', message: 'a sweep needs a range of seeds', fix: "write e.g. {seeds: '1..100'} or {seeds: {from: 1, to: 100}}" });
  return parseSeedRange(v, 'seeds');
}

function shardOption(v: SweepOptions['shard']): Shard | undefined {
  if (v !== null && typeof v === 'object') return parseShard(`${v.index}/${v.count}`, 'shard');
  return parseShard(v, 'shard');
}

/** Checks the library's sweep options. */
export function sweepPlanFromOptions(opts: SweepOptions): SweepPlan {
  return {
    range: rangeOption(opts?.seeds),
    shard: shardOption(opts.shard),
    workers: workerCount(countOption(opts.workers, 'workers'), 'workers'),
    untilNs: durationOption(opts.until, 'until'),
    maxEvents: countOption(opts.events, 'events'),
    breaks: textsOption(opts.breaks, 'breaks'),
    expects: textsOption(opts.expect, 'expect'),
    names: { break: 'breaks', expect: 'expect' },
  };
}

/** The job every worker runs; breakpoints and expectations are checked here, once, so a mistake is an InputError before any worker starts. */
export function sweepJob(inputs: Inputs, plan: SweepPlan, recordFailures: boolean): SweepJob {
  prepareRun(inputs, { untilNs: plan.untilNs, maxEvents: plan.maxEvents, breaks: plan.breaks, expects: plan.expects, names: plan.names });
  const { programSet, noise } = loaded(inputs);
  const job: SweepJob = {
    netFile: programSet.file,
    netText: programSet.text,
    noiseFile: noise.file ? noise.file : undefined,
    noiseText: noise.file ? noise.text : undefined,
    untilNs: plan.untilNs,
    maxEvents: plan.maxEvents,
    breaks: [...plan.breaks],
    expects: [...plan.expects],
    recordFailures,
  };
  prepareJob(job);
  return job;
}

/** Runs a sweep's job over its seeds; `onSeed` sees each seed's result as it comes in. */
export function executeSweep(job: SweepJob, plan: SweepPlan, onSeed?: (result: SeedResult) => void): Promise<SweepOutcome> {
  return runSweep(job, { range: plan.range, shard: plan.shard, workers: plan.workers, onSeed });
}

/** Runs validated inputs once per seed on worker threads and returns the sweep file that `bellstep sweep --json` prints. */
export async function sweep(inputs: Inputs, opts: SweepOptions): Promise<SweepReport> {
  const plan = sweepPlanFromOptions(opts);
  const job = sweepJob(inputs, plan, false);
  return (await executeSweep(job, plan)).report;
}
