/**
 * A property over random mutations of the demos' files (a fixed seed, a bounded number of
 * cases): bellstep never crashes (exit 3 or a stack trace), never hangs, and never stops a
 * run with a program error that `check` accepted. Every class of mistake this found is now
 * reported by check or refused at load (test/model/lint-body.test.ts, numbers.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { loadDemo, DEMO_NAMES } from '../demos/demo-files.js';
import { runCli } from '../helpers/run-cli.js';
import { generator, mutate } from './mutate.js';

const CASES = 150;
const SEED = 20261202;

describe('random mutations of the demos', () => {
  it(`never crash, hang or fail at run time after check accepted them (${CASES} cases)`, async () => {
    const demos = DEMO_NAMES.map(loadDemo);
    const rnd = generator(SEED);
    let accepted = 0;
    let refused = 0;
    for (let k = 0; k < CASES; k++) {
      const demo = demos[k % demos.length];
      const onNet = rnd() < 0.75;
      const m = mutate(onNet ? demo.net : demo.noise, rnd);
      const files = { 'm.net.yaml': onNet ? m.text : demo.net, 'm.noise.yaml': onNet ? demo.noise : m.text };
      const what = `case ${k} (${demo.name}, ${onNet ? 'program set' : 'noise model'}: ${m.what.join('; ')})`;
      const t0 = Date.now();
      const check = await runCli(['check', 'm.net.yaml', '--noise', 'm.noise.yaml'], files);
      expect(check.code, `${what}\n${check.stderr}`).not.toBe(3);
      expect(check.stderr, what).not.toMatch(/\n\s+at /);
      if (check.code === 2) refused++;
      if (check.code !== 0) continue;
      accepted++;
      const run = await runCli(['run', 'm.net.yaml', '--noise', 'm.noise.yaml', '--until', '20ms', '--events', '3000'], files);
      // check accepted it: the run may stall or fail an expectation (exit 1), never refuse (2) or crash (3)
      expect([0, 1], `${what}\n${run.stderr}`).toContain(run.code);
      expect(Date.now() - t0, `${what} took too long`).toBeLessThan(10_000);
    }
    // both sides of the property are exercised
    expect(accepted).toBeGreaterThan(20);
    expect(refused).toBeGreaterThan(20);
  }, 60_000);
});
