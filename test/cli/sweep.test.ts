/**
 * `bellstep sweep` end to end (docs/cli.md): the real CLI in-process, with real worker
 * threads running the TypeScript sources. Small scenarios and few seeds keep it quick.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { parseReplay } from '../../src/session/replay.js';
import { verifyReplay } from '../../src/session/verify.js';
import { runCli, type CliResult } from '../helpers/run-cli.js';
import { noiseWith, purificationNet } from '../engine/scenarios.js';
import { LOOPING_NET, LOSSY_NET, LOSSY_NOISE } from '../sweep/scenarios.js';

const files = {
  'lossy.net.yaml': LOSSY_NET,
  'lossy.noise.yaml': LOSSY_NOISE,
  'pur.net.yaml': purificationNet(),
  'pur.noise.yaml': noiseWith('{werner: 0.9}', '    success: 0.3', 8),
  'loop.net.yaml': LOOPING_NET,
};

const LOSSY = ['sweep', 'lossy.net.yaml', '--noise', 'lossy.noise.yaml', '--until', '3ms'];
const REPORT_KEYS = ['format', 'inputs', 'seeds', 'limits', 'expectations', 'runs', 'stats', 'failures'];
const RUN_KEYS = ['seed', 'outcome', 'events', 'time_ns', 'delivered', 'fidelity_mean', 'signature'];

// worker threads start in about a second under the tests (tsx compiles them), so the lossy
// sweeps that several tests look at run once
let one: CliResult;
let two: CliResult;
beforeAll(async () => {
  one = await runCli([...LOSSY, '--seeds', '1..10', '--workers', '1', '--json'], files);
  two = await runCli([...LOSSY, '--seeds', '1..10', '--workers', '2', '--save-failures', 'out', '--json'], files);
});

describe('bellstep sweep', () => {
  it('gives the same bytes with 1 and 2 workers, with exactly the keys of the sweep file', () => {
    expect(one.code).toBe(1);
    expect(two.code).toBe(1);
    // the second also saved replays: that changes nothing in the JSON
    expect(two.stdout).toBe(one.stdout);
    const r = JSON.parse(one.stdout);
    expect(Object.keys(r)).toEqual(REPORT_KEYS);
    expect(r.format).toBe('bellstep/sweep@1');
    expect(Object.keys(r.inputs)).toEqual(['program_set_sha256', 'noise_sha256']);
    expect(r.seeds).toEqual({ from: 1, to: 10, shard: null, count: 10 });
    expect(r.limits).toEqual({ until_ns: 3_000_000, events: null });
    expect(r.runs.map((x: { seed: number }) => x.seed)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    for (const run of r.runs) expect(Object.keys(run)).toEqual(RUN_KEYS);
    expect(Object.keys(r.stats)).toEqual(['runs', 'failed', 'failure_rate', 'delivered_per_run', 'delivered_per_second', 'fidelity']);
    expect(Object.keys(r.stats.failure_rate)).toEqual(['value', 'low95', 'high95']);
    expect(Object.keys(r.stats.delivered_per_run)).toEqual(['mean', 'p5', 'p50', 'p95']);
    expect(Object.keys(r.stats.fidelity)).toEqual(['mean', 'min', 'p5', 'p50', 'p95']);
    // no wall-clock figures and no paths
    expect(one.stdout).not.toMatch(/lossy\.(net|noise)\.yaml|"ms"|elapsed|duration/);
  });

  it('finds that only some seeds of the lossy handshake stall, all with one signature, and saves replays that verify', () => {
    const r = two;
    expect(r.code).toBe(1);
    const rep = JSON.parse(r.stdout);
    const stalled = rep.runs.filter((x: { outcome: string }) => x.outcome === 'stall');
    const ok = rep.runs.filter((x: { outcome: string }) => x.outcome === 'ok');
    expect(stalled.length).toBeGreaterThan(0);
    expect(ok.length).toBeGreaterThan(0);
    expect(stalled.length + ok.length).toBe(10);
    // one bug: every failing seed has the same signature, naming weir's waiting rule and guard
    expect(rep.failures).toHaveLength(1);
    const [group] = rep.failures;
    expect(group.count).toBe(stalled.length);
    expect(group.seeds).toEqual(stalled.map((x: { seed: number }) => x.seed));
    expect(group.signature).toContain('weir.accept g1: waits for a "ready" message from kiln');
    expect(group.signature).toContain('lost on the channel');
    expect(group.signature).not.toMatch(/#[0-9]|[0-9] ?(us|ms)\b/);
    expect(group.explanation).toContain('The run stalls');
    expect(rep.stats.failed).toBe(stalled.length);
    expect(rep.stats.failure_rate.value).toBe(stalled.length / 10);
    // a replay per failing seed, none for the others; each parses, verifies and stops at the stall
    const written = [...r.files.keys()].filter((k) => k.startsWith('out/')).sort();
    expect(written).toEqual(stalled.map((x: { seed: number }) => `out/seed-${x.seed}.replay.json`).sort());
    for (const x of stalled) {
      const replay = parseReplay(r.files.get(`out/seed-${x.seed}.replay.json`)!);
      expect(replay.seed).toBe(x.seed);
      expect(replay.stop.reason).toBe('stall');
      expect(replay.events).toHaveLength(x.events);
      expect(verifyReplay(replay).ok).toBe(true);
    }
    expect(r.stderr).toContain('replays of the failing seeds written to out');
  });

  it('closes with a table of signatures and a debug command that opens the replay at the failure', async () => {
    const r = await runCli([...LOSSY, '--seeds', '1..10', '--workers', '2', '--save-failures', 'out'], files);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/^sweep of seeds 1\.\.10 \(10 seeds\): \d+ passed, \d+ failed$/m);
    expect(r.stdout).toMatch(/^#\s+seeds\s+first\s+outcome\s+signature$/m);
    const cmd = /open the first: (bellstep debug --replay (\S+) --at (\d+))/.exec(r.stdout)!;
    const replay = parseReplay(r.files.get(cmd[2])!);
    expect(Number(cmd[3])).toBe(replay.events.length - 1);
    // the command is accepted as written; without a terminal the debugger says it needs one
    const opened = await runCli(cmd[1].split(' ').slice(1), Object.fromEntries(r.files));
    expect(opened.code).toBe(2);
    expect(opened.stderr).toContain('the debugger needs an interactive terminal');
  });

  it('runs each seed exactly as bellstep run does, and exits 0 when every seed passes', async () => {
    const s = await runCli(['sweep', 'pur.net.yaml', '--noise', 'pur.noise.yaml', '--seeds', '5..7', '--events', '300', '--expect', 'delivered() >= 1', '--workers', '2', '--json'], files);
    expect(s.code).toBe(0);
    expect(JSON.parse(s.stdout).failures).toEqual([]);
    expect(JSON.parse(s.stdout).stats.failure_rate.low95).toBe(0);
    const runs = JSON.parse(s.stdout).runs;
    for (const seed of [5, 6, 7]) {
      const one = await runCli(['run', 'pur.net.yaml', '--noise', 'pur.noise.yaml', '--seed', String(seed), '--events', '300', '--expect', 'delivered() >= 1', '--json'], files);
      const sum = JSON.parse(one.stdout);
      const mean = sum.delivered.reduce((a: number, d: { fidelity: number }) => a + d.fidelity, 0) / sum.delivered.length;
      expect(runs[seed - 5]).toEqual({ seed, outcome: one.code === 0 ? 'ok' : 'failed', events: sum.events, time_ns: sum.time_ns, delivered: sum.delivered.length, fidelity_mean: mean, signature: one.code === 0 ? null : expect.any(String) });
    }
  });

  it('groups failed expectations by the expressions that failed', async () => {
    const base = ['sweep', 'pur.net.yaml', '--noise', 'pur.noise.yaml', '--seeds', '1..4', '--events', '200', '--workers', '2', '--json'];
    const bad = await runCli([...base, '--expect', 'delivered() >= 1', '--expect', 'delivered() > 100000'], files);
    expect(bad.code).toBe(1);
    const r = JSON.parse(bad.stdout);
    expect(r.failures).toEqual([{ signature: 'expect | delivered() > 100000', count: 4, seeds: [1, 2, 3, 4], explanation: 'The run ends without a stall, but this expectation does not hold at its end: delivered() > 100000.' }]);
    expect(r.runs.every((x: { outcome: string }) => x.outcome === 'failed')).toBe(true);
  });

  it('reports a run-time program error as that seed’s error and goes on', async () => {
    const r = await runCli(['sweep', 'loop.net.yaml', '--seeds', '1..3', '--workers', '2', '--save-failures', 'out', '--json'], files);
    expect(r.code).toBe(1);
    const rep = JSON.parse(r.stdout);
    expect(rep.runs.map((x: { outcome: string }) => x.outcome)).toEqual(['error', 'error', 'error']);
    expect(rep.failures[0].signature).toBe('error | kiln.spin: rule loop: fired more than N times within one event (last: spin, before it: spin)');
    // erred runs have no summary: rates leave them out, and say so with null
    expect(rep.stats.delivered_per_run).toEqual({ mean: null, p5: null, p50: null, p95: null });
    // the replay holds the events before the error
    const replay = parseReplay(r.files.get('out/seed-1.replay.json')!);
    expect(replay.events.length).toBe(rep.runs[0].events);
    expect(verifyReplay(replay).ok).toBe(true);
  });

  it('takes one shard of the range, and a shard with no seeds is an empty, passing file', async () => {
    const r = await runCli([...LOSSY, '--seeds', '1..10', '--shard', '2/3', '--workers', '1', '--json'], files);
    const rep = JSON.parse(r.stdout);
    expect(rep.seeds).toEqual({ from: 1, to: 10, shard: '2/3', count: 3 });
    expect(rep.runs.map((x: { seed: number }) => x.seed)).toEqual([2, 5, 8]);
    const empty = await runCli([...LOSSY, '--seeds', '1..2', '--shard', '3/3', '--json'], files);
    expect(empty.code).toBe(0);
    const e = JSON.parse(empty.stdout);
    expect(e.seeds.count).toBe(0);
    expect(e.runs).toEqual([]);
    expect(e.stats.failure_rate).toEqual({ value: null, low95: null, high95: null });
  });

  it('shows a progress bar on a terminal and stays quiet in a short log', async () => {
    const tty = await runCli([...LOSSY, '--seeds', '1..4', '--workers', '1', '--json'], files, { stderrIsTTY: true });
    expect(tty.stderr).toMatch(/\r\[#+\.*\] \d\/4 seeds {2}\d+ failed/);
    expect(tty.stderr).toContain('\r\x1b[K');
    // not a terminal and done within seconds: only the one-line total
    expect(one.stderr).not.toContain('\r');
    expect(one.stderr).toBe(`sweep: 10 seeds, ${JSON.parse(one.stdout).stats.failed} failed, 1 signature\n`);
  });

  it('refuses bad usage with exit 2, naming the flag, without a stack trace', async () => {
    const cases: [string[], RegExp][] = [
      [['--seeds', '10..1'], /--seeds: the range "10\.\.1" runs backwards/],
      [['--seeds', 'x'], /--seeds: expected a range A\.\.B/],
      [[], /--seeds: a sweep needs a range of seeds/],
      [['--seeds', '1..5', '--shard', '0/3'], /--shard: shard 0 of 3 does not exist/],
      [['--seeds', '1..5', '--shard', '4/3'], /--shard: shard 4 of 3 does not exist/],
      [['--seeds', '1..5', '--workers', '0'], /--workers: expected a positive integer, got "0"/],
      [['--seeds', '1..5', '--workers', '9999'], /--workers: 9999 workers is more than 256/],
      [['--seeds', '1..5', '--expect', 'delivered( >= 1'], /--expect/],
      [['--seeds', '1..5', '--break', 'nosuch(1)'], /--break/],
      [['--seeds', '1..5', '--junit', 'lossy.noise.yaml'], /--junit: lossy\.noise\.yaml is also an input/],
      [['--seeds', '1..5', '--save-failures', 'lossy.net.yaml'], /--save-failures: lossy\.net\.yaml is also an input/],
    ];
    for (const [extra, msg] of cases) {
      const r = await runCli([...LOSSY, ...extra], files);
      expect(r.code, extra.join(' ')).toBe(2);
      expect(r.stderr, extra.join(' ')).toMatch(msg);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    }
    const missing = await runCli(['sweep', 'nope.net.yaml', '--seeds', '1..3'], files);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain('nope.net.yaml: cannot read the program set: no such file');
  });
});
