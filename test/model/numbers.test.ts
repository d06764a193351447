/**
 * Numbers the engine cannot use are input errors found by check as well as by run (exit 2,
 * located): literals that underflow to 0, zero speeds, zero decay times, links of no
 * length, and speeds so slow that arrival times cannot be counted.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { noiseWith, SWAP_NET } from '../engine/scenarios.js';

const files = (net: string, noise?: string) => ({ 'n.net.yaml': net, ...(noise ? { 'n.noise.yaml': noise } : {}) });
const argvs = (noise: boolean) => [
  ['check', 'n.net.yaml', ...(noise ? ['--noise', 'n.noise.yaml'] : [])],
  ['run', 'n.net.yaml', ...(noise ? ['--noise', 'n.noise.yaml'] : []), '--until', '10ms'],
];

async function refused(net: string, noise: string | undefined, says: RegExp): Promise<void> {
  for (const argv of argvs(noise !== undefined)) {
    const t0 = Date.now();
    const r = await runCli(argv, files(net, noise));
    expect(r.code, `${argv[0]}: ${r.stderr}`).toBe(2);
    expect(r.stderr).toMatch(says);
    expect(r.stderr).toMatch(/n\.(net|noise)\.yaml:\d+:\d+: /);
    expect(Date.now() - t0, 'no hang').toBeLessThan(10_000);
  }
}

describe('numbers the engine cannot hold', () => {
  it('refuses an expression literal that underflows to zero', async () => {
    const net = SWAP_NET.replace('do:', 'do:\n          - log: "{1e-400}"');
    await refused(net, undefined, /number "1e-400" is too small: it rounds to 0/);
  });

  it('refuses a YAML number that underflows to zero, in either file', async () => {
    await refused(SWAP_NET, noiseWith('{werner: 1e-400}'), /the number 1e-400 is too small/);
    const net = SWAP_NET.replace('do:', 'do:\n          - gate: {op: rx, on: a, angle: 2e-999}');
    await refused(net, undefined, /the number 2e-999 is too small/);
  });

  it('refuses a classical speed of zero, which hung the run', async () => {
    await refused(SWAP_NET, noiseWith('{werner: 0.9}', '  classical: {speed: 0 km/s}'), /defaults\.classical\.speed: a speed of 0 km\/s would never deliver/);
  });

  it('refuses a speed so slow that arrival times cannot be counted', async () => {
    await refused(SWAP_NET, noiseWith('{werner: 0.9}', '  classical: {speed: 0.000001 m/s}'), /longer than the simulation can count/);
  });

  it('refuses decay times of zero, which were an internal error', async () => {
    await refused(SWAP_NET, noiseWith('{werner: 0.9}', '  memory: {t1: 0 ns}'), /defaults\.memory\.t1: a decay time of 0 ns would destroy a qubit at once/);
    await refused(SWAP_NET, noiseWith('{werner: 0.9}', '  memory: {t2: 0 s}'), /defaults\.memory\.t2: a decay time/);
  });

  it('refuses a link of no length', async () => {
    await refused(SWAP_NET.replace(/length: [^,}]+/, 'length: 0 km'), undefined, /links\[0\]\.length: a link of length 0 km/);
  });
});
