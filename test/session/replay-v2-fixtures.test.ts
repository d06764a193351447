/**
 * `@2` replays saved when the format was introduced still verify, each to its recorded stop,
 * and edits to them that a forger would re-sign are refused.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseReplay } from '../../src/session/replay.js';
import { resignV2 } from '../../src/session/replay-v2.js';
import { verifyReplay } from '../../src/session/verify.js';

const dir = join(dirname(fileURLToPath(import.meta.url)), '../fixtures/replay-v2');
const read = (name: string) => readFileSync(join(dir, name), 'utf8');

/** A top-level line of the file replaced, and the file re-signed. */
function withLine(text: string, key: string, value: unknown): string {
  return resignV2(text.replace(new RegExp(`\\n {2}"${key}": .*?(,?)(?=\\n)`), (_m, comma: string) => `\n  "${key}": ${JSON.stringify(value)}${comma}`));
}

describe('replays saved as bellstep/replay@2', () => {
  for (const [name, reason] of [
    ['mixed.replay.json', 'events'],
    ['stalled.replay.json', 'stall'],
    ['swap-break.replay.json', 'breakpoint'],
    ['swap-until.replay.json', 'until'],
  ] as const) {
    it(`${name} verifies to its stop (${reason})`, () => {
      const r = parseReplay(read(name), name);
      expect(r.stop.reason).toBe(reason);
      const v = verifyReplay(r);
      expect(v.divergence).toBeNull();
      expect(v.checked).toBe(r.events.length);
      expect(v.partial).toBe(false);
    });
  }

  it('refuses a breakpoint taken out: the run would not have stopped there', () => {
    const v = verifyReplay(parseReplay(withLine(read('swap-break.replay.json'), 'breakpoints', [])));
    expect(v.ok).toBe(false);
    expect(v.divergence?.message).toMatch(/no breakpoint hits there/);
  });

  it('refuses a later --until: the run would have gone on', () => {
    const text = read('swap-until.replay.json');
    const limits = JSON.parse(text).limits;
    const v = verifyReplay(parseReplay(withLine(text, 'limits', { ...limits, until_ns: limits.until_ns * 2 })));
    expect(v.ok).toBe(false);
    expect(v.divergence?.field).toBe('stop');
  });

  it('refuses a stall said to be an event limit', () => {
    const v = verifyReplay(parseReplay(withLine(read('stalled.replay.json'), 'stop', { reason: 'events', detail: 'reached the event limit' })));
    expect(v.ok).toBe(false);
    expect(v.divergence?.message).toMatch(/stops at its event limit of 1000000, but holds 7 events/);
  });
});
