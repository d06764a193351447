/** Replay files: export, import, verify to the recorded stop, and refusal of foreign, misshapen or tampered files. */
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.js';
import { onCrashSaveReplay, crashReplayPath } from '../../src/cli/crash.js';
import type { CommandSpec } from '../../src/cli/spec.js';
import { Session } from '../../src/session/session.js';
import { createHash } from 'node:crypto';
import { parseReplay, sha256 } from '../../src/session/replay.js';
import { ReplayWriter, resignV2 } from '../../src/session/replay-v2.js';
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

/** Replaces one top-level line of a `@2` file (`"key": value`) and re-signs it, as a careful forger would. */
function withLine(text: string, key: string, value: unknown): string {
  const re = new RegExp(`\\n {2}"${key}": .*?(,?)(?=\\n)`);
  if (!re.test(text)) throw new Error(`no line "${key}"`);
  return resignV2(text.replace(re, (_m, comma: string) => `\n  "${key}": ${JSON.stringify(value)}${comma}`));
}

/**
 * A `@2` file rewritten with only some of its events, consistently: blocks, the last events
 * in full, the final count and digest all agree with each other, and it is re-signed. Only
 * the stop and the limits are left as they were.
 */
function keepEvents(text: string, keep: (i: number) => boolean): string {
  const raw = JSON.parse(text);
  const r = parseReplay(text);
  const parts: string[] = [];
  const head = { tool: raw.tool, inputs: raw.inputs, seed: raw.seed, breakpoints: raw.breakpoints, expectations: raw.expectations, limits: raw.limits };
  const w = new ReplayWriter(head, raw.tables.nodes, (c) => void parts.push(c));
  let last = '0000000000000000';
  for (let i = 0; i < r.events.length; i++) {
    if (!keep(i)) continue;
    const d = r.events.digest(i);
    w.add(r.events.time(i), r.events.node(i), r.events.kind(i), parseInt(d.slice(0, 8), 16), parseInt(d.slice(8), 16), r.events.summary(i));
    last = d;
  }
  w.finish(raw.stop, { events: w.events, digest: last });
  return parts.join('');
}

async function verify(text: string, extra: string[] = []) {
  return runCli(['replay', 'x.replay.json', '--verify', ...extra], { 'x.replay.json': text });
}

describe('replay files', () => {
  it('are bellstep/replay@2: the fixed keys, events in blocks, and a checksum over every byte before it', async () => {
    const text = await recorded(['--expect', 'delivered() >= 1', '--break', 'delivered() >= 1000']);
    const r = JSON.parse(text);
    expect(Object.keys(r)).toEqual(['format', 'tool', 'inputs', 'seed', 'breakpoints', 'expectations', 'limits', 'tables', 'blocks', 'recent', 'stop', 'final', 'checksum']);
    expect(r.format).toBe('bellstep/replay@2');
    expect(r.inputs.program_set.sha256).toBe(sha256(SWAP_NET));
    expect(r.inputs.noise.text).toBe(NOISE);
    expect(r.limits).toEqual({ until_ns: null, events: 400 });
    expect(r.final.events).toBe(400);
    expect(r.recent.at(-1).index).toBe(399);
    expect(Object.keys(r.recent[0])).toEqual(['index', 'time_ns', 'node', 'kind', 'summary', 'digest']);
    // the checksum is the SHA-256 of the file up to its own line (computed here independently)
    const at = text.lastIndexOf('\n  "checksum": ');
    expect(r.checksum).toBe(`sha256:${createHash('sha256').update(text.slice(0, at)).digest('hex')}`);
    expect(r.expectations).toEqual(['delivered() >= 1']);
    expect(r.breakpoints).toEqual(['delivered() >= 1000']);
    // every event reads back with its digest, and the last ones with their text
    const p = parseReplay(text);
    expect(p.events).toHaveLength(400);
    expect(p.events.at(399).summary).toBe(r.recent.at(-1).summary);
    expect(p.events.at(399).digest).toBe(r.final.digest);
  });

  it('verify passes on an untouched recording, with a JUnit report', async () => {
    const text = await recorded(['--expect', 'delivered() >= 1']);
    const r = await verify(text, ['--junit', 'out.xml']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('verified: all 400 events match the recording, and the run stops there (events)');
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
    const inputs = JSON.parse(text).inputs;
    const forged = withLine(text, 'inputs', { ...inputs, program_set: { ...inputs.program_set, text: changed, sha256: sha256(changed) } });
    const res = await verify(forged, ['--json', '--junit', 'out.xml']);
    expect(res.code).toBe(1);
    const out = JSON.parse(res.stdout);
    expect(out.ok).toBe(false);
    expect(out.divergence.index).toBeGreaterThan(0);
    expect(out.divergence.index).toBe(out.checked);
    expect(res.files.get('out.xml')).toContain('<failure message="event ');
  });

  it('verify catches a tampered event even when the file was rewritten and re-signed', async () => {
    const text = await recorded();
    // event 123 dropped: every later event moves up one place
    const res = await verify(keepEvents(text, (i) => i !== 123));
    expect(res.code).toBe(1);
    expect(res.stdout).toContain('DIVERGED after 123 matching events');
    expect(res.stdout).toContain('event 123');
  });

  it('refuses a recording emptied, halved or cut by one event, and re-signed (exit 1, saying what differs)', async () => {
    const text = await recorded();
    const cases: [string, (i: number) => boolean][] = [
      ['emptied', () => false],
      ['halved', (i) => i < 200],
      ['cut by one', (i) => i < 399],
    ];
    for (const [what, keep] of cases) {
      const res = await verify(keepEvents(text, keep));
      expect(res.code, what).toBe(1);
      expect(res.stdout, what).toContain('the run does not end where the recording says');
      expect(res.stdout, what).toMatch(/stops at its event limit of 400, but holds \d+ events/);
    }
  });

  it('refuses a tampered file whose checksum no longer matches, before running anything', async () => {
    const text = await recorded();
    const res = await verify(text.replace('"seed": 31', '"seed": 32'));
    expect(res.code).toBe(2);
    expect(res.stderr).toContain('checksum mismatch');
  });

  it('refuses an embedded input that does not match its SHA-256', async () => {
    const text = await recorded();
    const inputs = JSON.parse(text).inputs;
    const forged = withLine(text, 'inputs', { ...inputs, program_set: { ...inputs.program_set, text: `${inputs.program_set.text}\n# edited\n` } });
    const res = await verify(forged);
    expect(res.code).toBe(2);
    expect(res.stderr).toContain('does not match its SHA-256');
  });

  it('refuses a truncated file, a foreign file, a misshapen one and a newer format, with exit 2', async () => {
    const text = await recorded();
    const cases: [string, string][] = [
      [text.slice(0, Math.floor(text.length / 2)), 'truncated'],
      ['{"hello": "world"}', 'not a bellstep replay file'],
      ['[1, 2, 3]', 'not a replay file'],
      [withLine(text, 'format', 'bellstep/replay@3'), 'written by a newer bellstep (format bellstep/replay@3)'],
      [withLine(text, 'seed', '7'), 'seed must be a whole number'],
      [withLine(text, 'tool', null), 'tool must be an object'],
      [withLine(text, 'limits', { until_ns: 'soon', events: null }), 'limits.until_ns must be a whole number'],
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
          io.writeFile(path, s.exportReplay({ reason: 'crash', detail: `automatic replay: ${why}` }));
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
    expect(replay.stop.reason).toBe('crash');
    const v = verifyReplay(replay);
    expect(v.ok).toBe(true);
    expect(v.partial).toBe(true);
    // the CLI says it is partial
    const out = await runCli(['replay', 'a.json', '--verify'], { 'a.json': io.files.get(replayPath)! });
    expect(out.code).toBe(0);
    expect(out.stdout).toContain('verified up to the crash: all 50 events match; this replay is partial');
    expect(err).toMatch(/crash report: \/crash\/crash-/);
  });
});
