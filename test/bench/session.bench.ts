/**
 * Session costs, as ratios measured in one run:
 * - one step forward and one step back on the 5-site chain, against 0.2 ms;
 * - memory of the history per retained event against a deep copy per event (goal ≤ 0.05);
 * - step-back latency against step-forward latency (goal ≤ 1);
 * - going to a random event of a 1,000,000-event history against one step forward
 *   (goal: about 100× or better), and that history's memory against its budget;
 * - bytes per event of a recording on disk (goal ≤ 24);
 * - verify speed against a headless run of the same events (goal ≥ 0.8);
 * - headless speed with recording against without (goal ≥ 0.8).
 */
import type { World } from '../../src/engine/index.js';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseReplay, Recorder } from '../../src/session/replay.js';
import { HISTORY_DEFAULTS } from '../../src/session/history.js';
import { verifyReplay } from '../../src/session/verify.js';
import { runHeadless } from '../../src/session/run.js';
import { Session } from '../../src/session/session.js';
import { engineFrom } from '../engine/scenarios.js';
import { CHAIN_NOISE, nestedChain, nestedChainWithRoles } from './chain.js';
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
  // a first session the same length compiles the code and fills the engine's caches, which
  // are not history and would otherwise be charged to it
  const warm = new Session(engine, { window: n + 10 });
  for (let i = 0; i < n; i++) warm.stepForward();
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

function stepLines(): BenchLine[] {
  const s = new Session(engineFrom(nestedChain(2), CHAIN_NOISE));
  s.goto(20_000);
  const k = 3000;
  const fwd = time(() => {
    for (let i = 0; i < k; i++) s.stepForward();
  }) / k;
  // back through the window, then far back where the window is rebuilt from a keyframe
  const back = time(() => {
    for (let i = 0; i < k; i++) s.stepBack();
  }) / k;
  s.goto(5_000);
  const backFar = time(() => {
    for (let i = 0; i < k; i++) s.stepBack();
  }) / k;
  const budget = 0.2e6;
  return [
    { name: 'one step forward on the 5-site chain (a new event, its digest and record), against 0.2 ms', ratio: fwd / budget, goal: '<= 1', ok: fwd <= budget, detail: formatNs(fwd) },
    { name: 'one step back on the 5-site chain, against 0.2 ms (window held / rebuilt after a jump)', ratio: Math.max(back, backFar) / budget, goal: '<= 1', ok: Math.max(back, backFar) <= budget, detail: `${formatNs(back)} / ${formatNs(backFar)}` },
  ];
}

function diskLines(): BenchLine[] {
  const engine = engineFrom(nestedChain(2), CHAIN_NOISE);
  const n = Number(process.env.BELLSTEP_BENCH_HISTORY ?? 1_000_000);
  let bytes = 0;
  const chunks: string[] = [];
  const rec = new Recorder(engine, { seed: 5, breakpoints: [], expectations: [], limits: { until_ns: null, events: n } }, (c) => {
    bytes += Buffer.byteLength(c);
    chunks.push(c);
  });
  const r = runHeadless(engine, { seed: 5, maxEvents: n, onEvent: (ev, w) => rec.add(ev, w) });
  rec.finish(r.stop);
  const replay = parseReplay(chunks.join(''));
  chunks.length = 0;
  // verify against a headless run of the same events, alternately, best of each
  const m = Math.min(n, 200_000);
  const short: string[] = [];
  const rec2 = new Recorder(engine, { seed: 5, breakpoints: [], expectations: [], limits: { until_ns: null, events: m } }, (c) => void short.push(c));
  rec2.finish(runHeadless(engine, { seed: 5, maxEvents: m, onEvent: (ev, w) => rec2.add(ev, w) }).stop);
  const shortReplay = parseReplay(short.join(''));
  let plain = Infinity;
  let verify = Infinity;
  for (let round = 0; round < 3; round++) {
    heapUsed();
    plain = Math.min(plain, time(() => runHeadless(engine, { seed: 5, maxEvents: m })));
    heapUsed();
    verify = Math.min(verify, time(() => {
      if (!verifyReplay(shortReplay).ok) throw new Error('the recording does not verify');
    }));
  }
  return [
    { name: `bytes per event of a ${n.toLocaleString('en')}-event recording (bellstep/replay@2)`, ratio: bytes / n, goal: '<= 24', ok: bytes / n <= 24, detail: `${(bytes / 1e6).toFixed(1)} MB; ${replay.events.length.toLocaleString('en')} events read back` },
    { name: 'verify speed against a headless run of the same events', ratio: plain / verify, goal: '>= 0.8', ok: plain / verify >= 0.8, detail: `${formatNs(verify / m)} vs ${formatNs(plain / m)} per event` },
  ];
}

function gotoLine(total: number): BenchLine[] {
  const engine = engineFrom(nestedChain(2), CHAIN_NOISE);
  const s = new Session(engine);
  const build = time(() => s.goto(total));
  // one step forward at the frontier (a new event, one produce, one digest)
  let step = Infinity;
  for (let i = 0; i < 200; i++) step = Math.min(step, time(() => s.stepForward()));
  let sum = 0;
  const jumps = 100;
  // the benches before this one leave garbage behind: collect it first, not during a jump
  if (typeof gc === 'function') gc();
  for (let i = 0; i < jumps; i++) {
    // spread evenly (golden-ratio steps): a power-of-two LCG's low bits would land on round
    // event numbers, which are keyframes, far more often than a person's jumps do
    const target = Math.floor(((i + 1) * 0.6180339887498949 % 1) * total);
    sum += time(() => s.goto(target));
  }
  const ratio = sum / jumps / step;
  const budget = HISTORY_DEFAULTS.budgetBytes;
  return [
    {
      name: `go to a random event of a ${total.toLocaleString('en')}-event history, against one step forward`,
      ratio,
      goal: '<= ~100',
      ok: ratio <= 120,
      detail: `${formatNs(sum / jumps)} per jump vs ${formatNs(step)} per step; history built in ${formatNs(build)}; ${s.history.keyframeCount} keyframes`,
    },
    {
      name: `memory the ${total.toLocaleString('en')}-event history keeps for rewind, against its budget (--history-mb ${budget / 2 ** 20})`,
      ratio: s.history.bytes / budget,
      goal: '<= 1',
      ok: s.history.bytes <= budget,
      detail: `${(s.history.bytes / 2 ** 20).toFixed(0)} MiB estimated`,
    },
  ];
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

const here = dirname(fileURLToPath(import.meta.url));

/**
 * The real debugger in tmux (compiled, as the bench builds it): `:go 300000` sent in one piece
 * against the same headless run, and how long Esc takes to stop a longer jump. None when
 * tmux is not installed.
 */
async function terminalLines(): Promise<BenchLine[]> {
  if (spawnSync('tmux', ['-V']).status !== 0) return [];
  const dir = mkdtempSync(join(tmpdir(), 'bellstep-bench-tmux-'));
  const net = join(dir, 'chain.net.yaml');
  const noise = join(dir, 'chain.noise.yaml');
  writeFileSync(net, nestedChainWithRoles(2));
  writeFileSync(noise, CHAIN_NOISE);
  const bin = join(here, '../../src/cli/bin.js');
  const sock = `bellstep-bench-${process.pid}`;
  const tmux = (...args: string[]) => spawnSync('tmux', ['-L', sock, ...args], { encoding: 'utf8' });
  const screen = () => tmux('capture-pane', '-p', '-t', 'b').stdout;
  // each look at the screen starts a tmux client, which takes CPU from the debugger on a
  // 2-core machine (looking every 10 ms made a jump 40 % slower)
  const wait = async (check: () => boolean, every = 50) => {
    for (let waited = 0; waited < 60_000 && !check(); waited += every) await new Promise((r) => setTimeout(r, every));
  };
  tmux('new-session', '-d', '-s', 'b', '-x', '120', '-y', '40', `CI=false NO_COLOR=1 ${process.execPath} ${bin} debug ${net} --noise ${noise}; sleep 30`);
  await wait(() => screen().includes('SITES'));
  let t0 = performance.now();
  tmux('send-keys', '-t', 'b', ':go 300000', 'Enter');
  // the debugger says how long a long operation took ("... events in 2.41 s"), so the screen
  // is read only now and then: each look starts a tmux client that takes CPU from the run
  const took = /events in ([0-9.]+) s\)/;
  await wait(() => took.test(screen()), 500);
  const said = took.exec(screen());
  const jump = said ? Number(said[1]) * 1000 : performance.now() - t0;
  tmux('send-keys', '-t', 'b', ':go 50000000', 'Enter');
  await wait(() => screen().includes('going to event 50000000'));
  await new Promise((r) => setTimeout(r, 500));
  t0 = performance.now();
  tmux('send-keys', '-t', 'b', 'Escape');
  await wait(() => screen().includes('stopped by Esc'));
  const esc = performance.now() - t0;
  tmux('kill-server');
  t0 = performance.now();
  spawnSync(process.execPath, [bin, 'run', net, '--noise', noise, '--events', '300000'], { stdio: 'ignore' });
  const headless = performance.now() - t0;
  return [
    { name: 'debugger `:go 300000` in tmux (5-site chain), against the same headless run', ratio: jump / headless, goal: '<= 1.5', ok: jump / headless <= 1.5, detail: `${(jump / 1000).toFixed(2)} s vs ${(headless / 1000).toFixed(2)} s` },
    { name: 'Esc during a long jump: time until it has stopped, against 1.5 s', ratio: esc / 1500, goal: '<= 1', ok: esc <= 1500, detail: `${esc.toFixed(0)} ms` },
  ];
}

export default async function sessionBench(): Promise<BenchLine[]> {
  const total = Number(process.env.BELLSTEP_BENCH_HISTORY ?? 1_000_000);
  // the million-event history goes last: the garbage it leaves would slow the others down
  return [...stepLines(), memoryLine(), ...latencyLines(), recordingLine(), ...diskLines(), ...(await terminalLines()), ...gotoLine(total)];
}
