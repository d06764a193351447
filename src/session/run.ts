/**
 * Headless runs: apply events in batches until a limit, a breakpoint, a stall or an idle
 * network, then evaluate the expectations and build the summary. `bellstep run`, sweeps and
 * replay verification all run through here.
 */
import { evaluate, ExprError, formatValue, parseExpr } from '../expr/index.js';
import type { Compiled, Value } from '../expr/types.js';
import { InputError } from '../model/errors.js';
import { ProgramError, quiescence, stallReport, type Engine, type EngineEvent, type Net, type World } from '../engine/index.js';
import { formatDuration } from '../model/units.js';
import { breakpointScanner, type Breakpoint } from './breakpoints.js';
import { checkDebugExpr } from './expr-check.js';
import { observe, sawText } from './observe.js';
import { debugScope } from './debug-functions.js';
import { summarize, summaryHead, type ExpectationResult, type RunSummary, type Stop } from './summary.js';

/** Events a run applies when neither --until nor --events is given, so that it always ends. */
export const DEFAULT_MAX_EVENTS = 1_000_000;

/** Events between calls of `onBatch` (progress reports). */
const PROGRESS_EVERY = 4096;

export interface Expectation {
  readonly spec: string;
  readonly compiled: Compiled;
}

/**
 * Parses an expectation and checks it against the network, so that a wrong name, function
 * or number of arguments is an input error (with its column) before anything runs.
 */
export function parseExpectation(spec: string, net: Net, field = '--expect'): Expectation {
  let compiled: Compiled;
  try {
    compiled = parseExpr(spec);
  } catch (e) {
    if (e instanceof ExprError) {
      throw new InputError({ code: 'expression', field, message: `${e.detail} at column ${e.col} of "${spec}"`, fix: `check the expression:\n${e.excerpt()}` });
    }
    throw e;
  }
  checkDebugExpr(net, spec, compiled, { field, what: 'expectation', pairVars: false });
  return { spec, compiled };
}

export interface RunOptions {
  readonly seed: number;
  readonly untilNs?: number;
  readonly maxEvents?: number;
  readonly breakpoints?: readonly Breakpoint[];
  readonly expectations?: readonly Expectation[];
  /** Sees every applied event and the (draft) world after it, e.g. to record digests. */
  readonly onEvent?: (ev: EngineEvent, world: World) => void;
  /** Called every few thousand events (and at the end) with the world so far, e.g. for progress on stderr. */
  readonly onBatch?: (world: World) => void;
}

export interface RunResult {
  readonly world: World;
  readonly stop: Stop;
  /** The run summary (built when first read). */
  readonly summary: RunSummary;
  /** The summary without its delivery records, for output that streams them (`writeSummaryJson`). */
  readonly head: RunSummary;
  /** The breakpoint that stopped the run, if one did. */
  readonly breakpoint?: Breakpoint;
}

/** Evaluates expectations on a final world. A failed evaluation is a failed expectation. */
export function checkExpectations(engine: Engine, w: World, exps: readonly Expectation[]): ExpectationResult[] {
  return exps.map((e) => {
    const scope = debugScope(engine.net, w);
    let value: Value;
    try {
      value = evaluate(e.compiled, scope);
    } catch (err) {
      const msg = err instanceof ExprError ? err.detail : err instanceof Error ? err.message : String(err);
      return { expr: e.spec, ok: false, value: `error: ${msg}`, saw: observe(e.compiled, scope) };
    }
    return { expr: e.spec, ok: value === true || value === 1, value, saw: observe(e.compiled, scope) };
  });
}

/**
 * Runs from the initial world of `opts.seed` (or from `from`) until a stop condition. A
 * program error comes out naming the role its rule came from, if any.
 */
export function runHeadless(engine: Engine, opts: RunOptions, from?: World): RunResult {
  try {
    return runToStop(engine, opts, from);
  } catch (e) {
    throw e instanceof ProgramError ? e.traced(engine.net.rules) : e;
  }
}

function runToStop(engine: Engine, opts: RunOptions, from?: World): RunResult {
  let world = from ?? engine.initial(opts.seed);
  const limit = opts.maxEvents ?? (opts.untilNs === undefined ? DEFAULT_MAX_EVENTS : Infinity);
  const bps = (opts.breakpoints ?? []).filter((b) => b.enabled);
  const scan = bps.some((b) => b.kind !== 'stall') ? breakpointScanner(engine.net, bps, world) : undefined;
  let stop = undefined as Stop | undefined;
  let hitBp: Breakpoint | undefined;
  const startEvents = world.events;

  const done = world.events - startEvents;
  if (done >= limit) stop = { reason: 'events', detail: `reached the event limit (${limit})` };
  else {
    // one working copy for the whole run, and no event kept once its hooks have seen it
    const r = engine.advance(
      world,
      limit - done,
      {
        before: (_d, t) => {
          if (opts.untilNs !== undefined && t > opts.untilNs) {
            stop = { reason: 'until', detail: `the next event (at ${formatDuration(t)}) is after --until ${formatDuration(opts.untilNs)}` };
            return true;
          }
          return false;
        },
        after: (ev, d) => {
          opts.onEvent?.(ev, d);
          if (opts.onBatch && (ev.index + 1) % PROGRESS_EVERY === 0) opts.onBatch(d);
          if (scan === undefined) return false;
          const hit = scan(ev, d);
          if (!hit) return false;
          stop = { reason: 'breakpoint', detail: `breakpoint ${hit.bp.id} at event ${ev.index}: ${hit.what}` };
          hitBp = hit.bp;
          return true;
        },
      },
      { keep: 'none', detail: false },
    );
    world = r.world;
    opts.onBatch?.(world);
    if (!stop && r.exhausted) {
      const q = quiescence(world);
      stop =
        q === 'stall'
          ? { reason: 'stall', detail: 'no event can happen, but nodes still hold pairs or messages' }
          : { reason: 'idle', detail: 'nothing left to do and nothing held' };
      const onStall = bps.find((b) => b.kind === 'stall');
      if (q === 'stall' && onStall) hitBp = onStall;
    }
    if (!stop) stop = { reason: 'events', detail: `reached the event limit (${limit})` };
  }
  const stall = stop.reason === 'stall' ? stallReport(engine.net, world) : null;
  const expectations = checkExpectations(engine, world, opts.expectations ?? []);
  const seed = opts.seed;
  const end = stop;
  let summary: RunSummary | undefined;
  return {
    world,
    stop,
    breakpoint: hitBp,
    get summary(): RunSummary {
      summary ??= summarize(engine.net, world, seed, end, expectations, stall);
      return summary;
    },
    get head(): RunSummary {
      return summaryHead(engine.net, world, seed, end, expectations, stall);
    },
  };
}

/** One line per expectation, for text output: `FAIL delivered() > 3 (delivered() = 2)`. */
export function describeExpectations(results: readonly ExpectationResult[]): string[] {
  return results.map((r) => `${r.ok ? 'ok  ' : 'FAIL'} ${expectationLine(r)}`);
}

/** An expectation with what it saw: `delivered() > 3 (delivered() = 2)`. */
export function expectationLine(r: ExpectationResult): string {
  const saw = sawText(r.saw ?? []);
  return `${r.expr} (${saw || formatValue(r.value)})`;
}
