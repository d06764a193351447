/** `bellstep debug` history flags: bad values are input errors before anything opens. */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { SWAP_NET } from '../engine/scenarios.js';

describe('bellstep debug history flags', () => {
  for (const [flag, value, fragment] of [
    ['--window', '0', '--window: expected a positive integer, got "0"'],
    ['--history-mb', 'lots', '--history-mb: expected a positive integer, got "lots"'],
  ] as const) {
    it(`refuses ${flag} ${value} with exit 2`, async () => {
      const r = await runCli(['debug', 'swap.net.yaml', flag, value], { 'swap.net.yaml': SWAP_NET });
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(fragment);
    });
  }

  it('accepts good values and then asks for a terminal', async () => {
    const r = await runCli(['debug', 'swap.net.yaml', '--window', '512', '--history-mb', '64'], { 'swap.net.yaml': SWAP_NET });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('the debugger needs an interactive terminal');
  });

  it('lists the flags with their defaults in --help', async () => {
    const r = await runCli(['debug', '--help']);
    expect(r.stdout).toContain('--window <N>');
    expect(r.stdout).toContain('(default 4096)');
    expect(r.stdout).toContain('--history-mb <MB>');
    expect(r.stdout).toContain('(default 256)');
  });
});
