/**
 * One seed of a sweep: a headless run exactly as `bellstep run` makes it, judged and
 * diagnosed. Workers call this; it does no I/O, so tests may call it directly too.
 */
import { performance } from 'node:perf_hooks';
import { Engine, ProgramError } from '../engine/index.js';
import { loadInputs } from '../model/index.js';
import { BreakpointError, parseBreakpoint, type Breakpoint } from '../session/breakpoints.js';
import { Recorder } from '../session/replay.js';
import { DEFAULT_MAX_EVENTS, parseExpectation, runHeadless, type Expectation } from '../session/run.js';
import type { RunSummary } from '../session/summary.js';
import { diagnoseCrash, diagnoseExpectations, diagnoseRunError, diagnoseStall, type Diagnosis } from './signature.js';
import type { SeedResult, SweepJob, SweepRun } from './types.js';

/** A job's inputs loaded and its flags parsed, once, to serve many seeds. */
export interface PreparedJob {
  readonly job: SweepJob;
  readonly engine: Engine;
  readonly breakpoints: readonly Breakpoint[];
  readonly expectations: readonly Expectation[];
}

/** Loads the inputs and parses breakpoints and expectations; throws InputError on bad input. */
export function prepareJob(job: SweepJob): PreparedJob {
  const { programSet, noise } = loadInputs({ netFile: job.netFile, netText: job.netText, noiseFile: job.noiseFile, noiseText: job.noiseText });
  const engine = new Engine(programSet, noise);
  const breakpoints = job.breaks.map((b, i) => parseBreakpoint(engine.net, b, i + 1, '--break'));
  const expectations = job.expects.map((e) => parseExpectation(e, engine.net));
  return { job, engine, breakpoints, expectations };
}

function judge(s: RunSummary): { outcome: SweepRun['outcome']; diagnosis: Diagnosis | null } {
  // a stall is the cause; expectations that fail with it (too few pairs) are its symptoms
  if (s.stop.reason === 'stall' && s.stall) return { outcome: 'stall', diagnosis: diagnoseStall(s.stall) };
  if (s.expectations.some((e) => !e.ok)) return { outcome: 'failed', diagnosis: diagnoseExpectations(s.expectations) };
  return { outcome: 'ok', diagnosis: null };
}

function meanFidelity(s: RunSummary): number | null {
  if (s.delivered.length === 0) return null;
  let sum = 0;
  for (const d of s.delivered) sum += d.fidelity;
  return sum / s.delivered.length;
}

/** Runs one seed; program errors and bellstep's own errors become an `error` outcome, never a throw. */
export function runSeed(p: PreparedJob, seed: number): SeedResult {
  const started = performance.now();
  const { engine, job } = p;
  let events = 0;
  let time = 0;
  const meta = {
    seed,
    breakpoints: p.breakpoints.map((b) => b.spec),
    expectations: p.expectations.map((e) => e.spec),
    limits: { until_ns: job.untilNs ?? null, events: job.maxEvents ?? (job.untilNs === undefined ? DEFAULT_MAX_EVENTS : null) },
  };
  try {
    const result = runHeadless(engine, {
      seed,
      untilNs: job.untilNs,
      maxEvents: job.maxEvents,
      breakpoints: p.breakpoints,
      expectations: p.expectations,
    });
    const s = result.summary;
    const { outcome, diagnosis } = judge(s);
    const run: SweepRun = {
      seed,
      outcome,
      events: s.events,
      time_ns: s.time_ns,
      delivered: s.delivered.length,
      fidelity_mean: meanFidelity(s),
      signature: diagnosis?.signature ?? null,
    };
    let replay: string | undefined;
    if (diagnosis && job.recordFailures) {
      // recording costs a digest per event, so only failing seeds pay for it, in a second run
      const recorder = new Recorder(engine, meta);
      const again = runHeadless(engine, { seed, untilNs: job.untilNs, maxEvents: job.maxEvents, breakpoints: p.breakpoints, expectations: p.expectations, onEvent: (ev, w) => recorder.add(ev, w) });
      replay = recorder.finish(again.stop);
    }
    return { run, explanation: diagnosis?.explanation ?? null, replay, ms: performance.now() - started };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    const diagnosis =
      err instanceof ProgramError ? diagnoseRunError(err.rule ? `${err.node}.${err.rule}` : err.node, message)
      : err instanceof BreakpointError ? diagnoseRunError('--break', message)
      : diagnoseCrash(`internal error: ${message}`);
    // the events up to the error, counted on a second run that also records them if asked
    const recorder = job.recordFailures ? new Recorder(engine, meta) : undefined;
    try {
      runHeadless(engine, {
        seed,
        untilNs: job.untilNs,
        maxEvents: job.maxEvents,
        breakpoints: p.breakpoints,
        onEvent: (ev, w) => {
          events = ev.index + 1;
          time = ev.time;
          recorder?.add(ev, w);
        },
      });
    } catch {
      // the same error again: what was counted and recorded up to it is what we want
    }
    const run: SweepRun = { seed, outcome: 'error', events, time_ns: time, delivered: 0, fidelity_mean: null, signature: diagnosis.signature };
    return { run, explanation: diagnosis.explanation, replay: recorder?.partial(`the run stopped on an error: ${message}`), ms: performance.now() - started };
  }
}
