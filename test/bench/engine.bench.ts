/**
 * Engine speed, as ratios measured in one run:
 * - headless events per second on a nested-swapping chain against a bare binary-heap event
 *   loop with a trivial handler (goal ≥ 0.10);
 * - the cost per event of a 129-site chain against a 5-site chain (goal ≤ 1.5×).
 */
import { heapPop, heapPush } from '../../src/engine/heap.js';
import { runHeadless } from '../../src/session/run.js';
import { engineFrom } from '../engine/scenarios.js';
import { CHAIN_NOISE, nestedChain } from './chain.js';
import { formatNs, type BenchLine } from './harness.js';

/** Nanoseconds per event of a bare heap loop: pop, trivial handler, push one follow-up. */
function bareLoop(events: number): number {
  const q: { time: number; seq: number }[] = [];
  let seq = 0;
  for (let i = 0; i < 64; i++) heapPush(q, { time: i, seq: seq++ });
  let sink = 0;
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < events; i++) {
    const e = heapPop(q)!;
    sink += e.time & 1;
    heapPush(q, { time: e.time + 1 + (i % 5), seq: seq++ });
  }
  const ns = Number(process.hrtime.bigint() - t0);
  if (sink < 0) console.log(sink);
  return ns / events;
}

/** Nanoseconds per event of a headless run of a chain (best of five rounds). */
function chainCost(levels: number, events: number): number {
  const engine = engineFrom(nestedChain(levels), CHAIN_NOISE);
  runHeadless(engine, { seed: 5, maxEvents: Math.min(2000, events) }); // warm up
  let best = Infinity;
  for (let round = 0; round < 5; round++) {
    if (typeof gc === 'function') gc();
    const t0 = process.hrtime.bigint();
    const r = runHeadless(engine, { seed: 5 + round, maxEvents: events });
    const ns = Number(process.hrtime.bigint() - t0);
    best = Math.min(best, ns / r.summary.events);
  }
  return best;
}

declare const gc: (() => void) | undefined;

export default async function engineBench(): Promise<BenchLine[]> {
  bareLoop(200_000);
  // collect earlier benchmarks' garbage first, and take the best of three rounds
  let bare = Infinity;
  for (let i = 0; i < 3; i++) {
    if (typeof gc === 'function') gc();
    bare = Math.min(bare, bareLoop(2_000_000));
  }
  const mid = chainCost(4, 60_000);
  const small = chainCost(2, 60_000);
  const large = chainCost(7, 60_000);
  return [
    {
      name: 'headless events/s on a 17-site nested chain, against a bare heap loop',
      ratio: bare / mid,
      goal: '>= 0.10',
      ok: bare / mid >= 0.1,
      detail: `${(1e9 / mid).toFixed(0)} events/s vs ${(1e9 / bare / 1e6).toFixed(1)} M/s bare; ${formatNs(mid)} per event`,
    },
    {
      name: 'cost per event, 129-site chain against 5-site chain',
      ratio: large / small,
      goal: '<= 1.5',
      ok: large / small <= 1.5,
      detail: `${formatNs(large)} vs ${formatNs(small)} per event`,
    },
  ];
}
