/**
 * A long jump in the real debugger, in a pseudo-terminal (tmux): `:go 300000` and Enter sent
 * in one piece, as a terminal multiplexer or a paste sends it, works exactly as typed; the
 * status line shows progress that changes while it runs; it arrives at event 299999; a much
 * longer jump stops at once on Esc, on a world that can be inspected; q then quits with 0;
 * and the process stays under 600 MB. Skipped, saying so, only when tmux is not installed.
 * (How fast it gets there is measured by `npm run bench`, not here.)
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { compileSources } from '../helpers/compile-sources.js';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { CHAIN_NOISE, nestedChainWithRoles } from '../bench/chain.js';

const ROOT = resolve(import.meta.dirname, '../..');
const RSS_CHILD = join(ROOT, 'test/bench/rss-child.ts');
const HAS_TMUX = spawnSync('tmux', ['-V']).status === 0;
const dir = mkdtempSync(join(tmpdir(), 'bellstep-jump-'));
const net = join(dir, 'chain.net.yaml');
const noise = join(dir, 'chain.noise.yaml');
writeFileSync(net, nestedChainWithRoles(2));
writeFileSync(noise, CHAIN_NOISE);

const SOCKET = `bellstep-jump-${process.pid}`;
const tmux = (...args: string[]) => spawnSync('tmux', ['-L', SOCKET, ...args], { encoding: 'utf8' });
const screen = () => tmux('capture-pane', '-p', '-t', 'jump').stdout;

async function until(check: () => boolean, what: string, ms = 120_000): Promise<void> {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (check()) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`timed out waiting for ${what}; screen:\n${screen()}`);
}

const compiled = HAS_TMUX ? compileSources('bellstep-jump-build-').dir : '';

afterAll(() => {
  if (HAS_TMUX) tmux('kill-server');
  if (compiled) rmSync(compiled, { recursive: true, force: true });
});

describe('a long jump in the debugger', () => {
  if (!HAS_TMUX) console.warn('skipping the long-jump terminal test: tmux is not installed');

  it.skipIf(!HAS_TMUX)('runs in slices with progress, arrives, stops on Esc and quits on q (needs tmux)', { timeout: 180_000 }, async () => {
    const rc = join(dir, 'rc');
    const rss = join(dir, 'rss');
    const script = join(dir, 'run.sh');
    writeFileSync(
      script,
      [
        `cd ${JSON.stringify(ROOT)}`,
        // compiled code, as a user runs it; the peak memory of the process is written as it exits
        `CI=false NO_COLOR=1 node --import tsx ${JSON.stringify(RSS_CHILD)} ${JSON.stringify(join(compiled, 'cli/bin.js'))} debug ${JSON.stringify(net)} --noise ${JSON.stringify(noise)} 2> ${JSON.stringify(rss)}`,
        `echo $? > ${JSON.stringify(rc)}.tmp`,
        `mv ${JSON.stringify(rc)}.tmp ${JSON.stringify(rc)}`,
        'sleep 30',
      ].join('\n'),
    );
    expect(tmux('new-session', '-d', '-s', 'jump', '-x', '120', '-y', '40', `bash ${script}`).status).toBe(0);
    await until(() => screen().includes('SITES'), 'the debugger to draw');

    // the command and Enter in one send-keys
    tmux('send-keys', '-t', 'jump', ':go 300000', 'Enter');
    const seen = new Set<string>();
    await until(() => {
      const m = /going to event 300000: ([\d,]+) events done/.exec(screen());
      if (m) seen.add(m[1]);
      return screen().includes('event #300000 ');
    }, 'the jump to arrive, showing its progress on the way');
    // the progress it showed changed on the way
    expect(seen.size).toBeGreaterThanOrEqual(2);
    expect(screen()).toMatch(/event #300000 of 300001 computed/);
    // and it said how long it took, counting the events it ran
    expect(screen()).toMatch(/went to this event \(300,001 events in \d+\.\d\d s\)/);

    // a jump far beyond: Esc stops it where it got to
    tmux('send-keys', '-t', 'jump', ':go 50000000', 'Enter');
    await until(() => /going to event 50000000: [\d,]+ events done/.test(screen()), 'the second jump to show progress');
    const t0 = Date.now();
    tmux('send-keys', '-t', 'jump', 'Escape');
    await until(() => screen().includes('stopped by Esc'), 'Esc to stop the jump', 10_000);
    const stoppedIn = Date.now() - t0;
    expect(stoppedIn).toBeLessThan(5000);
    // the world it stopped on is a real moment: the panes show it and a step still works
    const at = Number(/event #(\d+)/.exec(screen())![1]);
    expect(at).toBeGreaterThan(300_000);
    tmux('send-keys', '-t', 'jump', 'Left');
    await until(() => screen().includes(`event #${at - 1}`), 'a step back after the stop');

    tmux('send-keys', '-t', 'jump', 'q');
    await until(() => existsSync(rc), 'the debugger to exit');
    expect(readFileSync(rc, 'utf8').trim()).toBe('0');
    const kb = Number(/max-rss-kb=(\d+)/.exec(readFileSync(rss, 'utf8'))![1]);
    expect(kb / 1024).toBeLessThan(600);
  });
});
