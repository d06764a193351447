/** `bellstep run`: flags, exit codes and the JSON summary contract (docs/cli.md). */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { noiseWith, purificationNet, SWAP_NET } from '../engine/scenarios.js';

const files = {
  'swap.net.yaml': SWAP_NET,
  'pur.net.yaml': purificationNet(),
  'pur.noise.yaml': noiseWith('{werner: 0.9}', '', 8),
};

/** §6's keys in their order, then the run statistics of §9. */
const SUMMARY_KEYS = ['format', 'seed', 'events', 'time_ns', 'stop', 'delivered', 'fired', 'messages', 'generated', 'expectations', 'stall', 'stats'];

describe('bellstep run', () => {
  it('prints a summary with exactly the keys docs/cli.md lists, then stats', async () => {
    const r = await runCli(['run', 'pur.net.yaml', '--noise', 'pur.noise.yaml', '--events', '500', '--json'], files);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(Object.keys(s)).toEqual(SUMMARY_KEYS);
    expect(s.format).toBe('bellstep/run-summary@1');
    expect(s.seed).toBe(8);
    expect(s.events).toBe(500);
    expect(s.stop.reason).toBe('events');
    expect(Object.keys(s.messages)).toEqual(['sent', 'delivered', 'dropped']);
    expect(Object.keys(s.delivered[0])).toEqual(['id', 'ends', 'time_ns', 'fidelity', 'bell']);
    expect(s.generated['kiln~weir']).toBeGreaterThan(0);
    expect(s.fired.kiln.start).toBeGreaterThan(0);
    expect(s.stall).toBeNull();
  });

  it('lets --seed override the noise model and gives the same bytes twice', async () => {
    const a = await runCli(['run', 'pur.net.yaml', '--noise', 'pur.noise.yaml', '--seed', '99', '--events', '300', '--json'], files);
    const b = await runCli(['run', 'pur.net.yaml', '--noise', 'pur.noise.yaml', '--seed', '99', '--events', '300', '--json'], files);
    expect(JSON.parse(a.stdout).seed).toBe(99);
    expect(a.stdout).toBe(b.stdout);
  });

  it('stops before the first event after --until, given with or without a space', async () => {
    for (const until of ['2ms', '2 ms']) {
      const r = await runCli(['run', 'swap.net.yaml', '--until', until, '--json'], files);
      const s = JSON.parse(r.stdout);
      expect(s.stop.reason).toBe('until');
      expect(s.time_ns).toBeLessThanOrEqual(2_000_000);
      expect(s.events).toBeGreaterThan(3);
    }
  });

  it('stops at a breakpoint and says which one', async () => {
    const r = await runCli(['run', 'swap.net.yaml', '--break', 'delivered() >= 3', '--json'], files);
    const s = JSON.parse(r.stdout);
    expect(r.code).toBe(0);
    expect(s.stop.reason).toBe('breakpoint');
    expect(s.stop.detail).toContain('delivered() >= 3');
    expect(s.delivered.length).toBe(3);
  });

  it('stops at an event-form breakpoint', async () => {
    const r = await runCli(['run', 'swap.net.yaml', '--break', 'on fire mill.swap', '--json'], files);
    const s = JSON.parse(r.stdout);
    expect(s.stop.reason).toBe('breakpoint');
    expect(s.fired.mill.swap).toBe(1);
  });

  it('exits 1 when an expectation fails and 0 when all hold', async () => {
    const ok = await runCli(['run', 'swap.net.yaml', '--events', '400', '--expect', 'delivered(quay, ridge) >= 5', '--expect', 'min_fidelity_delivered() > 0.99', '--json'], files);
    expect(ok.code).toBe(0);
    expect(JSON.parse(ok.stdout).expectations.map((e: { ok: boolean }) => e.ok)).toEqual([true, true]);
    const bad = await runCli(['run', 'swap.net.yaml', '--events', '400', '--expect', 'delivered() > 100000'], files);
    expect(bad.code).toBe(1);
    expect(bad.stdout).toContain('FAIL delivered() > 100000');
  });

  it('writes progress and notes to stderr, never into the JSON on stdout', async () => {
    const r = await runCli(['run', 'swap.net.yaml', '--events', '200', '--record', 'out.replay.json', '--json'], files);
    expect(() => JSON.parse(r.stdout)).not.toThrow();
    expect(r.stderr).toContain('replay written to out.replay.json');
    expect(r.files.get('out.replay.json')).toContain('"format": "bellstep/replay@2"');
  });

  it('gives the same summary with or without --record', async () => {
    const a = await runCli(['run', 'swap.net.yaml', '--events', '300', '--json'], files);
    const b = await runCli(['run', 'swap.net.yaml', '--events', '300', '--json', '--record', 'x.replay.json'], files);
    expect(a.stdout).toBe(b.stdout);
  });

  it('refuses bad flags with exit 2 and a fix', async () => {
    const cases: [string[], string][] = [
      [['run', 'swap.net.yaml', '--seed', 'abc'], '--seed: expected a non-negative integer'],
      [['run', 'swap.net.yaml', '--until', '60'], '--until'],
      [['run', 'swap.net.yaml', '--events', '0'], '--events: expected a positive integer'],
      [['run', 'swap.net.yaml', '--break', 'on fire mill.swp'], 'mill has no rule "swp" (did you mean "swap"?)'],
      [['run', 'swap.net.yaml', '--break', 'delivered( >= 3'], '--break: unexpected ">=" at column 12'],
      [['run', 'swap.net.yaml', '--expect', 'fidelty("x") > 1'], 'unknown function "fidelty"'],
      [['run', 'missing.net.yaml'], 'missing.net.yaml: cannot read the program set: no such file'],
      [['run'], "missing required argument"],
      [['run', 'swap.net.yaml', '--colour'], "unknown option '--colour'"],
    ];
    for (const [argv, fragment] of cases) {
      const r = await runCli(argv, files);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.stderr, argv.join(' ')).toContain(fragment);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    }
  });

  it('reports a rule loop as a program error naming the rule, exit 2', async () => {
    const loop = SWAP_NET.replace(
      '  quay:\n    rules:\n',
      '  quay:\n    rules:\n      - name: spin\n        when: [{check: "true"}]\n        do: [{log: "again"}]\n',
    );
    const r = await runCli(['run', 'loop.net.yaml', '--events', '50'], { 'loop.net.yaml': loop });
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/loop\.net\.yaml:\d+:\d+: quay\.spin: rule loop/);
    expect(r.stderr).toContain('fix:');
  });
});
