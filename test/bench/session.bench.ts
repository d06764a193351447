/**
 * Session costs, as ratios measured in one run:
 * - memory of the history per retained event against a deep copy per event (goal ≤ 0.05);
 * - step-back latency against step-forward latency (goal ≤ 1);
 * - going to a random event of a 1,000,000-event history against one step forward
 *   (goal: about 100× or better, a keyframe interval's worth of replay);
 * - headless speed with recording against without (goal ≥ 0.8).
 */
import type { World } from '../../src/engine/index.js';
import { Recorder } from '../../src/session/replay.js';
import { runHeadless } from '../../src/session/run.js';
import { Session } from '../../src/session/session.js';
import { engineFrom } from '../engine/scenarios.js';
import { CHAIN_NOISE, nestedChain } from './chain.js';
import { formatNs, type BenchLine } from './harness.js';

declare const gc: (() => void) | undefined;

function heapUsed(): number {
  if (typeof gc === 'function') {
    gc();
    gc();
  }
  return process.memoryUsage().heapUsed + process.memoryUsage().arrayBuffers;
}

function time(fn: () => void): number {
  const t0 = process.hrtime.bigint();
  fn();
  return Number(process.hrtime.bigint() - t0);
}

/** A deep copy of a world, typed arrays included (what a naive history would keep per event). */
function deepCopy(w: World): World {
  return structuredClone(w);
}

function memoryLine(): BenchLine {
  const engine = engineFrom(nestedChain(4), CHAIN_NOISE);
  const n = 3000;
  const base = heapUsed();
  const s = new Session(engine, { window: n + 10 });
  for (let i = 0; i < n; i++) s.stepForward();
  const history = heapUsed() - base;
  const worlds: World[] = [];
  const base2 = heapUsed();
  for (let i = 1; i <= n; i++) worlds.push(deepCopy(s.history.worldAt(i)));
  const copies = heapUsed() - base2;
  const ratio = history / copies;
  if (worlds.length < 0) console.log(s.cursor);
  return {
    name: 'history memory per retained event, against a deep copy per event',
    ratio,
    goal: '<= 0.05',
    ok: ratio <= 0.05,
    detail: `${(history / n / 1024).toFixed(2)} KiB vs ${(copies / n / 1024).toFixed(2)} KiB per event${typeof gc === 'function' ? '' : ' (run with --expose-gc for exact figures)'}`,
  };
}

function latencyLines(): BenchLine[] {
  const engine = engineFrom(nestedChain(4), CHAIN_NOISE);
  const s = new Session(engine);
  s.goto(20_000);
  const k = 2000;
  const fwd = time(() => {
    for (let i = 0; i < k; i++) s.stepForward();
  });
  const back = time(() => {
    for (let i = 0; i < k; i++) s.stepBack();
  });
  // after a jump the window holds one world: stepping back rebuilds it from a keyframe
  const s2 = new Session(engine);
  s2.goto(30_000);
  const back2 = time(() => {
    for (let i = 0; i < k; i++) s2.stepBack();
  });
  return [
    {
      name: 'step-back latency against step-forward latency (within the window)',
      ratio: back / fwd,
      goal: '<= 1',
      ok: back / fwd <= 1,
      detail: `${formatNs(back / k)} vs ${formatNs(fwd / k)} per step`,
    },
    {
      name: 'step-back latency after a jump (window rebuilt from keyframes), against step forward',
      ratio: back2 / fwd,
      goal: '<= 1',
      ok: back2 / fwd <= 1,
      detail: `${formatNs(back2 / k)} vs ${formatNs(fwd / k)} per step`,
    },
  ];
}

function gotoLine(total: number): BenchLine {
  const engine = engineFrom(nestedChain(2), CHAIN_NOISE);
  const s = new Session(engine);
  const build = time(() => s.goto(total));
  // one step forward at the frontier (a new event, one produce, one digest)
  let step = Infinity;
  for (let i = 0; i < 200; i++) step = Math.min(step, time(() => s.stepForward()));
  let rnd = 12345;
  let sum = 0;
  const jumps = 30;
  for (let i = 0; i < jumps; i++) {
    rnd = (rnd * 1103515245 + 12345) % 2147483648;
    const target = rnd % total;
    sum += time(() => s.goto(target));
  }
  const ratio = sum / jumps / step;
  return {
    name: `go to a random event of a ${total.toLocaleString('en')}-event history, against one step forward`,
    ratio,
    goal: '<= ~100',
    ok: ratio <= 150,
    detail: `${formatNs(sum / jumps)} per jump vs ${formatNs(step)} per step; history built in ${formatNs(build)}; keyframe interval ${s.history.keyframeInterval}`,
  };
}

function recordingLine(): BenchLine {
  const engine = engineFrom(nestedChain(4), CHAIN_NOISE);
  const n = 40_000;
  runHeadless(engine, { seed: 5, maxEvents: 2000 });
  let plain = Infinity;
  let recorded = Infinity;
  for (let round = 0; round < 3; round++) {
    // collect garbage left by earlier benchmarks before each timing, so neither side pays for it
    heapUsed();
    plain = Math.min(plain, time(() => runHeadless(engine, { seed: 5, maxEvents: n })));
    heapUsed();
    recorded = Math.min(
      recorded,
      time(() => {
        const rec = new Recorder(engine, { seed: 5, breakpoints: [], expectations: [] });
        const r = runHeadless(engine, { seed: 5, maxEvents: n, onEvent: (ev, w) => rec.add(ev, w) });
        rec.finish(r.stop);
      }),
    );
  }
  const ratio = plain / recorded;
  return {
    name: 'headless speed with --record, against without',
    ratio,
    goal: '>= 0.8',
    ok: ratio >= 0.8,
    detail: `${formatNs(recorded / n)} vs ${formatNs(plain / n)} per event`,
  };
}

export default async function sessionBench(): Promise<BenchLine[]> {
  const total = Number(process.env.BELLSTEP_BENCH_HISTORY ?? 1_000_000);
  // the million-event history goes last: the garbage it leaves would slow the others down
  return [memoryLine(), ...latencyLines(), recordingLine(), gotoLine(total)];
}
