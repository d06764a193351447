/**
 * The compiled CLI writing into a pipe, as `bellstep run --json | jq` and CI scripts use it:
 * a reader that is slow to start still gets the whole output, in order; a reader that stops
 * early (`| head`) ends the command quietly, with no error trace. (That a pipe no longer
 * holds a long output in memory is measured by `npm run bench`, the `--json` memory line.)
 */
import { spawn } from 'node:child_process';
import type { Readable } from 'node:stream';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { CHAIN_NOISE, nestedChainWithRoles } from '../bench/chain.js';
import { compileSources } from '../helpers/compile-sources.js';

const compiled = compileSources('bellstep-pipe-build-').dir;
const dir = mkdtempSync(join(tmpdir(), 'bellstep-pipe-'));
const net = join(dir, 'chain.net.yaml');
const noise = join(dir, 'chain.noise.yaml');
writeFileSync(net, nestedChainWithRoles(2));
writeFileSync(noise, CHAIN_NOISE);

afterAll(() => {
  rmSync(compiled, { recursive: true, force: true });
  rmSync(dir, { recursive: true, force: true });
});

interface Ended {
  code: number | null;
  stdout: string;
  stderr: string;
}

/** Runs `bellstep run` with a piped stdout; `read` decides what the reader does with it. */
function runPiped(args: string[], read: (out: Readable, done: (text: string) => void) => void): Promise<Ended> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [join(compiled, 'cli/bin.js'), 'run', net, '--noise', noise, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    let stdout = '';
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    read(child.stdout, (text) => (stdout = text));
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

describe('output into a pipe', () => {
  it('a reader that starts late still receives the whole JSON summary', { timeout: 60_000 }, async () => {
    const r = await runPiped(['--events', '20000', '--json'], (out, done) => {
      out.pause();
      // the summary is far larger than a pipe holds (64 KiB), so the writer must wait
      setTimeout(() => {
        let text = '';
        out.on('data', (d: Buffer) => (text += d.toString()));
        out.on('end', () => done(text));
        out.resume();
      }, 500);
    });
    expect(r.code).toBe(0);
    expect(r.stdout.length).toBeGreaterThan(64 * 1024);
    const summary = JSON.parse(r.stdout) as { events: number; delivered: unknown[] };
    expect(summary.events).toBe(20000);
    expect(summary.delivered.length).toBeGreaterThan(0);
  });

  it('a reader that stops early ends the command quietly', { timeout: 60_000 }, async () => {
    const r = await runPiped(['--events', '20000', '--json'], (out, done) => {
      out.once('data', (d: Buffer) => {
        done(d.toString());
        out.destroy();
      });
    });
    expect(r.stdout.startsWith('{')).toBe(true);
    expect(r.stderr).not.toMatch(/EPIPE|at .*\(node:/);
    expect(r.code).toBe(0);
  });
});
