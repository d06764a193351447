/**
 * The library (src/index.ts): exactly the public names, the same results as the CLI for the
 * same arguments, and input errors whose issues say where and how to fix.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import * as bellstep from '../../src/index.js';
import { check, InputError, load, loadText, openSession, run, sweep } from '../../src/index.js';
import { runCli } from '../helpers/run-cli.js';
import { LOSSY_NET, LOSSY_NOISE } from '../sweep/scenarios.js';

const NET = 'demos/two-site-purification/purify.net.yaml';
const NOISE = 'demos/two-site-purification/purify.noise.yaml';
const files = { [NET]: readFileSync(NET, 'utf8'), [NOISE]: readFileSync(NOISE, 'utf8') };

/** The error `fn` throws, failing the test when it throws none. */
function thrown(fn: () => unknown): unknown {
  try {
    fn();
  } catch (e) {
    return e;
  }
  throw new Error('expected an error');
}

describe('the library', () => {
  it('exports exactly load, loadText, check, run, sweep, openSession and InputError', () => {
    expect(Object.keys(bellstep).sort()).toEqual(['InputError', 'check', 'load', 'loadText', 'openSession', 'run', 'sweep']);
  });

  it('run returns exactly what run --json prints, for the same arguments', async () => {
    const cli = await runCli(['run', NET, '--noise', NOISE, '--seed', '7', '--until', '5ms', '--expect', 'delivered() >= 1', '--break', 'delivered() >= 30', '--json'], files);
    const summary = run(load(NET, { noise: NOISE }), { seed: 7, until: '5ms', expect: ['delivered() >= 1'], breaks: ['delivered() >= 30'] });
    expect(`${JSON.stringify(summary, null, 2)}\n`).toBe(cli.stdout);
    expect(summary.delivered.length).toBeGreaterThan(0);
    // a duration may also be whole nanoseconds
    expect(run(load(NET, { noise: NOISE }), { seed: 7, until: 5_000_000, expect: ['delivered() >= 1'], breaks: ['delivered() >= 30'] })).toEqual(summary);
  });

  it('run uses the noise model’s seed unless given one, as the CLI does', async () => {
    const cli = await runCli(['run', NET, '--noise', NOISE, '--events', '300', '--json'], files);
    const inputs = loadText({ programSet: files[NET], noise: files[NOISE] });
    expect(inputs.noise.seed).toBe(JSON.parse(cli.stdout).seed);
    expect(`${JSON.stringify(run(inputs, { events: 300 }), null, 2)}\n`).toBe(cli.stdout);
  });

  it('check gives the findings of check --json', async () => {
    const net = files[NET].replace('kind: verdict', 'kind: verdikt');
    const cli = await runCli(['check', 'p.net.yaml', '--json'], { 'p.net.yaml': net });
    expect(cli.code).toBe(1);
    const findings = check(loadText({ programSet: net, programSetFile: 'p.net.yaml' }));
    expect(findings.length).toBeGreaterThan(0);
    expect(JSON.parse(JSON.stringify(findings))).toEqual(JSON.parse(cli.stdout).findings);
  });

  it('sweep gives the sweep file of sweep --json', async () => {
    const sweepFiles = { 'lossy.net.yaml': LOSSY_NET, 'lossy.noise.yaml': LOSSY_NOISE };
    const cli = await runCli(['sweep', 'lossy.net.yaml', '--noise', 'lossy.noise.yaml', '--until', '3ms', '--seeds', '1..4', '--workers', '1', '--expect', 'delivered() >= 1', '--json'], sweepFiles);
    const inputs = loadText({ programSet: LOSSY_NET, noise: LOSSY_NOISE, programSetFile: 'lossy.net.yaml', noiseFile: 'lossy.noise.yaml' });
    const report = await sweep(inputs, { seeds: { from: 1, to: 4 }, workers: 1, until: '3ms', expect: ['delivered() >= 1'] });
    expect(report).toEqual(JSON.parse(cli.stdout));
    expect(report.runs.map((r) => r.seed)).toEqual([1, 2, 3, 4]);
  });

  it('openSession steps, goes back, jumps and explains, as the debugger does', () => {
    const s = openSession(load(NET, { noise: NOISE }), { seed: 7 });
    expect(s.seed).toBe(7);
    const bp = s.addBreakpoint('delivered() >= 1');
    expect(s.stepForward()).toBe(true);
    expect(s.stepForward()).toBe(true);
    expect(s.cursor).toBe(2);
    expect(s.stepBack()).toBe(true);
    s.goto(3);
    expect(s.cursor).toBe(3);
    expect(s.continue().breakpoint).toBe(bp.id);
    expect(s.explain('fen').length).toBeGreaterThan(0);
    // the same run as run() with the same seed
    const summary = run(load(NET, { noise: NOISE }), { seed: 7, events: s.cursor });
    expect(summary.delivered.length).toBe(1);
  });
});

describe('input errors', () => {
  it('list every problem with file, line, column, field, message and fix, as the CLI prints them', async () => {
    const net = files[NET].replace('length: 6 km', 'length: 6').replace('qubits: 2', 'qubits: many');
    const noise = files[NOISE].replace('seed:', 'sede:');
    const e = thrown(() => loadText({ programSet: net, noise, programSetFile: 'bad.net.yaml', noiseFile: 'bad.noise.yaml' }));
    expect(e).toBeInstanceOf(InputError);
    const issues = (e as InputError).issues;
    expect(issues.length).toBeGreaterThanOrEqual(3);
    for (const i of issues) {
      expect(Object.keys(i)).toEqual(['file', 'line', 'column', 'field', 'message', 'fix']);
      expect(i.file).toMatch(/^bad\.(net|noise)\.yaml$/);
      expect(i.line).toBeGreaterThan(0);
      expect(i.column).toBeGreaterThan(0);
      expect(i.field).toBeTruthy();
      expect(i.fix).toBeTruthy();
    }
    expect(issues.map((i) => i.file)).toContain('bad.noise.yaml');
    const cli = await runCli(['check', 'bad.net.yaml', '--noise', 'bad.noise.yaml'], { 'bad.net.yaml': net, 'bad.noise.yaml': noise });
    expect(cli.code).toBe(2);
    for (const i of issues) {
      expect(cli.stderr).toContain(`${i.file}:${i.line}:${i.column}: ${i.field}: ${i.message}`);
      expect(cli.stderr).toContain(`fix: ${i.fix}`);
    }
  });

  it('name the file that cannot be read', () => {
    const e = thrown(() => load('no/such.net.yaml')) as InputError;
    expect(e).toBeInstanceOf(InputError);
    expect(e.issues).toEqual([{ file: 'no/such.net.yaml', line: null, column: null, field: null, message: 'cannot read the program set: no such file', fix: 'check the path of the program set' }]);
  });

  it('name the option that is wrong', () => {
    const inputs = load(NET, { noise: NOISE });
    const cases: [() => unknown, string, RegExp][] = [
      [() => run(inputs, { until: '5' }), 'until', /unit/],
      [() => run(inputs, { until: -3 }), 'until', /whole nanoseconds/],
      [() => run(inputs, { seed: 1.5 }), 'seed', /whole number/],
      [() => run(inputs, { events: 0 }), 'events', /1 or more/],
      [() => run(inputs, { expect: ['delivered( >= 1'] }), 'expect', /column/],
      [() => run(inputs, { breaks: ['on fire nowhere.swap'] }), 'breaks', /nowhere/],
      [() => openSession(inputs, { seed: -1 }), 'seed', /whole number/],
      [() => run({ programSet: { file: 'x', title: '', sites: [] }, noise: { file: null, seed: 1 } }), 'inputs', /load or loadText/],
    ];
    for (const [fn, field, message] of cases) {
      const e = thrown(fn) as InputError;
      expect(e, field).toBeInstanceOf(InputError);
      expect(e.issues[0].field).toBe(field);
      expect(e.issues[0].message).toMatch(message);
    }
  });

  it('reject a bad sweep range before any worker starts', async () => {
    const inputs = load(NET, { noise: NOISE });
    await expect(sweep(inputs, { seeds: '9..3' })).rejects.toThrow(/backwards/);
    await expect(sweep(inputs, { seeds: '1..3', shard: { index: 5, count: 4 } })).rejects.toBeInstanceOf(InputError);
  });
});
