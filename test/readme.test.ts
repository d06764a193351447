/** The README is part of the interface: its commands, flags and keys match the tables, and its examples run. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { COMMANDS } from '../src/cli/commands/index.js';
import { KEYS } from '../src/tui/keys.js';
import { COMMANDS as TUI_COMMANDS } from '../src/tui/commands.js';
import { runCli } from './helpers/run-cli.js';

const readme = readFileSync('README.md', 'utf8');

describe('README', () => {
  it('opens with the job and a quick start of exactly two commands', () => {
    const first = readme.split('\n\n')[1];
    expect(first).toMatch(/debugger for the programs that the nodes of a quantum\s+network run/);
    const quick = /## Quick start[\s\S]*?```\n([\s\S]*?)```/.exec(readme)![1].trim().split('\n');
    expect(quick).toEqual(['npm install && npm start', 'npm test']);
    const pkg = JSON.parse(readFileSync('package.json', 'utf8'));
    expect(pkg.scripts.start).toContain('demo three-site-swap');
    expect(pkg.scripts.test).toBe('npm run typecheck && npm run lint && vitest run');
  });

  it('carries the safety note', () => {
    expect(readme).toContain('no security proof');
    expect(readme).toContain('no substitute for characterising real hardware');
    expect(readme).toContain("licensed practice");
  });

  it('names every CLI command and every flag', () => {
    for (const c of COMMANDS) {
      expect(readme, c.name).toContain(`bellstep ${c.name}`);
      for (const o of c.options) expect(readme, `${c.name} ${o.flags}`).toContain(o.flags.split(' ')[0]);
    }
  });

  it('lists every key of the debugger and every command-line word', () => {
    for (const k of KEYS) for (const part of k.label.split(/\s{2,}/)) expect(readme, k.label).toContain(part.split(' ')[0]);
    for (const c of TUI_COMMANDS) expect(readme, c.word).toContain(`\`${c.word}`);
  });

  it('runs the sweep example and prints the lines it quotes', async () => {
    const cmd = /```\n(npx bellstep sweep demos\/two-site-purification\/.+)\n```/.exec(readme)![1];
    const argv = [...cmd.matchAll(/"([^"]*)"|(\S+)/g)].map((m) => m[1] ?? m[2]).slice(2);
    const files = Object.fromEntries(argv.filter((a) => a.endsWith('.yaml')).map((p) => [p, readFileSync(p, 'utf8')]));
    const r = await runCli(argv, files);
    expect(r.code).toBe(1);
    const quoted = /It exits 1, and ends with:\n\n```\n([\s\S]*?)```/.exec(readme)![1].split('\n').filter((l) => l && l !== '...');
    for (const line of quoted) expect(r.stdout).toContain(line);
    expect(r.files.has('failures/seed-10.replay.json')).toBe(true);
  });

  it('runs the walkthrough’s headless command and finds the reason it quotes', async () => {
    const cmd = /```\n(npx bellstep run demos\/stalled-purification\/\S+ --noise \S+)\n```/.exec(readme)![1];
    const argv = cmd.split(' ').slice(2);
    const files = Object.fromEntries(argv.filter((a) => a.endsWith('.yaml')).map((p) => [p, readFileSync(p, 'utf8')]));
    const r = await runCli(argv, files);
    expect(r.code).toBe(1);
    expect(r.stdout).toContain('waits for a "parity" message from weir about pair kiln~weir#1; the inbox holds one about kiln~weir#2');
  });

  it('shows a chart of the nested-repeater demo that the quoted commands render byte for byte', async () => {
    const section = readme.slice(readme.indexOf('## Pictures'));
    const [run, chart] = /```\n(npx bellstep run demos\/nested-repeater\/.+)\n(npx bellstep chart .+)\n```/.exec(section)!.slice(1);
    const runArgv = run.split(' ').slice(2);
    const files = Object.fromEntries(runArgv.filter((a) => a.endsWith('.yaml')).map((p) => [p, readFileSync(p, 'utf8')]));
    const recorded = await runCli(runArgv, files);
    expect(recorded.code).toBe(0);
    const drawn = await runCli(chart.split(' ').slice(2), Object.fromEntries(recorded.files));
    expect(drawn.code).toBe(0);
    const out = chart.split(' ').at(-1)!;
    expect(section).toContain(`](${out})`);
    // when the chart's look or the engine changes on purpose, run the two commands again and commit the picture
    expect(drawn.files.get(out)).toBe(readFileSync(out, 'utf8'));
  });

  it('runs the diff example and prints the lines it quotes', async () => {
    const section = readme.slice(readme.indexOf('## Comparing runs'));
    const fault = /```yaml\n([\s\S]*?)```/.exec(section)![1];
    const noise = 'demos/nested-repeater/repeater.noise.yaml';
    const files: Record<string, string> = { 'demos/nested-repeater/repeater.net.yaml': readFileSync('demos/nested-repeater/repeater.net.yaml', 'utf8'), [noise]: readFileSync(noise, 'utf8') };
    files['lossy.noise.yaml'] = `${files[noise]}${fault}`;
    const commands = /```\n(npx bellstep run [\s\S]*?)```/.exec(section)![1].trim().split('\n').map((l) => l.split(' ').slice(2));
    let last = await runCli(commands[0], files);
    for (const argv of commands.slice(1)) last = await runCli(argv, { ...files, ...Object.fromEntries(last.files) });
    expect(last.code).toBe(1);
    const quoted = /It exits 1 and prints:\n\n```\n([\s\S]*?)```/.exec(section)![1];
    expect(last.stdout).toBe(quoted);
  });
});

