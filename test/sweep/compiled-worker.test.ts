/**
 * The worker entry from compiled code: bellstep installed from npm runs dist/, where the
 * pool must find worker.js beside it, while the other tests run the .ts sources through tsx.
 * This test compiles the current sources to a temporary folder (types stripped by esbuild,
 * one file at a time, laid out as tsc lays out dist/: a quick stand-in for the build), runs the compiled CLI as a child process, and checks
 * that it prints the same bytes as the in-process sweep from the sources.
 */
import { spawnSync } from 'node:child_process';
import { rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { compileSources } from '../helpers/compile-sources.js';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { LOSSY_NET, LOSSY_NOISE } from './scenarios.js';

const { dir: out, files } = compileSources();
afterAll(() => rmSync(out, { recursive: true, force: true }));

describe('sweep from compiled code', () => {
  it('finds worker.js beside the compiled pool and prints the same bytes as from the sources', async () => {
    expect(files).toBeGreaterThan(50);
    writeFileSync(join(out, 'lossy.net.yaml'), LOSSY_NET);
    writeFileSync(join(out, 'lossy.noise.yaml'), LOSSY_NOISE);
    const argv = ['sweep', 'lossy.net.yaml', '--noise', 'lossy.noise.yaml', '--until', '3ms', '--seeds', '1..6', '--workers', '2', '--json'];
    const compiled = spawnSync(process.execPath, [join(out, 'cli/bin.js'), ...argv], { cwd: out, encoding: 'utf8', env: { ...process.env, NODE_OPTIONS: '' } });
    expect(compiled.stderr).not.toContain('Error');
    expect(compiled.status).toBe(1);
    const fromSources = await runCli(argv, { 'lossy.net.yaml': LOSSY_NET, 'lossy.noise.yaml': LOSSY_NOISE });
    expect(compiled.stdout).toBe(fromSources.stdout);
    expect(JSON.parse(compiled.stdout).runs).toHaveLength(6);
  });
});
