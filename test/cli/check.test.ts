import { describe, it, expect } from 'vitest';
import { runCli } from '../helpers/run-cli.js';
import { fixture, where } from '../model/helpers.js';

const NET = fixture('swap.net.yaml');
const NOISE = fixture('swap.noise.yaml');

/** The swap fixture with two lint problems: a misspelt message kind and a message nobody waits for. */
const FLAWED = NET.replace('kind: bits, as: m', 'kind: bitz, as: m').replace(/- deliver: p\n$/, '- deliver: p\n          - send: {to: quay, kind: ack}\n');

describe('bellstep check', () => {
  it('exits 0 with one line for valid files without findings', async () => {
    const r = await runCli(['check', 'swap.net.yaml', '--noise', 'swap.noise.yaml'], { 'swap.net.yaml': NET, 'swap.noise.yaml': NOISE });
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.stdout).toBe('swap.net.yaml with swap.noise.yaml: valid (3 nodes, 2 links, 3 rules), no findings\n');
  });

  it('exits 1 and prints each finding as file:line:col, message and fix, then a count', async () => {
    expect(FLAWED).toContain('kind: bitz');
    expect(FLAWED).toContain('kind: ack');
    const r = await runCli(['check', 'flawed.net.yaml'], { 'flawed.net.yaml': FLAWED });
    expect(r.code).toBe(1);
    const lines = r.stdout.trimEnd().split('\n');
    const typo = where(FLAWED, '- got: {from: mill, kind: bitz');
    const ack = where(FLAWED, 'send: {to: quay, kind: ack}');
    expect(lines[0]).toMatch(new RegExp(`^flawed\\.net\\.yaml:${typo.line}:${typo.col + 2}: .*"bitz".*"bits"`));
    expect(lines[1]).toMatch(/^ {2}fix: /);
    expect(lines[2]).toMatch(new RegExp(`^flawed\\.net\\.yaml:${ack.line}:${ack.col}: .*"ack"`));
    expect(lines[3]).toMatch(/^ {2}fix: /);
    expect(lines[4]).toBe('2 findings in flawed.net.yaml (3 nodes, 2 links, 3 rules)');
  });

  it('prints JSON with the fixed format tag and the same exit codes', async () => {
    const clean = await runCli(['check', 'n.yaml', '--json'], { 'n.yaml': NET });
    expect(clean.code).toBe(0);
    expect(JSON.parse(clean.stdout)).toEqual({ format: 'bellstep/check@1', ok: true, findings: [], errors: [] });

    const flawed = await runCli(['check', 'n.yaml', '--json'], { 'n.yaml': FLAWED });
    expect(flawed.code).toBe(1);
    const out = JSON.parse(flawed.stdout);
    expect(out.format).toBe('bellstep/check@1');
    expect(out.ok).toBe(false);
    expect(out.findings.map((f: { code: string }) => f.code)).toEqual(['message-typo', 'message-unawaited']);
    for (const f of out.findings) expect(Object.keys(f).sort()).toEqual(['code', 'col', 'file', 'fix', 'line', 'message']);
  });

  it('reports invalid input as JSON on stdout and as text on stderr, exit 2', async () => {
    const bad = NET.replace('length: 12 km', 'length: 12');
    const r = await runCli(['check', 'n.yaml', '--json'], { 'n.yaml': bad });
    expect(r.code).toBe(2);
    const out = JSON.parse(r.stdout);
    expect(out.ok).toBe(false);
    expect(out.errors).toHaveLength(1);
    const at = where(bad, 'length: 12');
    expect(out.errors[0]).toMatchObject({ code: 'schema', file: 'n.yaml', line: at.line, col: at.col + 'length: '.length, field: 'links[0].length' });
    expect(r.stderr).toContain('expected a length with a unit');
  });

  it('names a file it cannot read and prints no stack trace', async () => {
    const r = await runCli(['check', 'missing.net.yaml']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('missing.net.yaml: cannot read the program set: no such file');
    expect(r.stderr).not.toMatch(/^ {4}at /m);
  });

  it('validates the noise model against the network (crossCheck)', async () => {
    const noise = NOISE.replace('mill~ridge:', 'mill~vale:');
    const r = await runCli(['check', 'n.yaml', '--noise', 'x.yaml'], { 'n.yaml': NET, 'x.yaml': noise });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`x.yaml:${where(noise, 'mill~vale').line}:3: links.mill~vale: unknown link "mill~vale"`);
  });
});
