/**
 * `run` for the library and for `bellstep run`: one code path from validated inputs and
 * options to the run summary that `run --json` prints. The CLI adds only what a command line
 * needs around it (a recording, progress, the crash replay) through the hooks.
 */
import { Engine, type EngineEvent, type World } from '../engine/index.js';
import { parseBreakpoint, type Breakpoint } from '../session/breakpoints.js';
import { parseExpectation, runHeadless, type Expectation, type RunResult } from '../session/run.js';
import { runStats, type RunStats } from '../session/run-stats.js';
import type { RunSummary as SummaryCore } from '../session/summary.js';
import { loaded, type Inputs } from './inputs.js';
import { countOption, durationOption, seedOption, textsOption } from './options.js';

/** The run summary that `run --json` prints: the summary's fixed keys, then `stats`. */
export type RunSummary = SummaryCore & { stats: RunStats };

export type { RunStats } from '../session/run-stats.js';

/** Options of `run`. */
export interface RunOptions {
  /** The seed (default: the noise model's). */
  readonly seed?: number;
  /** Stop before the first event after this simulated time: '5ms', '250 us', or whole nanoseconds. */
  readonly until?: string | number;
  /** Stop after this many events (default 1,000,000 when `until` is not given). */
  readonly events?: number;
  /** Breakpoints that stop the run, as `--break` takes them. */
  readonly breaks?: readonly string[];
  /** Expressions checked at the end, as `--expect` takes them. */
  readonly expect?: readonly string[];
}

/** What a run is asked to do, its options already checked; `names` are how messages name the options. */
export interface RunPlan {
  readonly seed?: number;
  readonly untilNs?: number;
  readonly maxEvents?: number;
  readonly breaks: readonly string[];
  readonly expects: readonly string[];
  readonly names: { readonly break: string; readonly expect: string };
}

/** A run ready to start: its engine, seed, breakpoints and expectations parsed. */
export interface PreparedRun {
  readonly engine: Engine;
  readonly seed: number;
  readonly plan: RunPlan;
  readonly breakpoints: readonly Breakpoint[];
  readonly expectations: readonly Expectation[];
}

/** What the CLI watches a run with. */
export interface RunHooks {
  readonly onEvent?: (ev: EngineEvent, world: World) => void;
  readonly onBatch?: (world: World) => void;
}

/** Checks the library's run options. */
export function planFromOptions(opts: RunOptions = {}): RunPlan {
  return {
    seed: seedOption(opts.seed),
    untilNs: durationOption(opts.until, 'until'),
    maxEvents: countOption(opts.events, 'events'),
    breaks: textsOption(opts.breaks, 'breaks'),
    expects: textsOption(opts.expect, 'expect'),
    names: { break: 'breaks', expect: 'expect' },
  };
}

/** Builds the engine and parses breakpoints and expectations; throws InputError on a bad one. */
export function prepareRun(inputs: Inputs, plan: RunPlan): PreparedRun {
  const { programSet, noise } = loaded(inputs);
  const engine = new Engine(programSet, noise);
  const breakpoints = plan.breaks.map((b, i) => parseBreakpoint(engine.net, b, i + 1, plan.names.break));
  const expectations = plan.expects.map((e) => parseExpectation(e, engine.net, plan.names.expect));
  return { engine, seed: plan.seed ?? noise.seed, plan, breakpoints, expectations };
}

/** Runs a prepared run to its stop; gives the result (its summary without statistics) and the run statistics. */
export function executeRun(p: PreparedRun, hooks: RunHooks = {}): { result: RunResult; stats: RunStats } {
  const result = runHeadless(p.engine, {
    seed: p.seed,
    untilNs: p.plan.untilNs,
    maxEvents: p.plan.maxEvents,
    breakpoints: p.breakpoints,
    expectations: p.expectations,
    onEvent: hooks.onEvent,
    onBatch: hooks.onBatch,
  });
  return { result, stats: runStats(p.engine.net, result.world) };
}

/** Runs validated inputs headless and returns the run summary, equal to what `bellstep run --json` prints. */
export function run(inputs: Inputs, opts: RunOptions = {}): RunSummary {
  const { result, stats } = executeRun(prepareRun(inputs, planFromOptions(opts)));
  // the summary's keys first, in their order, then the statistics
  return { ...result.summary, stats };
}
