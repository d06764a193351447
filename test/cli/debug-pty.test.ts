/**
 * The real `bellstep debug` in a pseudo-terminal (tmux), plus what it does without one, and
 * `bellstep demo`. The tmux test is skipped, saying so, only when tmux is not installed.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { noiseWith, SWAP_NET } from '../engine/scenarios.js';

const ROOT = resolve(import.meta.dirname, '../..');
const BIN = ['node', '--import', 'tsx', join(ROOT, 'src/cli/bin.ts')];
const HAS_TMUX = spawnSync('tmux', ['-V']).status === 0;
const dir = mkdtempSync(join(tmpdir(), 'bellstep-pty-'));
const net = join(dir, 'swap.net.yaml');
const noise = join(dir, 'swap.noise.yaml');
writeFileSync(net, SWAP_NET);
writeFileSync(noise, noiseWith('{werner: 0.9}', '    success: 0.3'));

const SOCKET = `bellstep-test-${process.pid}`;
const tmux = (...args: string[]) => spawnSync('tmux', ['-L', SOCKET, ...args], { encoding: 'utf8' });

async function until(check: () => boolean, what: string, ms = 30_000): Promise<void> {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (check()) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}; screen:\n${tmux('capture-pane', '-p', '-t', 'dbg').stdout}`);
}

afterAll(() => {
  if (HAS_TMUX) tmux('kill-server');
});

describe('bellstep debug in a terminal', () => {
  if (!HAS_TMUX) console.warn('skipping the pseudo-terminal test: tmux is not installed');

  it.skipIf(!HAS_TMUX)('starts, steps, steps back and quits cleanly, restoring the terminal (needs tmux)', async () => {
    const rc = join(dir, 'rc');
    const script = join(dir, 'run.sh');
    writeFileSync(
      script,
      [
        `cd ${JSON.stringify(ROOT)}`,
        `stty -g > ${JSON.stringify(join(dir, 'stty-before'))}`,
        'echo BEFORE-THE-DEBUGGER',
        `CI=false NO_COLOR=1 ${BIN.map((a) => JSON.stringify(a)).join(' ')} debug ${JSON.stringify(net)} --noise ${JSON.stringify(noise)}`,
        `echo $? > ${JSON.stringify(rc)}.tmp`,
        `stty -g > ${JSON.stringify(join(dir, 'stty-after'))}`,
        `mv ${JSON.stringify(rc)}.tmp ${JSON.stringify(rc)}`,
        'sleep 30',
      ].join('\n'),
    );
    expect(tmux('new-session', '-d', '-s', 'dbg', '-x', '100', '-y', '30', `bash ${script}`).status).toBe(0);
    const screen = () => tmux('capture-pane', '-p', '-t', 'dbg').stdout;
    await until(() => screen().includes('SITES'), 'the debugger to draw');
    expect(tmux('display-message', '-p', '-t', 'dbg', '#{alternate_on}').stdout.trim()).toBe('1');
    expect(screen()).toContain('at the start of 0 computed');
    tmux('send-keys', '-t', 'dbg', 'Right');
    await until(() => screen().includes('event #0 of 1 computed'), 'a step');
    tmux('send-keys', '-t', 'dbg', 'Right');
    await until(() => screen().includes('event #1 of 2 computed'), 'a second step');
    tmux('send-keys', '-t', 'dbg', 'Left');
    await until(() => screen().includes('event #0 of 2 computed'), 'a step back');
    // the frame stays within rows − 1 of the 30-row terminal
    expect(screen().split('\n').filter((l) => l.trim() !== '').length).toBeLessThanOrEqual(29);
    tmux('send-keys', '-t', 'dbg', 'q');
    await until(() => existsSync(rc), 'the debugger to exit');
    expect(readFileSync(rc, 'utf8').trim()).toBe('0');
    expect(readFileSync(join(dir, 'stty-after'), 'utf8')).toBe(readFileSync(join(dir, 'stty-before'), 'utf8'));
    expect(tmux('display-message', '-p', '-t', 'dbg', '#{alternate_on}').stdout.trim()).toBe('0');
    const after = screen();
    expect(after).toContain('BEFORE-THE-DEBUGGER');
    expect(after).not.toContain('SITES');
  });

  it('refuses to start without a terminal and points to bellstep run', () => {
    const r = spawnSync(BIN[0], [...BIN.slice(1), 'debug', net, '--noise', noise], { input: '', encoding: 'utf8', env: { ...process.env, CI: 'true' } });
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('needs an interactive terminal');
    expect(r.stderr).toContain(`bellstep run ${net} --noise ${noise}`);
  });

  it('reports bad input before asking for a terminal', async () => {
    const r = await runCli(['debug', 'swap.net.yaml', '--break', 'on fire mill.swop'], { 'swap.net.yaml': SWAP_NET });
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/swop/);
    const noNet = await runCli(['debug']);
    expect(noNet.code).toBe(2);
    expect(noNet.stderr).toContain('debug needs a program set or --replay');
  });

  it('opens a replay at an event only within the recording', async () => {
    const rec = await runCli(['run', 'swap.net.yaml', '--events', '5', '--record', 'r.json'], { 'swap.net.yaml': SWAP_NET });
    const replay = rec.files.get('r.json')!;
    const past = await runCli(['debug', '--replay', 'r.json', '--at', '9'], { 'r.json': replay });
    expect(past.code).toBe(2);
    expect(past.stderr).toContain('the replay holds events 0 to 4, not 9');
    const ok = await runCli(['debug', '--replay', 'r.json', '--at', '3'], { 'r.json': replay });
    expect(ok.code).toBe(2);
    expect(ok.stderr).toContain('bellstep replay r.json --verify');
  });
});

describe('bellstep demo', () => {
  it('lists the bundled scenarios with their titles', async () => {
    const r = await runCli(['demo']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('three-site-swap');
    const readme = readFileSync(join(ROOT, 'demos/three-site-swap/README.md'), 'utf8');
    expect(r.stdout).toContain(readme.split('\n')[0].replace(/^#\s+/, ''));
  });

  it('names the scenarios when asked for one that does not exist', async () => {
    const r = await runCli(['demo', 'no-such-thing']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('there is no scenario "no-such-thing"');
    expect(r.stderr).toContain('three-site-swap');
  });
});
