/**
 * Expectations and breakpoints are checked against the network before anything runs
 * (names, functions, number and kind of arguments, with the column and the nearest name),
 * and a failing expectation shows what it saw, in text, JSON and JUnit alike.
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/model/errors.js';
import { Session } from '../../src/session/session.js';
import { engineFrom, SWAP_NET } from '../engine/scenarios.js';
import { runCli } from '../helpers/run-cli.js';

const files = { 'swap.net.yaml': SWAP_NET };

async function refused(flag: '--expect' | '--break', text: string, says: RegExp): Promise<string> {
  // a million events would take a while: a refusal must come before any of them
  const t0 = Date.now();
  const r = await runCli(['run', 'swap.net.yaml', '--events', '1000000', flag, text], files);
  expect(r.code, r.stderr).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr).toMatch(says);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  expect(Date.now() - t0).toBeLessThan(5000);
  return r.stderr;
}

describe('checked before anything runs', () => {
  it('an unknown function, with its column and the nearest name', async () => {
    const err = await refused('--expect', 'deliverd() > 1', /--expect: unknown function "deliverd" \(did you mean "delivered"\?\) at column 1 of "deliverd\(\) > 1"/);
    expect(err).toContain('deliverd() > 1\n       ^^^^^^^^^^');
  });

  it('a wrong number of arguments, which used to be silently false', async () => {
    await refused('--expect', 'delivered(quay, ridge, mill) > 0', /delivered\(\) takes 0 to 2 arguments, got 3: write delivered\(a\?, b\?\) at column 1/);
    await refused('--break', 'fired(mill) > 0', /fired\(\) takes 2 arguments, got 1/);
  });

  it('an unknown node or rule, with the nearest', async () => {
    await refused('--expect', 'pairs(mil) > 0', /unknown node "mil" \(did you mean "mill"\?\) at column 7/);
    await refused('--expect', 'fired(mill, "swapp") > 0', /mill has no rule "swapp" \(did you mean "swap"\?\) at column 13/);
    await refused('--expect', 'fired(mill, swap) > 0', /fired\(\) takes a rule name in quotes: write "swap"/);
    await refused('--expect', 'delivered(qaay) > 0', /unknown node "qaay" \(did you mean "quay"\?\)/);
  });

  it('an unknown name in an expectation, which has no pair variables', async () => {
    await refused('--expect', 'fidelity(p) > 0.9', /unknown name "p"/);
    await refused('--expect', 'millx == 1', /unknown name "millx" \(did you mean "mill"\?\)/);
  });

  it('a function of node programs in a breakpoint', async () => {
    await refused('--break', 'age(p) > 5', /age\(\) is a function of node programs, not of a breakpoint/);
  });

  it('the same for a breakpoint typed in the debugger', () => {
    const s = new Session(engineFrom(SWAP_NET));
    expect(() => s.addBreakpoint('delivered(quay, ridge, mill) > 1')).toThrow(InputError);
    expect(() => s.addBreakpoint('delivered(quay, ridge, mill) > 1')).toThrow(/takes 0 to 2 arguments, got 3: write delivered\(a\?, b\?\) at column 1/);
    expect(() => s.addBreakpoint('fidelity(p) < 0.9 && pairs(ridg) > 0')).toThrow(/unknown node "ridg" \(did you mean "ridge"\?\) at column 28/);
    expect(s.breakpoints()).toHaveLength(0);
    expect(() => s.addBreakpoint('fidelity(p) < 0.9')).not.toThrow();
  });

  it('the arity of functions in program files too, at file:line:col', async () => {
    const net = SWAP_NET.replace('correct: {pair: p, x: m.x, z: m.z}', 'correct: {pair: p, x: "xor(m.x)", z: m.z}');
    const r = await runCli(['check', 'n.net.yaml'], { 'n.net.yaml': net });
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/n\.net\.yaml:\d+:\d+: programs\.ridge\.rules\[0\]\.do\[0\]\.correct\.x: in expression "xor\(m\.x\)": xor\(\) takes 2 arguments, got 1: write xor\(a, b\)/);
  });
});

describe('what a failing expectation saw', () => {
  it('shows the compared values in the text report and in the JSON "saw", keeping "value"', async () => {
    const text = await runCli(['run', 'swap.net.yaml', '--events', '60', '--expect', 'delivered() > 1000', '--expect', 'delivered() >= 1'], files);
    expect(text.code).toBe(1);
    const json = await runCli(['run', 'swap.net.yaml', '--events', '60', '--json', '--expect', 'delivered() > 1000', '--expect', 'delivered() >= 1'], files);
    const s = JSON.parse(json.stdout);
    const n = s.delivered.length;
    expect(n).toBeGreaterThan(0);
    expect(text.stdout).toContain(`FAIL delivered() > 1000 (delivered() = ${n})`);
    expect(text.stdout).toContain(`ok   delivered() >= 1 (delivered() = ${n})`);
    expect(s.expectations[0]).toEqual({ expr: 'delivered() > 1000', ok: false, value: false, saw: [{ expr: 'delivered()', value: n }] });
  });

  it('shows both sides of a comparison and the parts of && and !', async () => {
    const r = await runCli(['run', 'swap.net.yaml', '--events', '60', '--json', '--expect', 'fired(mill, "swap") < delivered() && !stalled()'], files);
    const e = JSON.parse(r.stdout).expectations[0];
    expect(e.saw.map((x: { expr: string }) => x.expr)).toEqual(['fired(mill, "swap")', 'delivered()', 'stalled()']);
  });

  it('says the same in the JUnit report of replay --verify', async () => {
    const rec = await runCli(['run', 'swap.net.yaml', '--events', '60', '--expect', 'delivered() > 1000', '--record', 'r.json'], files);
    const n = /delivered\(\) = (\d+)/.exec(rec.stdout)![1];
    const v = await runCli(['replay', 'r.json', '--verify', '--junit', 'out.xml'], { 'r.json': rec.files.get('r.json')! });
    expect(v.code).toBe(1);
    expect(v.stdout).toContain(`FAIL delivered() > 1000 (delivered() = ${n})`);
    expect(v.files.get('out.xml')).toContain(`message="FAIL delivered() &gt; 1000 (delivered() = ${n})"`);
  });
});
