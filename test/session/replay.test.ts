/** Replay files (FORMAT.md §7): export, import, verify, and refusal of foreign or tampered files. */
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.js';
import { onCrashSaveReplay, crashReplayPath } from '../../src/cli/crash.js';
import type { CommandSpec } from '../../src/cli/spec.js';
import { Session } from '../../src/session/session.js';
import { createHash } from 'node:crypto';
import { parseReplay, replayChecksum, sha256, type ReplayFile } from '../../src/session/replay.js';
import { verifyReplay } from '../../src/session/verify.js';
import { memoryIo, runCli } from '../helpers/run-cli.js';
import { engineFrom, SWAP_NET, purificationNet } from '../engine/scenarios.js';

const NOISE = `format: bellstep/noise@1
seed: 31
defaults:
  link: {pair: {werner: 0.94}, success: 0.25}
  memory: {t2: 300 ms}
  gates: {two: {depolarizing: 0.01, duration: 20 us}, measure: {flip: 0.01, duration: 4 us}}
`;
const files = { 'swap.net.yaml': SWAP_NET, 'swap.noise.yaml': NOISE };

async function recorded(extra: string[] = []): Promise<string> {
  const r = await runCli(['run', 'swap.net.yaml', '--noise', 'swap.noise.yaml', '--events', '400', '--record', 'r.replay.json', ...extra], files);
  expect(r.code).toBe(0);
  return r.files.get('r.replay.json')!;
}

/** Edits a replay object and re-signs it, as a careful forger (or a changed tool) would. */
function resign(text: string, edit: (r: ReplayFile) => void): string {
  const r = JSON.parse(text) as ReplayFile;
  edit(r);
  r.checksum = replayChecksum(r);
  return JSON.stringify(r);
}

async function verify(text: string, extra: string[] = []) {
  return runCli(['replay', 'x.replay.json', '--verify', ...extra], { 'x.replay.json': text });
}

describe('replay files', () => {
  it('have exactly the fixed top-level keys and a checksum that matches', async () => {
    const text = await recorded(['--expect', 'delivered() >= 1', '--break', 'delivered() >= 1000']);
    const r = JSON.parse(text);
    expect(Object.keys(r)).toEqual(['format', 'tool', 'inputs', 'seed', 'breakpoints', 'expectations', 'stop', 'events', 'checksum']);
    expect(r.format).toBe('bellstep/replay@1');
    expect(r.inputs.program_set.sha256).toBe(sha256(SWAP_NET));
    expect(r.inputs.noise.text).toBe(NOISE);
    expect(r.events).toHaveLength(400);
    expect(Object.keys(r.events[0])).toEqual(['index', 'time_ns', 'node', 'kind', 'summary', 'digest']);
    // the checksum covers everything else, as JSON with sorted keys (computed here independently)
    const { checksum, ...rest } = r;
    const sorted = (v: unknown): unknown =>
      Array.isArray(v) ? v.map(sorted) : v && typeof v === 'object' ? Object.fromEntries(Object.keys(v).sort().map((k) => [k, sorted((v as Record<string, unknown>)[k])])) : v;
    expect(checksum).toBe(`sha256:${createHash('sha256').update(JSON.stringify(sorted(rest))).digest('hex')}`);
    expect(r.expectations).toEqual(['delivered() >= 1']);
    expect(r.breakpoints).toEqual(['delivered() >= 1000']);
  });

  it('verify passes on an untouched recording, with a JUnit report', async () => {
    const text = await recorded(['--expect', 'delivered() >= 1']);
    const r = await verify(text, ['--junit', 'out.xml']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('verified: all 400 events match the recording');
    const xml = r.files.get('out.xml')!;
    expect(xml).toContain('<testsuite name="bellstep replay x.replay.json" tests="2" failures="0" errors="0"');
    expect(xml).toContain('name="delivered() &gt;= 1"');
  });

  it('verify catches a changed program and names the first divergent event', async () => {
    const text = await recorded();
    // mill now sends its report to ridge later in its body: same pairs, different messages
    const changed = SWAP_NET.replace('kind: swapped, pair: b.id, data: {z: zb', 'kind: swapped, pair: b.id, data: {late: 1, z: zb').replace(
      '  quay:\n    rules:\n',
      '  quay:\n    rules:\n      - name: early\n        when: [{have: {partner: mill, as: p}}]\n        do: [{stage: {pair: p, to: held}}]\n',
    );
    const forged = resign(text, (r) => {
      r.inputs.program_set.text = changed;
      r.inputs.program_set.sha256 = sha256(changed);
    });
    const res = await verify(forged, ['--json', '--junit', 'out.xml']);
    expect(res.code).toBe(1);
    const out = JSON.parse(res.stdout);
    expect(out.ok).toBe(false);
    expect(out.divergence.index).toBeGreaterThan(0);
    expect(out.divergence.index).toBe(out.checked);
    expect(res.files.get('out.xml')).toContain('<failure message="event ');
  });

  it('verify catches a tampered event even when the checksum was redone', async () => {
    const text = await recorded();
    const forged = resign(text, (r) => {
      r.events[123].summary = r.events[123].summary.replace('made', 'made up');
      r.events[123].digest = 'ffffffffffffffff';
    });
    const res = await verify(forged);
    expect(res.code).toBe(1);
    expect(res.stdout).toContain('DIVERGED after 123 matching events');
    expect(res.stdout).toContain('event 123');
  });

  it('refuses a tampered file whose checksum no longer matches, before running anything', async () => {
    const text = await recorded();
    const r = JSON.parse(text);
    r.events[5].time_ns += 1;
    const res = await verify(JSON.stringify(r));
    expect(res.code).toBe(2);
    expect(res.stderr).toContain('checksum mismatch');
  });

  it('refuses an embedded input that does not match its SHA-256', async () => {
    const forged = resign(await recorded(), (r) => {
      r.inputs.program_set.text += '\n# edited\n';
    });
    const res = await verify(forged);
    expect(res.code).toBe(2);
    expect(res.stderr).toContain('does not match its SHA-256');
  });

  it('refuses a truncated file, a foreign file and a newer format, with exit 2', async () => {
    const text = await recorded();
    const cases: [string, string][] = [
      [text.slice(0, Math.floor(text.length / 2)), 'truncated'],
      ['{"hello": "world"}', 'not a bellstep replay file'],
      ['[1, 2, 3]', 'not a replay file'],
      [resign(text, (r) => (r.format = 'bellstep/replay@2')), 'written by a newer bellstep (format bellstep/replay@2)'],
      ['', 'not valid JSON'],
    ];
    for (const [t, fragment] of cases) {
      const res = await verify(t);
      expect(res.code, fragment).toBe(2);
      expect(res.stderr, fragment).toContain(fragment);
      expect(res.stderr).not.toMatch(/\n\s+at /);
    }
  });

  it('exports from a session and verifies, including after rewinds', () => {
    const s = new Session(engineFrom(purificationNet(), NOISE));
    for (let i = 0; i < 150; i++) s.stepForward();
    for (let i = 0; i < 40; i++) s.stepBack();
    s.goto(260);
    const r = parseReplay(s.exportReplay());
    expect(r.events).toHaveLength(260);
    const v = verifyReplay(r);
    expect(v.ok).toBe(true);
    expect(v.checked).toBe(260);
  });

  it('an internal error saves an automatic replay of the session so far, and says where (exit 3)', async () => {
    const io = memoryIo({}, { env: { BELLSTEP_CRASH_DIR: '/crash' } });
    const boom: CommandSpec = {
      name: 'boom',
      args: '',
      summary: 'test command that crashes mid-session',
      options: [],
      async run() {
        const s = new Session(engineFrom(SWAP_NET));
        onCrashSaveReplay((why) => {
          const path = crashReplayPath(io);
          io.writeFile(path, s.exportReplay({ reason: 'events', detail: `automatic replay: ${why}` }));
          return path;
        });
        for (let i = 0; i < 50; i++) s.stepForward();
        throw new Error('simulated bug');
      },
    };
    const code = await main(['boom'], io, [boom]);
    onCrashSaveReplay(undefined);
    expect(code).toBe(3);
    const err = io.stderrText();
    expect(err).toContain('internal error: simulated bug');
    const replayPath = /automatic replay of the session so far: (\S+)/.exec(err)![1];
    expect(replayPath.startsWith('/crash/')).toBe(true);
    const replay = parseReplay(io.files.get(replayPath)!);
    expect(replay.events).toHaveLength(50);
    expect(verifyReplay(replay).ok).toBe(true);
    expect(err).toMatch(/crash report: \/crash\/crash-/);
  });
});
