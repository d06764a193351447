/**
 * `bellstep merge` (docs/cli.md): the shards of a range join into the bytes of one sweep
 * over it, and files that do not belong together are refused with exit 2, saying which.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { LOSSY_NET, LOSSY_NOISE } from '../sweep/scenarios.js';

const files: Record<string, string> = { 'lossy.net.yaml': LOSSY_NET, 'lossy.noise.yaml': LOSSY_NOISE, 'other.noise.yaml': LOSSY_NOISE.replace('loss: 0.02', 'loss: 0.05') };
const SWEEP = ['sweep', 'lossy.net.yaml', '--noise', 'lossy.noise.yaml', '--until', '3ms', '--seeds', '1..9', '--workers', '1', '--json'];

const out: Record<string, string> = {};
beforeAll(async () => {
  // four real sweeps: the whole range and its three shards; plus a shard on another noise model
  const runs: [string, string[]][] = [
    ['whole.json', SWEEP],
    ['s1.json', [...SWEEP, '--shard', '1/3']],
    ['s2.json', [...SWEEP, '--shard', '2/3']],
    ['s3.json', [...SWEEP, '--shard', '3/3']],
    ['foreign.json', [...SWEEP.map((a) => (a === 'lossy.noise.yaml' ? 'other.noise.yaml' : a)), '--shard', '2/3']],
  ];
  for (const [name, argv] of runs) out[name] = (await runCli(argv, files)).stdout;
});

const merge = (names: string[], extra: string[] = [], more: Record<string, string> = {}) =>
  runCli(['merge', ...names, ...extra], { ...out, ...more });

describe('bellstep merge', () => {
  it('joins three shards into the bytes of one sweep over the whole range, in any order', async () => {
    const whole = out['whole.json'];
    expect(JSON.parse(whole).failures.length).toBeGreaterThan(0);
    const m = await merge(['s1.json', 's2.json', 's3.json', '--json']);
    expect(m.code).toBe(1);
    expect(m.stdout).toBe(whole);
    const shuffled = await merge(['s3.json', 's1.json', 's2.json', '--json']);
    expect(shuffled.stdout).toBe(whole);
    // each shard holds only its seeds; the merge says it is a whole range
    expect(JSON.parse(out['s2.json']).seeds).toEqual({ from: 1, to: 9, shard: '2/3', count: 3 });
    expect(JSON.parse(m.stdout).seeds).toEqual({ from: 1, to: 9, shard: null, count: 9 });
  });

  it('merges one whole sweep into itself, and adjacent ranges into their union', async () => {
    expect((await merge(['whole.json', '--json'])).stdout).toBe(out['whole.json']);
    // two range files cut from the whole one; their stale stats do not matter, merge recomputes them
    const whole = JSON.parse(out['whole.json']);
    const low = { ...whole, seeds: { from: 1, to: 3, shard: null, count: 3 }, runs: whole.runs.slice(0, 3), failures: [] as unknown[] };
    const high = { ...whole, seeds: { from: 4, to: 9, shard: null, count: 6 }, runs: whole.runs.slice(3) };
    low.failures = whole.failures.map((f: { seeds: number[] }) => ({ ...f, seeds: f.seeds.filter((s) => s <= 3) })).filter((f: { seeds: number[] }) => f.seeds.length);
    high.failures = whole.failures.map((f: { seeds: number[] }) => ({ ...f, seeds: f.seeds.filter((s) => s > 3) })).filter((f: { seeds: number[] }) => f.seeds.length);
    const m = await merge(['low.json', 'high.json', '--json'], [], { 'low.json': JSON.stringify(low), 'high.json': JSON.stringify(high) });
    expect(m.stdout).toBe(out['whole.json']);
  });

  it('refuses overlapping shards, naming both files and the seeds', async () => {
    const twice = await merge(['s1.json', 's2.json', 's1.json', 's3.json'], [], {});
    expect(twice.code).toBe(2);
    expect(twice.stderr).toContain('s1.json: seeds: covers seeds 1, 4, 7 that s1.json covers too');
    const overlap = await merge(['whole.json', 's2.json']);
    expect(overlap.code).toBe(2);
    expect(overlap.stderr).toContain('s2.json: seeds: covers seeds 2, 5, 8 that whole.json covers too');
    expect(overlap.stderr).not.toMatch(/\n\s+at /);
  });

  it('refuses files of other inputs, limits or expectations, saying what differs', async () => {
    const foreign = await merge(['s1.json', 'foreign.json', 's3.json']);
    expect(foreign.code).toBe(2);
    expect(foreign.stderr).toMatch(/foreign\.json: inputs: was run on other inputs than s1\.json \(noise_sha256 "[0-9a-f]{64}" against "[0-9a-f]{64}"\)/);
    const s2 = JSON.parse(out['s2.json']);
    const limits = await merge(['s1.json', 'x.json', 's3.json'], [], { 'x.json': JSON.stringify({ ...s2, limits: { until_ns: 5000000, events: null } }) });
    expect(limits.code).toBe(2);
    expect(limits.stderr).toContain('x.json: limits: has other limits than s1.json (until_ns 5000000 against 3000000)');
    const expects = await merge(['s1.json', 'x.json', 's3.json'], [], { 'x.json': JSON.stringify({ ...s2, expectations: ['delivered() >= 1'] }) });
    expect(expects.code).toBe(2);
    expect(expects.stderr).toContain('x.json: expectations: has other expectations than s1.json');
  });

  it('refuses a range with holes and names the missing shard', async () => {
    const r = await merge(['s1.json', 's3.json']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('seeds: the files leave 3 seeds of 1..9 uncovered: 2, 5, 8 (shard 2/3 is not among the files)');
    // a missing last shard leaves a hole too, though the rest would be contiguous
    const last = await merge(['s1.json', 's2.json']);
    expect(last.code).toBe(2);
    expect(last.stderr).toContain('shard 3/3 is not among the files');
  });

  it('refuses files that are not whole sweep files', async () => {
    const s2 = JSON.parse(out['s2.json']);
    const cases: [string, RegExp][] = [
      ['{"format": "bellstep/replay@1"}', /x\.json: format: not a sweep file \(format is "bellstep\/replay@1"\)/],
      ['{nope', /x\.json: not valid JSON/],
      [JSON.stringify({ ...s2, runs: s2.runs.slice(1) }), /x\.json: runs: holds 2 runs, but shard 2\/3 of 1\.\.9 has 3 seeds \(seed 2 is missing\)/],
      [JSON.stringify({ ...s2, runs: [...s2.runs.slice(1), { ...s2.runs[0], seed: 3 }] }), /x\.json: runs: seed 3 does not belong to shard 2\/3 of 1\.\.9/],
      [JSON.stringify({ ...s2, runs: s2.runs.map((r: object) => ({ ...r, outcome: 'maybe' })) }), /x\.json: runs\[0\]\.outcome: is "maybe"/],
    ];
    for (const [text, msg] of cases) {
      const r = await merge(['x.json'], [], { 'x.json': text });
      expect(r.code, text.slice(0, 40)).toBe(2);
      expect(r.stderr).toMatch(msg);
    }
    const missing = await merge(['nope.json']);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain('nope.json: cannot read the sweep file: no such file');
  });

  it('prints the closing table with the replay names of each job’s folder', async () => {
    const m = await merge(['s1.json', 's2.json', 's3.json']);
    expect(m.code).toBe(1);
    expect(m.stdout).toMatch(/^sweep of seeds 1\.\.9 \(9 seeds\): \d+ passed, \d+ failed$/m);
    const first = JSON.parse(out['whole.json']).failures[0].seeds[0];
    expect(m.stdout).toMatch(new RegExp(`open the first: bellstep debug --replay seed-${first}\\.replay\\.json --at \\d+`));
  });
});
