/**
 * Engine speed and memory, as ratios measured in one run:
 * - the bare loop: a binary heap on typed arrays with a trivial handler, as fast as it can
 *   be written; every speed below is a fraction of it;
 * - the physics-only ceiling: the kernel calls of a 5-site chain run, recorded and replayed
 *   with nothing around them, through the kernel the engine uses;
 * - the headless engine in process on 5-, 129- and 2,049-site nested-swapping chains, its
 *   share of the physics ceiling, and the cost per event against the 5-site chain;
 * - whole `bellstep run` processes (startup included): the 5-site chain for 300,000 events,
 *   load plus 100,000 events on 2,049 sites against 129, and peak memory of 1,000,000
 *   events against 100,000, plain and with --json.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { PhysicsTrace, recordPhysics, replayPhysics } from '../../src/engine/index.js';
import { runHeadless } from '../../src/session/run.js';
import { engineFrom } from '../engine/scenarios.js';
import { CHAIN_NOISE, nestedChainWithRoles } from './chain.js';
import { formatNs, type BenchLine } from './harness.js';

declare const gc: (() => void) | undefined;

/**
 * Nanoseconds per event of the bare loop: pop the earliest (time, seq) from a binary heap
 * kept in two typed arrays, do a trivial thing, push one follow-up.
 */
function bareLoop(events: number): number {
  const T = new Float64Array(1024);
  const S = new Float64Array(1024);
  let size = 0;
  let seq = 0;
  const push = (t: number): void => {
    let i = size++;
    const s = seq++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (T[p] < t || (T[p] === t && S[p] < s)) break;
      T[i] = T[p];
      S[i] = S[p];
      i = p;
    }
    T[i] = t;
    S[i] = s;
  };
  const pop = (): number => {
    const top = T[0];
    const n = --size;
    const lt = T[n];
    const ls = S[n];
    let i = 0;
    for (;;) {
      let c = 2 * i + 1;
      if (c >= n) break;
      if (c + 1 < n && (T[c + 1] < T[c] || (T[c + 1] === T[c] && S[c + 1] < S[c]))) c++;
      if (T[c] > lt || (T[c] === lt && S[c] > ls)) break;
      T[i] = T[c];
      S[i] = S[c];
      i = c;
    }
    T[i] = lt;
    S[i] = ls;
    return top;
  };
  for (let i = 0; i < 64; i++) push(i);
  let sink = 0;
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < events; i++) {
    const t = pop();
    sink += t & 1;
    push(t + 1 + (i % 5));
  }
  const ns = Number(process.hrtime.bigint() - t0);
  if (sink < 0) console.log(sink);
  return ns / events;
}

function bestBare(): number {
  bareLoop(200_000);
  let best = Infinity;
  for (let i = 0; i < 3; i++) {
    if (typeof gc === 'function') gc();
    best = Math.min(best, bareLoop(3_000_000));
  }
  return best;
}

function engineFor(levels: number) {
  return engineFrom(nestedChainWithRoles(levels), CHAIN_NOISE);
}

/** Nanoseconds per event of a headless run of a chain (best of `rounds`). */
function chainCost(levels: number, events: number, rounds = 3): number {
  const engine = engineFor(levels);
  runHeadless(engine, { seed: 5, maxEvents: Math.min(5000, events) }); // warm up
  let best = Infinity;
  for (let round = 0; round < rounds; round++) {
    if (typeof gc === 'function') gc();
    const t0 = process.hrtime.bigint();
    const r = runHeadless(engine, { seed: 5 + round, maxEvents: events });
    best = Math.min(best, Number(process.hrtime.bigint() - t0) / r.world.events);
  }
  return best;
}

/** The engine and its own physics, alternately on the same events, best of each: ns per event. */
function engineAgainstPhysics(events: number): { engine: number; physics: number } {
  const engine = engineFor(2);
  const trace = new PhysicsTrace();
  recordPhysics(trace);
  runHeadless(engine, { seed: 5, maxEvents: events });
  recordPhysics(null);
  replayPhysics(trace); // warm up
  let e = Infinity;
  let p = Infinity;
  for (let round = 0; round < 4; round++) {
    if (typeof gc === 'function') gc();
    let t0 = process.hrtime.bigint();
    runHeadless(engine, { seed: 5, maxEvents: events });
    e = Math.min(e, Number(process.hrtime.bigint() - t0) / events);
    if (typeof gc === 'function') gc();
    t0 = process.hrtime.bigint();
    replayPhysics(trace);
    p = Math.min(p, Number(process.hrtime.bigint() - t0) / events);
  }
  return { engine: e, physics: p };
}

const here = dirname(fileURLToPath(import.meta.url));
/** The compiled CLI next to this module (npm run bench compiles src beside test/bench). */
const BIN = join(here, '../../src/cli/bin.js');
const RSS_CHILD = join(here, 'rss-child.js');

/** Wall time (ms) and peak resident memory (KiB) of one `bellstep` process. */
function cli(args: readonly string[]): { ms: number; maxRssKb: number; ok: boolean } {
  const t0 = process.hrtime.bigint();
  // stdout is a pipe, as when CI reads `run --json`: a pipe that held the output in memory would show here
  const r = spawnSync(process.execPath, [RSS_CHILD, BIN, ...args], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 1 << 30, env: { ...process.env, NODE_ENV: 'production' } });
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const m = /max-rss-kb=(\d+)/.exec(r.stderr ?? '');
  return { ms, maxRssKb: m ? Number(m[1]) : NaN, ok: r.status === 0 || r.status === 1 };
}

function best(args: readonly string[], rounds: number): { ms: number; maxRssKb: number } {
  let ms = Infinity;
  let rss = Infinity;
  for (let i = 0; i < rounds; i++) {
    const r = cli(args);
    if (!r.ok) throw new Error(`bellstep ${args.join(' ')} failed`);
    ms = Math.min(ms, r.ms);
    rss = Math.min(rss, r.maxRssKb);
  }
  return { ms, maxRssKb: rss };
}

export default async function engineBench(): Promise<BenchLine[]> {
  const bare = bestBare();
  const { engine: e5, physics } = engineAgainstPhysics(100_000);
  const c5 = chainCost(2, 100_000);
  const c129 = chainCost(7, 100_000);
  const c2049 = chainCost(11, 100_000, 2);

  const dir = mkdtempSync(join(tmpdir(), 'bellstep-bench-'));
  const file = (name: string, text: string): string => {
    const p = join(dir, name);
    writeFileSync(p, text);
    return p;
  };
  const noise = file('chain.noise.yaml', CHAIN_NOISE);
  const net5 = file('chain5.net.yaml', nestedChainWithRoles(2));
  const net129 = file('chain129.net.yaml', nestedChainWithRoles(7));
  const net2049 = file('chain2049.net.yaml', nestedChainWithRoles(11));
  const run = (net: string, ...more: string[]) => ['run', net, '--noise', noise, ...more];
  const whole = best(run(net5, '--events', '300000'), 3);
  const perEventWhole = (whole.ms * 1e6) / 300_000;
  const load129 = best(run(net129, '--events', '100000'), 2);
  const load2049 = best(run(net2049, '--events', '100000'), 2);
  const small = best(run(net5, '--events', '100000'), 2);
  const large = best(run(net5, '--events', '1000000'), 1);
  const smallJson = best(run(net5, '--events', '100000', '--json'), 2);
  const largeJson = best(run(net5, '--events', '1000000', '--json'), 1);

  const mb = (kb: number) => `${(kb / 1024).toFixed(0)} MB`;
  return [
    {
      name: 'bare loop (binary heap on typed arrays, trivial handler)',
      ratio: 1,
      goal: 'reference',
      ok: true,
      detail: `${(1e3 / bare).toFixed(1)} M events/s; ${formatNs(bare)} per event`,
    },
    {
      name: 'physics-only ceiling (the 5-site run\'s kernel calls alone), against the bare loop',
      ratio: bare / physics,
      goal: 'reference',
      ok: true,
      detail: `${formatNs(physics)} per event of the run`,
    },
    {
      name: 'headless engine on the 5-site chain: share of the physics-only ceiling',
      ratio: physics / e5,
      goal: '>= 0.4',
      ok: physics / e5 >= 0.4,
      detail: `${formatNs(e5)} per event with the physics, ${formatNs(physics)} for the physics alone`,
    },
    {
      name: 'headless engine in process, 5-site chain, against the bare loop',
      ratio: bare / c5,
      goal: 'report',
      ok: true,
      detail: `${(1e9 / c5 / 1e3).toFixed(0)} k events/s; ${formatNs(c5)} per event`,
    },
    {
      name: 'whole `bellstep run` process, 5-site chain, 300,000 events (startup included), against the bare loop',
      ratio: bare / perEventWhole,
      goal: '>= 0.03',
      ok: bare / perEventWhole >= 0.03,
      detail: `${(whole.ms / 1000).toFixed(2)} s, ${(300_000 / whole.ms).toFixed(0)} k events/s`,
    },
    {
      name: 'cost per event, 129-site chain against 5-site chain (in process)',
      ratio: c129 / c5,
      goal: '<= 1.5',
      ok: c129 / c5 <= 1.5,
      detail: `${formatNs(c129)} vs ${formatNs(c5)} per event; 2,049 sites: ${formatNs(c2049)}`,
    },
    {
      name: 'whole run, load plus 100,000 events: 2,049-site chain against 129-site chain',
      ratio: load2049.ms / load129.ms,
      goal: '<= 2',
      ok: load2049.ms / load129.ms <= 2,
      detail: `${(load2049.ms / 1000).toFixed(2)} s vs ${(load129.ms / 1000).toFixed(2)} s`,
    },
    {
      name: 'peak RSS of a plain run, 1,000,000 events against 100,000',
      ratio: large.maxRssKb / small.maxRssKb,
      goal: '<= 1.3',
      ok: large.maxRssKb / small.maxRssKb <= 1.3,
      detail: `${mb(large.maxRssKb)} vs ${mb(small.maxRssKb)}`,
    },
    {
      name: 'peak RSS with --json, 1,000,000 events against 100,000',
      ratio: largeJson.maxRssKb / smallJson.maxRssKb,
      goal: '<= 1.3',
      ok: largeJson.maxRssKb / smallJson.maxRssKb <= 1.3,
      detail: `${mb(largeJson.maxRssKb)} vs ${mb(smallJson.maxRssKb)}`,
    },
  ];
}
