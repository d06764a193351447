/**
 * Inputs and outputs (docs/cli.md, "Files"): an input is a regular file within its size, or
 * exit 2 before anything is parsed; an output is checked before any work and never
 * overwrites an input of the same command.
 */
import { execFileSync } from 'node:child_process';
import { closeSync, mkdirSync, mkdtempSync, openSync, readFileSync, symlinkSync, writeFileSync, ftruncateSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fileIo, type CliIo } from '../../src/cli/io.js';
import { main } from '../../src/cli/main.js';
import { saveWriter } from '../../src/cli/commands/debug.js';
import { INPUT_LIMITS } from '../../src/cli/inputs.js';
import { runCli, memoryIo } from '../helpers/run-cli.js';
import { SWAP_NET } from '../engine/scenarios.js';

const dir = mkdtempSync(join(tmpdir(), 'bellstep-files-'));

/** The real file system with the streams captured. */
async function realCli(argv: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { ...fileIo(), stdout: (t) => void out.push(t), stderr: (t) => void err.push(t), stdoutIsTTY: false, stderrIsTTY: false, stdinIsTTY: false, env: {} };
  const code = await main(argv, io);
  return { code, stdout: out.join(''), stderr: err.join('') };
}

describe('inputs', () => {
  it('refuses a device such as /dev/zero at once, without reading it', async () => {
    const t0 = Date.now();
    const r = await realCli(['check', '/dev/zero']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('/dev/zero is a device');
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(Date.now() - t0).toBeLessThan(5000);
  });

  it('refuses a named pipe without waiting for a writer', async () => {
    const fifo = join(dir, 'pipe.net.yaml');
    execFileSync('mkfifo', [fifo]);
    const r = await realCli(['run', fifo]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('named pipe');
  });

  it('refuses a directory, for the program set, the noise model and a replay file', async () => {
    writeFileSync(join(dir, 'ok.net.yaml'), SWAP_NET);
    for (const argv of [['check', dir], ['check', join(dir, 'ok.net.yaml'), '--noise', dir], ['replay', dir]]) {
      const r = await realCli(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.stderr).toContain('is a directory');
    }
  });

  it('refuses a 50 MB program set by its size, before reading it', async () => {
    const big = join(dir, 'big.net.yaml');
    const fd = openSync(big, 'w');
    ftruncateSync(fd, 50 * 1024 * 1024);
    closeSync(fd);
    const r = await realCli(['check', big]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('larger than 16 MiB');
    expect(INPUT_LIMITS['program set']).toBe(16 * 1024 * 1024);
  });

  it('refuses a file of tiny entries that would take gigabytes to parse, and one nested too deeply', async () => {
    const many = `format: bellstep/program-set@1\nnodes:\n${'  - {id: a, qubits: 1}\n'.repeat(100_000)}`;
    const r = await runCli(['check', 'many.net.yaml'], { 'many.net.yaml': many });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('more than 400,000 YAML entries');
    const deep = `format: bellstep/program-set@1\nnodes: ${'['.repeat(100)}${']'.repeat(100)}\n`;
    const d = await runCli(['check', 'deep.net.yaml'], { 'deep.net.yaml': deep });
    expect(d.code).toBe(2);
    expect(d.stderr).toMatch(/nested more than 64 levels/);
  });

  it('names a missing file', async () => {
    const r = await runCli(['check', 'nowhere.net.yaml']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('nowhere.net.yaml: cannot read the program set: no such file');
  });
});

describe('outputs', () => {
  const files = { 'swap.net.yaml': SWAP_NET };

  it('refuses --record onto its own program set, and leaves the program set as it was', async () => {
    const r = await runCli(['run', 'swap.net.yaml', '--events', '5', '--record', 'swap.net.yaml'], files);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('is also an input of this command');
    expect(r.stdout).toBe('');
    expect(r.files.get('swap.net.yaml')).toBe(SWAP_NET);
  });

  it('refuses --record onto the program set under another name (a symbolic link)', async () => {
    const net = join(dir, 'own.net.yaml');
    writeFileSync(net, SWAP_NET);
    symlinkSync(net, join(dir, 'alias.json'));
    const r = await realCli(['run', net, '--events', '5', '--record', join(dir, 'alias.json')]);
    expect(r.code).toBe(2);
    expect(readFileSync(net, 'utf8')).toBe(SWAP_NET);
  });

  it('refuses an output that is a directory, under a file, or in a folder it cannot write, before running', async () => {
    const cases: [string[], string][] = [
      [['--record', 'out'], 'out is a directory'],
      [['--record', 'swap.net.yaml/r.json'], 'is not a folder'],
      [['--record', 'locked/r.json'], 'is not writable'],
    ];
    for (const [flags, says] of cases) {
      const r = await runCli(['run', 'swap.net.yaml', '--events', '5', ...flags], files, { dirs: ['out', 'locked'], readOnly: ['locked'] });
      expect(r.code, flags.join(' ')).toBe(2);
      expect(r.stderr).toContain(says);
      expect(r.stdout, 'nothing ran').toBe('');
    }
  });

  it('checks --junit of replay and --save-failures of sweep the same way', async () => {
    const rec = await runCli(['run', 'swap.net.yaml', '--events', '5', '--record', 'r.json'], files);
    const replay = rec.files.get('r.json')!;
    const j = await runCli(['replay', 'r.json', '--verify', '--junit', 'r.json'], { 'r.json': replay });
    expect(j.code).toBe(2);
    expect(j.stderr).toContain('is also an input');
    const s = await runCli(['sweep', 'swap.net.yaml', '--seeds', '1..1', '--workers', '1', '--save-failures', 'swap.net.yaml'], files);
    expect(s.code).toBe(2);
    expect(s.stderr).toContain('is also an input');
  });

  it("checks the debugger's save the same way, and writes a replay where it may", () => {
    const io = memoryIo({ 'swap.net.yaml': SWAP_NET }, { dirs: ['out'] });
    const save = saveWriter(io, ['swap.net.yaml', undefined]);
    expect(() => save('swap.net.yaml', '{}')).toThrow(/is also an input/);
    expect(() => save('out', '{}')).toThrow(/is a directory/);
    save('out/stall.replay.json', '{}');
    expect(io.files.get('out/stall.replay.json')).toBe('{}');
  });

  it('writes into a folder that does not exist yet', async () => {
    mkdirSync(join(dir, 'made'), { recursive: true });
    writeFileSync(join(dir, 'w.net.yaml'), SWAP_NET);
    const r = await realCli(['run', join(dir, 'w.net.yaml'), '--events', '5', '--record', join(dir, 'made', 'deeper', 'r.json')]);
    expect(r.code).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, 'made', 'deeper', 'r.json'), 'utf8')).format).toMatch(/^bellstep\/replay@/);
  });
});
