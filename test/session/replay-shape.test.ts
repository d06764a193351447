/**
 * A replay file whose checksum matches but whose fields have the wrong type is refused as
 * an input error naming the field (exit 2), before anything walks or runs it.
 */
import { describe, expect, it } from 'vitest';
import { canonicalJson, parseReplay, replayChecksum, sha256, validateReplayShape } from '../../src/session/replay.js';
import { InputError } from '../../src/model/errors.js';
import { readFileSync } from 'node:fs';
import { runCli } from '../helpers/run-cli.js';

/** A `bellstep/replay@1` file as an earlier bellstep wrote it (the format's shape is checked field by field). */
async function recorded(): Promise<Record<string, unknown>> {
  return JSON.parse(readFileSync('test/fixtures/pre-lean/three-site-swap.replay.json', 'utf8')) as Record<string, unknown>;
}

/** The file with one change, re-signed so that its checksum matches. */
function resigned(base: Record<string, unknown>, change: (r: Record<string, unknown>) => void): string {
  const r = structuredClone(base);
  change(r);
  delete r.checksum;
  r.checksum = replayChecksum(r as never);
  return JSON.stringify(r);
}

const DEEP = '"deep lists"';

/** Lists nested `depth` deep, as text: too deep for a recursive walk, so it goes in by hand. */
function nested(depth: number): string {
  return `${'['.repeat(depth)}${']'.repeat(depth)}`;
}

/** Like `resigned`, with a placeholder replaced by deeply nested lists after signing the same text. */
function resignedDeep(base: Record<string, unknown>, change: (r: Record<string, unknown>) => void): string {
  const r = structuredClone(base);
  change(r);
  delete r.checksum;
  const canonical = canonicalJson(r).replace(DEEP, nested(5000));
  return JSON.stringify({ ...r, checksum: `sha256:${sha256(canonical)}` }).replace(DEEP, nested(5000));
}

describe('replay files of the wrong shape', () => {
  // the changes reach into the parsed JSON freely, as a hand edit would
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const cases: [string, (r: Record<string, any>) => void, string][] = [
    ['a null event', (r) => (r.events[3] = null), 'events[3]'],
    ['lists nested 5,000 deep', (r) => (r.breakpoints = 'deep lists'), 'breakpoints'],
    ['tool: null', (r) => (r.tool = null), 'tool'],
    ['a string where a list belongs', (r) => (r.events = 'all of them'), 'events'],
    ['a string seed', (r) => (r.seed = '7'), 'seed'],
    ['a digest that is a number', (r) => (r.events[0].digest = 12), 'events[0].digest'],
    ['an unknown stop reason', (r) => (r.stop.reason = 'tired'), 'stop.reason'],
    ['a noise input with no text', (r) => (r.inputs.noise = { file: 'n.yaml', sha256: 'x' }), 'inputs.noise.text'],
    ['an extra field nested deep', (r) => (r.extra = 'deep lists'), 'extra'],
  ];

  it.each(cases)('refuses %s, naming the field, with exit 2 and no stack trace', async (_what, change, field) => {
    const text = _what.includes('deep') ? resignedDeep(await recorded(), change) : resigned(await recorded(), change);
    for (const argv of [['replay', 'bad.json', '--verify'], ['replay', 'bad.json'], ['debug', '--replay', 'bad.json']]) {
      const r = await runCli(argv, { 'bad.json': text });
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.stderr).toContain(`bad.json: ${field}`);
      expect(r.stderr).not.toMatch(/\n\s+at /);
      expect(r.stderr).not.toContain('internal error');
    }
  });

  it('accepts the file as bellstep wrote it, and parseReplay goes through the same check', async () => {
    const good = await recorded();
    expect(() => validateReplayShape(good, 'r.json')).not.toThrow();
    expect(parseReplay(JSON.stringify(good), 'r.json').events.length).toBe((good.events as unknown[]).length);
    const e = (() => {
      try {
        parseReplay(resigned(good, (r) => (r.tool = null)), 'r.json');
      } catch (err) {
        return err;
      }
    })();
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).field).toBe('tool');
  });
});
